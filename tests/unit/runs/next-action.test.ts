import { describe, expect, it } from 'vitest'
import { lastUndoable, nextAction, type RunAction } from '../../../shared/runs/next-action'
import { ev, fold, GUIDED_HAPPY, OPERATOR, script, SOLO_HAPPY, STEPS, TRAINEE, TRAINER, type Intent } from './fixtures'

// The Run screen shows one primary action. These tables walk a whole run and check the action
// offered before each scripted event (issue 3: "one obvious primary action", "undo of the last
// action").

describe('nextAction', () => {
  it('walks a guided run step by step', () => {
    const expected: [RunAction, string | null][] = [
      ['mark-done', 'intro'],
      ['acknowledge-hold', 'gear'],
      ['acknowledge-hold', 'isolate'],
      ['needs-signoff', 'isolate'],
      ['mark-done', 'clear'],
      ['record-value', 'thickness'],
      ['mark-done', 'thickness'],
      ['attach-photo', 'photo'],
      ['mark-done', 'photo'],
      ['attach-plan', 'plan'],
      ['mark-done', 'plan'],
      ['needs-signoff', 'final'],
      ['finish', null],
    ]
    GUIDED_HAPPY.forEach((_, n) => {
      const a = nextAction(fold(script('guided', GUIDED_HAPPY.slice(0, n))), STEPS)
      expect([a.action, a.stepKey], `before event ${n + 1}`).toEqual(expected[n])
    })
    const end = nextAction(fold(script('guided', GUIDED_HAPPY)), STEPS)
    expect([end.action, end.idle]).toEqual(['none', 'finished'])
  })

  it('in solo mode the sign-off step is a plain done, and a marked hold needs no signature', () => {
    const actions = SOLO_HAPPY.map((_, n) => nextAction(fold(script('solo', SOLO_HAPPY.slice(0, n), OPERATOR)), STEPS).action)
    expect(actions).not.toContain('needs-signoff')
    expect(actions.at(-2)).toBe('mark-done')
    expect(actions.at(-1)).toBe('finish')
  })

  it('asks for a reason after an out-of-range reading', () => {
    const s = fold(script('solo', [['step.done', { stepKey: 'intro' }], ['hold.acknowledged', { stepKey: 'gear' }], ['hold.acknowledged', { stepKey: 'isolate' }], ['step.done', { stepKey: 'clear' }], ['value.recorded', { stepKey: 'thickness', value: 9, unit: 'mm' }]], OPERATOR))
    expect(nextAction(s, STEPS)).toMatchObject({ action: 'explain-value', stepKey: 'thickness', step: STEPS[4] })
  })

  it.each<[string, Intent[], boolean]>([
    ['an open hold', [], true],
    ['an acknowledged hold waiting for a signature', [['hold.acknowledged', { stepKey: 'gear' }], ['hold.acknowledged', { stepKey: 'isolate' }]], true],
    ['an instruction', [['hold.acknowledged', { stepKey: 'gear' }], ['hold.acknowledged', { stepKey: 'isolate' }], ['signoff.given', { stepKey: 'isolate', signerId: TRAINER, signerRole: 'trainer' }, TRAINER]], false],
  ])('offers an override only on %s', (_name, tail, can) => {
    const s = fold(script('guided', [['step.done', { stepKey: 'intro' }], ...tail]))
    expect(nextAction(s, STEPS).canOverride).toBe(can)
  })

  it.each([
    ['not-started', () => fold([])],
    ['abandoned', () => fold(script('solo', [['run.abandoned', { reason: 'Fire alarm, building evacuated' }]]))],
  ] as const)('has nothing to offer when the run is %s', (idle, make) => {
    expect(nextAction(make(), STEPS)).toMatchObject({ action: 'none', idle, lastUndoable: null })
  })
})

describe('lastUndoable', () => {
  it('is the person\'s own last action, and nothing once someone else acted after it', () => {
    const events = script('guided', [['step.done', { stepKey: 'intro' }], ['hold.acknowledged', { stepKey: 'gear' }]])
    expect(lastUndoable(fold(events), TRAINEE)?.id).toBe(events[2]!.id)
    expect(lastUndoable(fold(events), TRAINER)).toBeNull()
    const signed = [...script('guided', [['step.done', { stepKey: 'intro' }], ['hold.acknowledged', { stepKey: 'gear' }], ['hold.acknowledged', { stepKey: 'isolate' }]]),
      ev('signoff.given', { stepKey: 'isolate', signerId: TRAINER, signerRole: 'trainer' }, { actor: TRAINER, sec: 9 })]
    // The trainer's signature is on top and can never be undone, so the trainee has nothing to undo.
    expect(lastUndoable(fold(signed), TRAINEE)).toBeNull()
    expect(lastUndoable(fold(signed), TRAINER)).toBeNull()
  })

  it('offers the person\'s own note when it is their latest entry', () => {
    const events = script('solo', [['step.done', { stepKey: 'intro' }], ['note.added', { text: 'Board edge chipped' }]], OPERATOR)
    expect(lastUndoable(fold(events), OPERATOR)?.type).toBe('note.added')
  })

  it('after an undo, offers the action before it', () => {
    const events = script('solo', [['step.done', { stepKey: 'intro' }], ['hold.acknowledged', { stepKey: 'gear' }]], OPERATOR)
    events.push(ev('event.undone', { targetId: events[2]!.id }, { actor: OPERATOR, sec: 5 }))
    const s = fold(events)
    expect(lastUndoable(s, OPERATOR)?.id).toBe(events[1]!.id)
    expect(nextAction(s, STEPS, { actorId: OPERATOR }).lastUndoable?.id).toBe(events[1]!.id)
  })
})
