// Why a maintenance interval is due, in words, from the facts the due list carries. Written once
// for the Due screen (vue-i18n's t) and the owner's digest (the server's messageIn), with the
// `dueList.reason` messages of the reader's language; in English it reads exactly as the
// server's own sentence (server/utils/due-list.ts dueStatusOf), which mail and CSV keep.

export interface DueReasonFacts {
  daysSince: number | null
  lastDoneAt: string | null
  everyDays: number | null
  everySpindleHours: number | null
  spindleHoursSince: number | null
}

/** `say(key, values, count)` looks up `dueList.reason.<key>`; count picks the plural form. */
export type SayReason = (key: string, values: Record<string, string | number>, count?: number) => string
/** A number in the reader's way (decimal comma…), with at most `fraction` decimals. */
export type SayNumber = (n: number, fraction?: number) => string

export function dueReasonText(f: DueReasonFacts, say: SayReason, num: SayNumber): string {
  const days = f.everyDays ? say('everyDays', { n: f.everyDays }, f.everyDays) : ''
  const hours = f.everySpindleHours ? say('everyHours', { n: num(f.everySpindleHours) }) : ''
  if (f.daysSince === null) return say('never', { every: days && hours ? say('either', { a: days, b: hours }) : days || hours })
  const parts: string[] = []
  if (f.everyDays) parts.push(say(f.lastDoneAt ? 'lastDone' : 'added', { n: f.daysSince, every: days }, f.daysSince))
  if (f.everySpindleHours) {
    const used = say('hours', { used: num(f.spindleHoursSince ?? 0, 1), every: num(f.everySpindleHours) })
    parts.push(f.lastDoneAt || f.everyDays ? used : say('notYet', { rest: used }))
  }
  const text = parts.join('; ')
  return `${text.charAt(0).toUpperCase()}${text.slice(1)}.`
}
