import { z } from 'zod/mini'
import { inputProblems } from '../rules/input'

// zod-free, so the quick event check (shared/runs/event-quick.ts) can use them on the Run screen.
export * from '../rules/input'

/**
 * The one helper every input schema goes through (readValid, queryValid, parseRunEvent):
 * refuses ill-formed text and huge numbers anywhere in the value, naming the field, before
 * `schema` sees it. `skip` leaves top-level keys to be checked item by item later (a sync
 * batch's events, each refused on its own).
 */
export function checkedInput<S extends z.core.$ZodType>(schema: S, skip: readonly string[] = []) {
  // zod/mini, so the Run screen's events (shared/runs/events.ts) load without the full zod (issue 14)
  return z.pipe(z.unknown().check(z.superRefine((value, ctx) => {
    for (const p of inputProblems(value, skip)) ctx.addIssue({ code: 'custom', path: p.path, message: p.message })
  })), schema)
}
