import { describe, expect, it } from 'vitest'
import { foldRun } from '../../../shared/runs/fold'
import type { RunEvent } from '../../../shared/runs/events'
import {
  ev, flagsOf, fold, GUIDED_HAPPY, OPERATOR, OTHER_RUN_ID, OUTSIDER, OWNER, RUN_ID, script, SOLO_HAPPY, STEPS,
  TRAINEE, TRAINER, type Intent,
} from './fixtures'

// The run rules come from the product brief and issue 3: holds block everything after them,
// guided runs need a trainer's signature on marked holds and on the final step, overrides and
// sign-offs stay on the record, undo takes back only the last action. These are Jogwise's own
// rules (no outside standard defines them), so each test states the rule it checks.

const done = (stepKey: string, actor?: number): Intent => ['step.done', { stepKey }, actor]
const ack = (stepKey: string, actor?: number): Intent => ['hold.acknowledged', { stepKey }, actor]
const sign = (stepKey: string | undefined, signer = TRAINER, role: 'trainer' | 'owner' = 'trainer'): Intent =>
  ['signoff.given', stepKey === undefined ? { signerId: signer, signerRole: role } : { stepKey, signerId: signer, signerRole: role }, signer]
const value = (v: number, reason?: string, unit = 'mm'): Intent =>
  ['value.recorded', reason === undefined ? { stepKey: 'thickness', value: v, unit } : { stepKey: 'thickness', value: v, unit, reason }]
const override = (stepKey: string, actor = TRAINER, reason = 'Isolator checked by me, lock was already on'): Intent =>
  ['hold.overridden', { stepKey, reason }, actor]
const undo = (targetIndex: number, actor?: number): Intent => ['event.undone', { targetIndex }, actor]

// Scripts refer to undo targets by index into the script (1-based like the event list: 0 is run.started).
function build(mode: 'guided' | 'solo', intents: Intent[], starter = TRAINEE): RunEvent[] {
  const events = script(mode, intents.map(([t, p, a]) => (t === 'event.undone' ? ['note.added', { text: 'placeholder' }, a] : [t, p, a]) as Intent), starter)
  intents.forEach(([t, p, a], i) => {
    if (t !== 'event.undone') return
    const target = events[(p as { targetIndex: number }).targetIndex]!
    events[i + 1] = ev('event.undone', { targetId: target.id }, { actor: a ?? starter, sec: i + 1 })
  })
  return events
}

describe('happy paths', () => {
  it('a guided trainee run with a trainer signing finishes with every step complete', () => {
    const events = script('guided', GUIDED_HAPPY)
    const s = fold(events)
    expect(s.flagged).toEqual([])
    expect(s.status).toBe('finished')
    expect(s.completedCount).toBe(STEPS.length)
    expect(s.steps.map(x => x.status)).toEqual(['done', 'acknowledged', 'signed', 'done', 'done', 'done', 'done', 'signed'])
    expect(s.signoffs.map(x => [x.stepKey, x.signerId])).toEqual([['isolate', TRAINER], ['final', TRAINER]])
    expect(s.applied).toHaveLength(events.length)
  })

  it('a solo operator run finishes without any sign-off', () => {
    const events = script('solo', SOLO_HAPPY, OPERATOR)
    const s = fold(events)
    expect(s.flagged).toEqual([])
    expect(s.status).toBe('finished')
    expect(s.steps.map(x => x.status)).toEqual(['done', 'acknowledged', 'acknowledged', 'done', 'done', 'done', 'done', 'done'])
  })

  it('an empty log is a run that has not started', () => {
    const s = fold([])
    expect(s.status).toBe('not-started')
    expect(s.currentStepIndex).toBe(0)
    expect(s.canFinish).toBe(false)
  })
})

