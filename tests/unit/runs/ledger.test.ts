import { describe, expect, it } from 'vitest'
import { ledgerEntriesOf, spindleMinutesOf } from '../../../shared/runs/ledger'
import { ProcedureSchema } from '../../../shared/procedures/schema'
import type { RunEvent } from '../../../shared/runs/events'
import { foldRun } from '../../../shared/runs/fold'
import { ev, fold, GUIDED_HAPPY, OPERATOR, OWNER, script, SOLO_HAPPY, STEPS, TRAINEE, TRAINER, type Intent } from './fixtures'

// The Ledger's kinds are Jogwise's own rules (issue 6 and the product brief: overrides, late
// events that passed a hold, out-of-range readings, skipped checks); each test states the rule.
// The fixture's check step "thickness" allows 12 to 19.5 mm (tests/unit/runs/fixtures.ts).

const op = (type: Intent[0], payload: Record<string, unknown> = {}, actor = OPERATOR): Intent => [type, payload, actor]
// The exception kinds only; acknowledgements and sign-offs have tests of their own below.
const ROUTINE = new Set(['hold-acknowledged', 'signed-off'])
const exceptions = (events: RunEvent[]) => ledgerEntriesOf(fold(events), STEPS).filter(e => !ROUTINE.has(e.kind))
const kinds = (events: RunEvent[]) => exceptions(events).map(e => [e.kind, e.stepKey])

describe('ledgerEntriesOf', () => {
  it('a clean solo run leaves no exception in the Ledger, only its acknowledgements', () => {
    const events = script('solo', SOLO_HAPPY, OPERATOR)
    expect(kinds(events)).toEqual([])
    expect(ledgerEntriesOf(fold(events), STEPS).map(e => [e.kind, e.stepKey, e.counted])).toEqual([['hold-acknowledged', 'gear', true], ['hold-acknowledged', 'isolate', true]])
  })

  it('an accepted override is one entry with its reason and the hold\'s signal word', () => {
    const events = script('solo', [op('step.done', { stepKey: 'intro' }), op('hold.overridden', { stepKey: 'gear', reason: 'Glasses checked by the trainer at the door' }, TRAINER)], OPERATOR)
    const entries = exceptions(events)
    expect(entries).toHaveLength(1)
    expect(entries[0]).toMatchObject({ kind: 'override', stepKey: 'gear', actorId: TRAINER, eventId: events[2]!.id, counted: true })
    expect(entries[0]!.detail).toMatchObject({ reason: 'Glasses checked by the trainer at the door', signalWord: 'WARNING', stepTitle: 'Wear protection' })
  })

  it('an event that acted past an open hold is a late-past-hold entry; it stays after the hold is cleared', () => {
    const events = script('solo', [op('step.done', { stepKey: 'intro' }), op('step.done', { stepKey: 'clear' }), op('hold.acknowledged', { stepKey: 'gear' })], OPERATOR)
    const entries = exceptions(events)
    expect(entries.map(e => [e.kind, e.stepKey, e.eventId])).toEqual([['late-past-hold', 'clear', events[2]!.id]])
    expect(entries[0]!.detail).toMatchObject({ code: 'passed-unacknowledged-hold', eventType: 'step.done' })
  })

  it('a reading outside the range is an entry with value, unit, range and reason; one inside is not', () => {
    const base: Intent[] = [op('step.done', { stepKey: 'intro' }), op('hold.acknowledged', { stepKey: 'gear' }), op('hold.acknowledged', { stepKey: 'isolate' }), op('step.done', { stepKey: 'clear' })]
    const high = script('solo', [...base, op('value.recorded', { stepKey: 'thickness', value: 21, unit: 'mm', reason: 'New board not faced yet, thicker than nominal' })], OPERATOR)
    const entries = exceptions(high)
    expect(entries.map(e => e.kind)).toEqual(['out-of-range'])
    expect(entries[0]!.detail).toMatchObject({ value: 21, unit: 'mm', side: 'above', range: '12 to 19.5 mm', reason: 'New board not faced yet, thicker than nominal' })
    // 19.5 is the upper bound itself: inside (bounds are inclusive).
    expect(kinds(script('solo', [...base, op('value.recorded', { stepKey: 'thickness', value: 19.5, unit: 'mm' })], OPERATOR))).toEqual([])
  })

  it('after an undo of an out-of-range reading the fold gives no entry for it (the stored one is marked changed, never deleted)', () => {
    const intents: Intent[] = [op('step.done', { stepKey: 'intro' }), op('hold.acknowledged', { stepKey: 'gear' }), op('hold.acknowledged', { stepKey: 'isolate' }), op('step.done', { stepKey: 'clear' }), op('value.recorded', { stepKey: 'thickness', value: 9, unit: 'mm', reason: 'Measured at the worn corner only' })]
    const events = script('solo', intents, OPERATOR)
    expect(kinds(events)).toEqual([['out-of-range', 'thickness']])
    events.push(ev('event.undone', { targetId: events.at(-1)!.id }, { actor: OPERATOR, sec: 50 }))
    expect(kinds(events)).toEqual([])
  })

  it('work on a later step with no reading on a check is a skipped check; once the reading is recorded the fold gives it no more', () => {
    const intents: Intent[] = [op('step.done', { stepKey: 'intro' }), op('hold.acknowledged', { stepKey: 'gear' }), op('hold.acknowledged', { stepKey: 'isolate' }), op('step.done', { stepKey: 'clear' }), op('photo.attached', { stepKey: 'photo', note: 'Board from above' })]
    const events = script('solo', intents, OPERATOR)
    const entries = exceptions(events)
    expect(entries.map(e => [e.kind, e.stepKey, e.eventId])).toEqual([['skipped-check', 'thickness', events.at(-1)!.id]])
    expect(entries[0]!.detail).toMatchObject({ passedBy: { stepKey: 'photo', action: 'photo.attached' } })
    events.push(ev('value.recorded', { stepKey: 'thickness', value: 18, unit: 'mm' }, { actor: OPERATOR, sec: 60 }))
    expect(kinds(events)).toEqual([])
  })

  it('every acknowledgement and sign-off of a guided run is an entry, the sign-off under the signer', () => {
    const events = script('guided', GUIDED_HAPPY, TRAINEE)
    const entries = ledgerEntriesOf(fold(events), STEPS).filter(e => ROUTINE.has(e.kind))
    expect(entries.map(e => [e.kind, e.stepKey, e.actorId, e.counted])).toEqual([
      ['hold-acknowledged', 'gear', TRAINEE, true],
      ['hold-acknowledged', 'isolate', TRAINEE, true],
      ['signed-off', 'isolate', TRAINER, true],
      ['signed-off', 'final', TRAINER, true],
    ])
    expect(entries[2]!.detail).toMatchObject({ signerId: TRAINER, signerRole: 'trainer', sentBy: TRAINER, stepTitle: 'Isolate the power' })
    expect(entries[0]!.detail).toMatchObject({ signalWord: 'WARNING', stepTitle: 'Wear protection' })
  })

  it('an override the fold did not count (a second tablet overrode the same hold) is listed, not counted, with the reason', () => {
    const events = script('solo', [
      op('step.done', { stepKey: 'intro' }),
      op('hold.overridden', { stepKey: 'gear', reason: 'Glasses checked by the trainer at the door' }, TRAINER),
      op('hold.overridden', { stepKey: 'gear', reason: 'Owner checked the glasses from the office tablet' }, OWNER),
    ], OPERATOR)
    const overrides = ledgerEntriesOf(fold(events), STEPS).filter(e => e.kind === 'override')
    expect(overrides.map(e => [e.actorId, e.counted])).toEqual([[TRAINER, true], [OWNER, false]])
    expect(overrides[1]!.detail).toMatchObject({ notCountedCode: 'already-cleared', reason: 'Owner checked the glasses from the office tablet' })
    expect(String(overrides[1]!.detail.notCounted)).toMatch(/already cleared/)
  })

  it('a backdated run.abandoned makes a later override not counted; the override is still an entry', () => {
    const events = script('solo', [op('step.done', { stepKey: 'intro' }), op('hold.overridden', { stepKey: 'gear', reason: 'Glasses checked by the trainer at the door' }, TRAINER)], OPERATOR)
    expect(ledgerEntriesOf(fold(events), STEPS).find(e => e.kind === 'override')?.counted).toBe(true)
    // Dated one second before the override (second 2), by someone else.
    events.push(ev('run.abandoned', { reason: 'Machine needed for an urgent job' }, { actor: TRAINEE, sec: 1.5, device: 'tablet-b' }))
    const override = ledgerEntriesOf(fold(events), STEPS).find(e => e.kind === 'override')
    expect(override).toMatchObject({ counted: false, eventId: events[2]!.id, detail: { notCountedCode: 'after-finish' } })
  })

  it('an undone acknowledgement stays listed, not counted', () => {
    const events = script('solo', [op('step.done', { stepKey: 'intro' }), op('hold.acknowledged', { stepKey: 'gear' })], OPERATOR)
    events.push(ev('event.undone', { targetId: events[2]!.id }, { actor: OPERATOR, sec: 10 }))
    const acks = ledgerEntriesOf(fold(events), STEPS).filter(e => e.kind === 'hold-acknowledged')
    expect(acks.map(e => [e.eventId, e.counted, e.detail.notCountedCode])).toEqual([[events[2]!.id, false, 'undone']])
  })

  it('a check never reached (the run abandoned before it) is not skipped', () => {
    const events = script('solo', [op('step.done', { stepKey: 'intro' }), op('run.abandoned', { reason: 'Machine needed for an urgent job' })], OPERATOR)
    expect(kinds(events)).toEqual([])
  })
})

