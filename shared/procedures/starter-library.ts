import type { StarterProcedure } from './starter/types'
import { spoilboardResurfacing } from './starter/spoilboard-resurfacing'
import { stockFlattening } from './starter/stock-flattening'
import { spindleTramCheck } from './starter/spindle-tram-check'
import { toolChange } from './starter/tool-change'
import { dailyStartUp } from './starter/daily-start-up'
import { endOfDayShutdown } from './starter/end-of-day-shutdown'
import { emergencyStopTest } from './starter/emergency-stop-test'

export type { StarterProcedure }
export { PLANNER_SAFETY_LINE } from './starter/common-steps'

// The procedures every new shop starts with, written for Jogwise in our own words. Each hazard
// carries the usual caution with the signal word ANSI Z535.4-2007 §4.14 gives it:
// WARNING where a person could be killed or seriously hurt, CAUTION for minor or moderate
// injury, NOTICE where only the board, tool or machine is at risk. Shops edit these in the
// Library; numbers given here are common practice and are marked as such in the text.
// One file per procedure under starter/ (steps several share are in starter/common-steps.ts);
// this list gives their order in a new shop's Library.

export const STARTER_LIBRARY: readonly StarterProcedure[] = [
  spoilboardResurfacing,
  stockFlattening,
  spindleTramCheck,
  toolChange,
  dailyStartUp,
  endOfDayShutdown,
  emergencyStopTest,
]

/** A starter procedure by its slug, for seeding and tests. */
export function starterProcedure(slug: string): StarterProcedure | undefined {
  return STARTER_LIBRARY.find(p => p.slug === slug)
}