describe('holds block every later step', () => {
  it.each<[string, Intent[], [number, string][]]>([
    ['done past an unacknowledged hold', [done('intro'), done('clear')], [[2, 'passed-unacknowledged-hold']]],
    ['a value past an unacknowledged hold', [value(15)], [[1, 'passed-unacknowledged-hold']]],
    ['a photo past an unacknowledged hold', [['photo.attached', { stepKey: 'photo', note: 'early photo here' }]], [[1, 'passed-unacknowledged-hold']]],
    ['a plan past an unacknowledged hold', [['plan.attached', { stepKey: 'plan', summary: 'plan' }]], [[1, 'passed-unacknowledged-hold']]],
    ['acknowledging a later hold first', [ack('isolate')], [[1, 'passed-unacknowledged-hold']]],
    ['done past the second hold after clearing only the first', [ack('gear'), done('clear')], [[2, 'passed-unacknowledged-hold']]],
    ['guided: done past an acknowledged but unsigned hold', [ack('gear'), ack('isolate'), done('clear')], [[3, 'passed-unsigned-hold']]],
    ['guided: trainer signs the final step past an unsigned hold', [ack('gear'), ack('isolate'), sign('final')], [[3, 'passed-unsigned-hold']]],
  ])('%s is flagged and not applied', (_name, intents, flags) => {
    const events = build('guided', intents)
    const s = fold(events)
    expect(flagsOf(s, events)).toEqual(flags)
    for (const [i] of flags) expect(s.applied).not.toContain(events[i])
  })

  it('steps before the first hold may be done in any order', () => {
    const s = fold(build('solo', [done('intro')], OPERATOR))
    expect(s.flagged).toEqual([])
    expect(s.steps[0]!.status).toBe('done')
  })

  it('in solo mode an acknowledgement alone clears a hold marked for sign-off', () => {
    const events = build('solo', [ack('gear'), ack('isolate'), done('clear')], OPERATOR)
    const s = fold(events)
    expect(s.flagged).toEqual([])
    expect(s.holdsCleared).toEqual({ gear: true, isolate: true })
  })

  it('an event that arrives first but was made before the acknowledgement stays flagged', () => {
    const start = ev('run.started', { procedureVersionId: 7, machineId: 2, mode: 'solo' }, { sec: 0, actor: OPERATOR })
    const early = ev('step.done', { stepKey: 'intro' }, { sec: 1, actor: OPERATOR })
    const g = ev('hold.acknowledged', { stepKey: 'gear' }, { sec: 2, actor: OPERATOR })
    const i = ev('hold.acknowledged', { stepKey: 'isolate' }, { sec: 4, actor: OPERATOR })
    const late = ev('step.done', { stepKey: 'clear' }, { sec: 3, actor: OPERATOR }) // clock says before `i`
    const s = fold([late, i, g, early, start])
    expect(s.flagged.map(f => [f.event.id, f.code])).toEqual([[late.id, 'passed-unacknowledged-hold']])
    expect(s.steps[3]!.status).toBe('pending')
  })

  it('at equal times the id decides the order', () => {
    const start = ev('run.started', { procedureVersionId: 7, machineId: 2, mode: 'solo' }, { sec: 0, actor: OPERATOR })
    const a = ev('hold.acknowledged', { stepKey: 'gear' }, { sec: 1, actor: OPERATOR })
    const b = ev('hold.acknowledged', { stepKey: 'isolate' }, { sec: 1, actor: OPERATOR })
    const [first, second] = a.id < b.id ? [a, b] : [b, a]
    // If the gear acknowledgement sorts first, isolate follows legally; otherwise isolate is flagged.
    const s = fold([start, second, first])
    expect(s.flagged.map(f => f.event.id)).toEqual(first === a ? [] : [b.id])
  })

  it('reports the hold that blocks each later step', () => {
    const s = fold(build('guided', [ack('gear'), ack('isolate')]))
    expect(s.steps.map(x => x.blockedBy)).toEqual([null, null, null, 'isolate', 'isolate', 'isolate', 'isolate', 'isolate'])
  })

  it('notes are allowed anywhere, even past a hold', () => {
    const s = fold(build('guided', [['note.added', { stepKey: 'plan', text: 'Cutter looks chipped' }]]))
    expect(s.flagged).toEqual([])
    expect(s.notes.map(n => [n.stepKey, n.text])).toEqual([['plan', 'Cutter looks chipped']])
  })
})