describe('spindleMinutesOf', () => {
  const planned: Intent[] = SOLO_HAPPY.map(([t, p, a]) => (t === 'plan.attached' ? [t, { ...p, planId: '41' }, a] as Intent : [t, p, a] as Intent))

  it('counts the attached plan once its planner step is done, by the stored plan\'s time', () => {
    const state = fold(script('solo', planned, OPERATOR))
    expect(spindleMinutesOf(state, STEPS, id => (id === '41' ? 12.5 : null))).toBe(12.5)
    expect(spindleMinutesOf(state, STEPS, () => null)).toBe(0)
  })

  it('adds a spindle-hours check reading in minutes (1 h = 60 min)', () => {
    const steps = ProcedureSchema.parse({
      title: 'Cut a job', summary: 'Log how long the spindle ran on this job.', category: 'maintenance',
      steps: [{ key: 'hours', kind: 'check', title: 'Spindle hours run', body: 'Read the hour meter.', label: 'Spindle time', unit: 'h', min: 0 },
        { key: 'final', kind: 'signoff', title: 'Sign off', body: 'Sign if all is true.', statement: 'Every step was done as written.' }],
    }).steps
    const events = [
      ev('run.started', { procedureVersionId: 1, machineId: 1, mode: 'solo' }, { actor: OPERATOR, sec: 0 }),
      ev('value.recorded', { stepKey: 'hours', value: 1.5, unit: 'h' }, { actor: OPERATOR, sec: 1 }),
    ]
    expect(spindleMinutesOf(foldRun(steps, events), steps, () => null)).toBe(90)
  })
})
