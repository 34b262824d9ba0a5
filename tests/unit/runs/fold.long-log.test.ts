import { describe, expect, it } from 'vitest'
import { foldRun } from '../../../shared/runs/fold'
import { longLog, steps } from '../../../bench/fold-log'
import { ROLES, TRAINER } from './fixtures'

// A long day's log (10,000 events, 100 steps, scrambled arrival) folds to a finished run with
// every event applied or flagged, none dropped. Its speed is measured by `npm run bench:fold`
// (a benchmark, not a timed test: a shared machine would make a time limit flaky).
describe('a 10,000-event run', () => {
  it('folds to the end, and every repeat is flagged, not dropped', () => {
    const events = longLog(10_000)
    expect(events).toHaveLength(10_000)
    const roles = { ...ROLES, [TRAINER]: 'trainer' as const }
    const state = foldRun(steps, events, { roles })
    expect(state.completedCount).toBe(100)
    expect(state.status).toBe('finished')
    expect(state.applied.length + state.flagged.length).toBe(10_000)
  })
})