describe('sign-offs', () => {
  it.each<[string, 'guided' | 'solo', Intent[], [number, string][], Record<number, string> | undefined]>([
    ['signing a hold before it is acknowledged', 'guided', [ack('gear'), sign('isolate')], [[2, 'not-acknowledged']], undefined],
    ['an operator cannot sign (roles list)', 'guided', [ack('gear'), ack('isolate'), ['signoff.given', { stepKey: 'isolate', signerId: OPERATOR, signerRole: 'trainer' }, OPERATOR]], [[3, 'not-allowed-for-role']], undefined],
    ['someone outside the shop cannot sign', 'guided', [ack('gear'), ack('isolate'), ['signoff.given', { stepKey: 'isolate', signerId: OUTSIDER, signerRole: 'owner' }, OUTSIDER]], [[3, 'not-allowed-for-role']], undefined],
    ['the trainee cannot sign their own guided run', 'guided', [ack('gear'), ack('isolate'), ['signoff.given', { stepKey: 'isolate', signerId: TRAINEE, signerRole: 'trainer' }]], [[3, 'self-signoff']], { [TRAINEE]: 'trainer' }],
    ['signing an instruction step', 'guided', [sign('intro')], [[1, 'wrong-step-kind']], undefined],
    ['signing a hold twice', 'guided', [ack('gear'), ack('isolate'), sign('isolate'), sign('isolate', OWNER, 'owner')], [[4, 'already-done']], undefined],
    ['signing the final step before the others are complete', 'guided', [done('intro'), ack('gear'), ack('isolate'), sign('isolate'), sign('final')], [[5, 'steps-incomplete']], undefined],
    ['tapping done on the final step of a guided run', 'guided', GUIDED_HAPPY.slice(0, 11).concat([done('final')]), [[12, 'signoff-required']], undefined],
    ['signing the whole run before every step is complete', 'guided', [sign(undefined)], [[1, 'steps-incomplete']], undefined],
  ])('%s is flagged', (_name, mode, intents, flags, roles) => {
    const events = build(mode, intents)
    const s = fold(events, roles ? { ...rolesBase(), ...roles } : undefined)
    expect(flagsOf(s, events)).toEqual(flags)
  })

  it('without a roles list the signer role written in the event is used', () => {
    const events = build('guided', [ack('gear'), ack('isolate'), sign('isolate', OWNER, 'owner')])
    const s = foldRun(STEPS, events)
    expect(s.flagged).toEqual([])
    expect(s.steps[2]!.status).toBe('signed')
  })

  it('the roles list wins over the role a signer claims', () => {
    const events = build('guided', [ack('gear'), ack('isolate'), ['signoff.given', { stepKey: 'isolate', signerId: OPERATOR, signerRole: 'owner' }, OPERATOR]])
    expect(fold(events).flagged.map(f => f.code)).toEqual(['not-allowed-for-role'])
  })

  it('the owner may sign in place of a trainer', () => {
    const events = build('guided', GUIDED_HAPPY.map(i => (i[0] === 'signoff.given' ? sign((i[1] as { stepKey: string }).stepKey, OWNER, 'owner') : i)))
    expect(fold(events).status).toBe('finished')
  })

  it('a guided run cannot finish until the trainer signs the final step', () => {
    const events = build('guided', [...GUIDED_HAPPY.slice(0, 11), ['run.finished', {}]])
    const s = fold(events)
    expect(s.flagged.map(f => f.code)).toEqual(['cannot-finish'])
    expect(s.canFinish).toBe(false)
    expect(s.finishBlockers).toEqual(['final'])
  })

  it('a guided run of a procedure without a sign-off step needs a whole-run sign-off', () => {
    const steps = STEPS.slice(0, 4)
    const base: Intent[] = [done('intro'), ack('gear'), ack('isolate'), sign('isolate'), done('clear')]
    const without = build('guided', [...base, ['run.finished', {}]])
    expect(foldRun(steps, without).flagged.map(f => f.code)).toEqual(['cannot-finish'])
    expect(foldRun(steps, without).finishBlockers).toEqual(['run-signoff'])
    const withIt = build('guided', [...base, sign(undefined), ['run.finished', {}]])
    expect(foldRun(steps, withIt).status).toBe('finished')
  })
})

describe('overrides', () => {
  it('a trainer override clears the hold and is recorded with its reason', () => {
    const events = build('guided', [ack('gear'), override('isolate'), done('clear')])
    const s = fold(events)
    expect(s.flagged).toEqual([])
    expect(s.steps[2]!.status).toBe('overridden')
    expect(s.holdsCleared.isolate).toBe(true)
    expect(s.overrides).toEqual([expect.objectContaining({ stepKey: 'isolate', actorId: TRAINER, reason: 'Isolator checked by me, lock was already on' })])
  })

  it.each<[string, Intent[], [number, string][]]>([
    ['a trainee override', [override('gear', TRAINEE)], [[1, 'not-allowed-for-role']]],
    ['an operator override', [override('gear', OPERATOR)], [[1, 'not-allowed-for-role']]],
    ['an override of a step that is not a hold', [override('intro')], [[1, 'wrong-step-kind']]],
    ['an override past an uncleared hold', [override('isolate')], [[1, 'passed-unacknowledged-hold']]],
    ['an override of a hold already cleared', [ack('gear'), override('gear')], [[2, 'already-cleared']]],
    ['acknowledging a hold already overridden', [override('gear'), ack('gear')], [[2, 'already-cleared']]],
  ])('%s is flagged', (_name, intents, flags) => {
    const events = build('guided', intents)
    const s = fold(events)
    expect(flagsOf(s, events)).toEqual(flags)
  })

  it('an override with a filler reason is flagged (the schema refuses it; the fold checks too)', () => {
    const events = script('guided', [])
    const real = ev('hold.overridden', { stepKey: 'gear', reason: 'Placeholder reason text' }, { sec: 1, actor: TRAINER })
    events.push({ ...real, reason: 'xxxxxxxxxxxx' } as RunEvent)
    const s = fold(events)
    expect(s.flagged.map(f => f.code)).toEqual(['missing-reason'])
    expect(s.overrides).toEqual([])
  })
})

