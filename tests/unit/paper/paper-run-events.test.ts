import { describe, expect, it } from 'vitest'
import { paperRunEvents, PAPER_DEVICE_ID } from '../../../shared/paper/paper-run-events'
import { parseProcedure } from '../../../shared/procedures/schema'
import { PaperRunSchema } from '../../../shared/schemas/paper-run'

// A paper sheet turned into run events (issue 17), folded with the same foldRun the tablets
// use. The rules are Jogwise's own (guided runs need a trainer's signature, holds with
// needsTrainerSignoff need one too; ranges are inclusive); the signal word is ANSI Z535.4's.

const parsed = parseProcedure({
  title: 'Belt check on paper',
  summary: 'A short procedure to check the belts.',
  category: 'maintenance',
  steps: [
    { key: 'look', kind: 'instruction', title: 'Look over the gantry', body: 'Look over the gantry and rails.' },
    { key: 'power', kind: 'hold', title: 'Isolate the power', body: 'Switch off and lock out the main isolator.', signalWord: 'WARNING', hazard: 'A moving gantry can crush hands.', avoid: 'Lock out the isolator before reaching in.', needsTrainerSignoff: true },
    { key: 'belt', kind: 'check', title: 'Belt deflection', body: 'Press the belt at mid span and measure.', label: 'Deflection', unit: 'mm', min: 2, max: 5 },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The belts were checked.' },
  ],
})
if (!parsed.ok) throw new Error('fixture does not parse')
const steps = parsed.procedure.steps
const trainer = { id: 2, role: 'trainer' as const }

const input = (over: Record<string, unknown> = {}) => PaperRunSchema.parse({
  runId: '0190f5a0-0000-7000-8000-000000000001', machineId: 1, procedureVersionId: 1, operatorId: 4, mode: 'guided',
  startedAt: '2026-11-30T08:00:00Z', finishedAt: '2026-11-30T08:40:00Z', outcome: 'finished',
  ticked: ['look', 'power'], readings: [{ stepKey: 'belt', value: 5 }], signerId: 2, ...over,
})

describe('paper run events', () => {
  it('a complete guided sheet folds to a finished run, signed by the trainer', () => {
    const out = paperRunEvents(input(), steps, trainer)
    if (!out.ok) throw new Error(JSON.stringify(out.issues))
    expect(out.state.status).toBe('finished')
    expect(out.state.flagged).toEqual([])
    // 5 mm is inside 2 to 5 mm: bounds are inclusive.
    expect(out.state.values[0]).toMatchObject({ value: 5, outOfRange: null })
    expect(out.state.signoffs.map(s => [s.stepKey, s.signerId])).toEqual([['power', 2], ['sign', 2]])
    expect(out.events.every(e => e.deviceId === PAPER_DEVICE_ID)).toBe(true)
    expect(out.events[0]!.at).toBe('2026-11-30T08:00:00.000Z')
    expect(out.events.at(-1)!.at).toBe('2026-11-30T08:40:00.000Z')
    const times = out.events.map(e => Date.parse(e.at))
    expect(times.every((t, i) => i === 0 || t > times[i - 1]!)).toBe(true)
  })

  it('an out-of-range reading needs a reason, then goes on the record as out of range', () => {
    const bad = paperRunEvents(input({ readings: [{ stepKey: 'belt', value: 5.1 }] }), steps, trainer)
    expect(bad.ok).toBe(false)
    if (!bad.ok) expect(bad.issues.map(i => i.path)).toEqual(['readings.0.reason'])
    const good = paperRunEvents(input({ readings: [{ stepKey: 'belt', value: 5.1, reason: 'Belt stretched; a new one is ordered.' }] }), steps, trainer)
    if (!good.ok) throw new Error(JSON.stringify(good.issues))
    expect(good.state.values[0]).toMatchObject({ outOfRange: 'above' })
  })

  it('a finished sheet with a hold not ticked is refused, naming the step', () => {
    const out = paperRunEvents(input({ ticked: ['look'] }), steps, trainer)
    expect(out.ok).toBe(false)
    if (!out.ok) expect(out.issues).toEqual([{ path: 'ticked', message: expect.stringContaining('"Isolate the power" is not ticked') }])
  })

  it('a stopped sheet folds to an abandoned run with its reason', () => {
    const out = paperRunEvents(input({ outcome: 'stopped', stopReason: 'The isolator would not lock out.', ticked: ['look'], readings: [] }), steps, null)
    if (!out.ok) throw new Error(JSON.stringify(out.issues))
    expect(out.state.status).toBe('abandoned')
    expect(out.state.abandoned?.reason).toBe('The isolator would not lock out.')
  })
})
