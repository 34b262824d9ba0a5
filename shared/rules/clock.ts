// The clock-believability window: what a tablet may claim as the time of an event, a reading or
// a signature. More than a day ahead of the server, or before Jogwise existed, is a wrong
// tablet clock, not a real time (and MariaDB TIMESTAMP ends in 2038 in any case).

/** How far ahead of the server's clock a tablet's time may be. */
export const MAX_CLOCK_AHEAD_MS = 24 * 60 * 60 * 1000
/** Nothing in Jogwise happened before this. */
export const EARLIEST_BELIEVABLE_MS = Date.parse('2020-01-01T00:00:00Z')

/** Is `t` (ms since the epoch) a time a tablet could really have had, seen at `now`? */
export function isBelievableTime(t: number, now: number): boolean {
  return Number.isFinite(t) && t >= EARLIEST_BELIEVABLE_MS && t <= now + MAX_CLOCK_AHEAD_MS
}

/** The one message for a time outside the window; `what` names it ("Event time", "Time taken"). */
export const unbelievableTime = (what: string, text: string) => `${what} ${text} is not believable; check the tablet's date and time.`