describe('checks', () => {
  // Range bounds are inclusive: the step allows 12 to 19.5 mm.
  it.each<[number, 'below' | 'above' | null]>([
    [12, null], [19.5, null], [15.25, null], [11.99, 'below'], [19.51, 'above'], [0, 'below'], [-3, 'below'], [250, 'above'],
  ])('a reading of %s mm is %s the range', (v, side) => {
    const s = fold(build('solo', [ack('gear'), ack('isolate'), done('clear'), value(v)], OPERATOR))
    expect(s.steps[4]!.value?.outOfRange).toBe(side)
    expect(s.values.map(x => x.value)).toEqual([v])
  })

  it.each<[string, Intent[], [number, string][], string]>([
    ['done with no reading', [done('thickness')], [[4, 'missing-value']], 'pending'],
    ['done after an out-of-range reading without a reason', [value(25), done('thickness')], [[5, 'missing-reason']], 'pending'],
    ['done after an out-of-range reading with a filler reason', [value(25, 'ok'), done('thickness')], [[5, 'missing-reason']], 'pending'],
    ['done after an out-of-range reading with a real reason', [value(25, 'New board fitted today, not faced yet'), done('thickness')], [], 'done'],
    ['done after a reading re-taken in range', [value(25), value(18), done('thickness')], [], 'done'],
    ['a reading in the wrong unit', [value(0.7, undefined, 'in')], [[4, 'unit-mismatch']], 'pending'],
    ['a reading after the step is done', [value(18), done('thickness'), value(17)], [[6, 'already-done']], 'done'],
  ])('%s', (_name, tail, flags, status) => {
    const events = build('solo', [ack('gear'), ack('isolate'), done('clear'), ...tail], OPERATOR)
    const s = fold(events)
    expect(flagsOf(s, events)).toEqual(flags)
    expect(s.steps[4]!.status).toBe(status)
  })

  it('keeps out-of-range readings with their reasons in the run record', () => {
    const s = fold(build('solo', [ack('gear'), ack('isolate'), done('clear'), value(11, 'Board is due for replacement this week')], OPERATOR))
    expect(s.values).toEqual([expect.objectContaining({ value: 11, outOfRange: 'below', reason: 'Board is due for replacement this week', reasonOk: true })])
  })
})

describe('evidence steps', () => {
  const cleared: Intent[] = [ack('gear'), ack('isolate'), done('clear'), value(18), done('thickness')]
  it.each<[string, Intent[], [number, string][]]>([
    ['a photo step done without a photo', [done('photo')], [[6, 'missing-evidence']]],
    ['a planner step done without a plan', [['photo.attached', { stepKey: 'photo', uploadId: 'up-1' }], done('photo'), done('plan')], [[8, 'missing-plan']]],
    ['a photo on a step that is not a photo step', [['photo.attached', { stepKey: 'clear', note: 'bed cleared' }]], [[6, 'wrong-step-kind']]],
    ['a plan on a step that is not a planner step', [['plan.attached', { stepKey: 'photo', summary: 'plan' }]], [[6, 'wrong-step-kind']]],
  ])('%s is flagged', (_name, tail, flags) => {
    const events = build('solo', [...cleared, ...tail], OPERATOR)
    expect(flagsOf(fold(events), events)).toEqual(flags)
  })
})

