import { describe, expect, it } from 'vitest'
import { nextAction } from '../../../shared/runs/next-action'
import { fold, OPERATOR, script, STEPS } from './fixtures'

// A run started by mistake is withdrawn before anything is done in it: no reason needed, shown
// as withdrawn. Once any work counts, only stopping with a written reason remains.
// (Jogwise's own rule, issue 10; no outside source applies.)
describe('run.withdrawn', () => {
  it('withdraws a run with nothing done, notes included', () => {
    const events = script('solo', [['note.added', { text: 'Wrong machine picked.' }, OPERATOR], ['run.withdrawn', {}, OPERATOR]], OPERATOR)
    const state = fold(events)
    expect(state.status).toBe('withdrawn')
    expect(state.withdrawn?.eventId).toBe(events.at(-1)!.id)
    expect(state.flagged).toEqual([])
    expect(nextAction(state, STEPS).idle).toBe('withdrawn')
  })

  it('refuses to withdraw once a step counts, and the run goes on', () => {
    const events = script('solo', [['step.done', { stepKey: 'intro' }, OPERATOR], ['run.withdrawn', {}, OPERATOR]], OPERATOR)
    const state = fold(events)
    expect(state.status).toBe('active')
    expect(state.workDone).toBe(true)
    expect(state.flagged.map(f => f.code)).toEqual(['withdraw-after-work'])
  })

  it('allows it again after the only action was undone', () => {
    const base = script('solo', [['step.done', { stepKey: 'intro' }, OPERATOR]], OPERATOR)
    const done = base.at(-1)!
    const events = [...base, ...script('solo', [['event.undone', { targetId: done.id }, OPERATOR], ['run.withdrawn', {}, OPERATOR]], OPERATOR).slice(1)]
    expect(fold(events).status).toBe('withdrawn')
  })

  it('nothing counts after a withdrawal', () => {
    const events = script('solo', [['run.withdrawn', {}, OPERATOR], ['step.done', { stepKey: 'intro' }, OPERATOR]], OPERATOR)
    const state = fold(events)
    expect(state.status).toBe('withdrawn')
    expect(state.flagged.map(f => f.code)).toEqual(['after-finish'])
  })
})