describe('structure of the log', () => {
  it.each<[string, () => RunEvent[], string[]]>([
    ['events before the start', () => [ev('step.done', { stepKey: 'intro' }, { sec: -1 }), ...script('solo', [])], ['before-start']],
    ['a log with no start event', () => [ev('step.done', { stepKey: 'intro' }, { sec: 1 })], ['before-start']],
    ['a second start', () => [...script('solo', []), ev('run.started', { procedureVersionId: 7, machineId: 2, mode: 'guided' }, { sec: 5 })], ['already-started']],
    ['an event of another run', () => [...script('solo', []), ev('step.done', { stepKey: 'intro' }, { sec: 2, runId: OTHER_RUN_ID })], ['wrong-run']],
    ['an unknown step key', () => script('solo', [done('no-such-step')]), ['unknown-step']],
    ['a note on an unknown step', () => script('solo', [['note.added', { stepKey: 'nope', text: 'hello there' }]]), ['unknown-step']],
    ['marking a hold done', () => script('solo', [done('gear')]), ['wrong-step-kind']],
    ['acknowledging an instruction', () => script('solo', [ack('intro')]), ['wrong-step-kind']],
    ['acknowledging twice', () => script('solo', [ack('gear'), ack('gear')]), ['already-done']],
    ['marking done twice', () => script('solo', [done('intro'), done('intro')]), ['already-done']],
    ['finishing early', () => script('solo', [['run.finished', {}]]), ['cannot-finish']],
    ['events after the finish', () => [...script('solo', SOLO_HAPPY, OPERATOR), ev('note.added', { text: 'late remark' }, { sec: 99 })], ['after-finish']],
    ['events after abandoning', () => script('solo', [['run.abandoned', { reason: 'Spindle bearing noise, stopped for repair' }], done('intro')]), ['after-finish']],
  ])('%s is flagged', (_name, make, codes) => {
    const s = fold(make())
    expect(s.flagged.map(f => f.code)).toEqual(codes)
  })

  it('a run abandoned with a reason records who and why', () => {
    const s = fold(script('solo', [done('intro'), ['run.abandoned', { reason: 'Dust collector failed, job moved to tomorrow' }]], OPERATOR))
    expect(s.status).toBe('abandoned')
    expect(s.abandoned).toEqual(expect.objectContaining({ actorId: OPERATOR, reason: 'Dust collector failed, job moved to tomorrow' }))
    expect(s.canFinish).toBe(false)
  })

  it('an abandon whose reason is filler is flagged (the fold checks even unvalidated events)', () => {
    const events = script('solo', [])
    events.push({ ...ev('run.abandoned', { reason: 'Placeholder reason text' }, { sec: 3 }), reason: 'n/a' } as RunEvent)
    const s = fold(events)
    expect(s.flagged.map(f => f.code)).toEqual(['missing-reason'])
    expect(s.status).toBe('active')
  })

  it('an event whose time cannot be read is flagged, not guessed', () => {
    const events = script('solo', [done('intro')])
    events.push({ ...ev('step.done', { stepKey: 'intro' }, { sec: 3 }), at: 'yesterday' } as RunEvent)
    expect(fold(events).flagged.map(f => f.code)).toEqual(['invalid-event'])
  })

  it('exact copies of an event count once and are not flagged', () => {
    const events = script('solo', SOLO_HAPPY, OPERATOR)
    const copies = [...events, ...events.map(e => ({ ...e })), events[3]!]
    expect(fold(copies)).toEqual(fold(events))
  })

  it('a different event reusing an id is flagged as a duplicate, and the choice does not depend on arrival', () => {
    const events = script('solo', [done('intro')], OPERATOR)
    const clash = { ...events[1]!, deviceId: 'tablet-b' } as RunEvent
    const a = fold([...events, clash])
    const b = fold([clash, ...events])
    expect(a).toEqual(b)
    expect(a.flagged.map(f => f.code)).toEqual(['duplicate'])
    expect(a.applied).toHaveLength(2)
  })

  it('never changes its inputs', () => {
    const events = script('guided', GUIDED_HAPPY)
    const snapshot = structuredClone(events)
    const steps = structuredClone(STEPS)
    foldRun(Object.freeze(STEPS.map(s => Object.freeze(s))), Object.freeze(events.map(e => Object.freeze(e))))
    expect(events).toEqual(snapshot)
    expect(STEPS).toEqual(steps)
  })
})

describe('undo', () => {
  it('undoes the actor\'s own last action', () => {
    const events = build('solo', [done('intro'), undo(1)], OPERATOR)
    const s = fold(events)
    expect(s.flagged).toEqual([])
    expect(s.steps[0]!.status).toBe('pending')
    expect(s.undoneIds).toEqual([events[1]!.id])
    expect(s.applied).toContain(events[1]) // the undone event stays in the record
  })

  it('walks back several actions like a stack', () => {
    const events = build('solo', [done('intro'), ack('gear'), undo(2), undo(1)], OPERATOR)
    const s = fold(events)
    expect(s.flagged).toEqual([])
    expect(s.steps.slice(0, 2).map(x => x.status)).toEqual(['pending', 'pending'])
  })

  it('undoing a reading brings back the previous one', () => {
    const events = build('solo', [ack('gear'), ack('isolate'), value(25), value(18), undo(4)], OPERATOR)
    const s = fold(events)
    expect(s.steps[4]!.value?.value).toBe(25)
    expect(s.values.map(v => v.value)).toEqual([25])
  })

  it('undoing a hold acknowledgement blocks the steps after it again', () => {
    const events = build('solo', [ack('gear'), undo(1), ack('isolate')], OPERATOR)
    const s = fold(events)
    expect(flagsOf(s, events)).toEqual([[3, 'passed-unacknowledged-hold']])
    expect(s.holdsCleared).toEqual({ gear: false, isolate: false })
  })

  it.each<[string, Intent[], [number, string][]]>([
    ['an override', [ack('gear'), override('isolate'), undo(2, TRAINER)], [[3, 'undo-of-override-refused']]],
    ['a sign-off', [ack('gear'), ack('isolate'), sign('isolate'), undo(3, TRAINER)], [[4, 'undo-of-signoff-refused']]],
    ['someone else\'s action', [done('intro', TRAINEE), undo(1, TRAINER)], [[2, 'not-own-event']]],
    ['an action that is not the last', [done('intro'), ack('gear'), undo(1)], [[3, 'undo-not-last']]],
    ['an acknowledgement under a trainer\'s sign-off', [ack('gear'), ack('isolate'), sign('isolate'), undo(2)], [[4, 'undo-not-last']]],
    ['the run start', [undo(0)], [[1, 'not-undoable']]],
    ['an undo', [done('intro'), undo(1), undo(2)], [[3, 'not-undoable']]],
    ['the same action twice', [done('intro'), undo(1), undo(1)], [[3, 'already-undone']]],
    ['a flagged event', [done('clear'), undo(1)], [[1, 'passed-unacknowledged-hold'], [2, 'undo-target-missing']]],
  ])('refuses to undo %s', (_name, intents, flags) => {
    const events = build('guided', intents)
    expect(flagsOf(fold(events), events)).toEqual(flags)
  })

  it('an override stays in the record and keeps its hold cleared after any undo attempt', () => {
    const events = build('guided', [ack('gear'), override('isolate'), undo(2, TRAINER), undo(1)])
    const s = fold(events)
    expect(s.overrides.map(o => o.eventId)).toEqual([events[2]!.id])
    expect(s.steps[2]!.status).toBe('overridden')
    // The acknowledgement under the override cannot be taken back either.
    expect(flagsOf(s, events)).toEqual([[3, 'undo-of-override-refused'], [4, 'undo-not-last']])
  })

  it('an undo whose target is not in the log yet is flagged', () => {
    const events = script('solo', [])
    events.push(ev('event.undone', { targetId: RUN_ID }, { sec: 2 }))
    expect(fold(events).flagged.map(f => f.code)).toEqual(['undo-target-missing'])
  })

  it('a person may remove their own note even after other actions', () => {
    const events = build('solo', [['note.added', { text: 'Check the left clamp' }], done('intro'), undo(1)], OPERATOR)
    const s = fold(events)
    expect(s.flagged).toEqual([])
    expect(s.notes).toEqual([])
    expect(s.steps[0]!.status).toBe('done')
  })
})

describe('current step and finishing', () => {
  it.each<[number, number]>([[0, 0], [1, 1], [2, 2], [3, 2], [4, 3], [5, 4], [7, 5], [9, 6], [11, 7], [12, 8]])(
    'after %i scripted events of the guided run the current step is %i',
    (n, current) => {
      const s = fold(script('guided', GUIDED_HAPPY.slice(0, n)))
      expect(s.currentStepIndex).toBe(current)
      expect(s.canFinish).toBe(current === STEPS.length)
    },
  )

  it('the current step skips steps done out of order before the first hold', () => {
    const s = fold(script('solo', [ack('gear')], OPERATOR))
    expect(s.currentStepIndex).toBe(0)
    expect(s.steps[1]!.complete).toBe(true)
  })
})

function rolesBase() {
  return { [TRAINEE]: 'trainee', [OPERATOR]: 'operator', [TRAINER]: 'trainer', [OWNER]: 'owner' } as const
}
