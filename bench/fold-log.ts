import { ProcedureSchema } from '../shared/procedures/schema'
import type { RunEvent } from '../shared/runs/events'
import { idAt, OPERATOR, RUN_ID, T0 } from '../tests/unit/runs/fixtures'

// A long, realistic run log for timing the fold (bench/fold.ts) and for the fold's own test of
// such a log (tests/unit/runs/fold.speed.test.ts).
// 100 steps (the most a procedure may have): a hold every tenth step, checks in between.
export const steps = ProcedureSchema.parse({
  title: 'Long procedure',
  summary: 'A long procedure used to time the fold.',
  category: 'maintenance',
  steps: Array.from({ length: 100 }, (_, i) => {
    const key = `s${i}`
    if (i === 99) return { key, kind: 'signoff', title: 'Sign off', body: 'Sign.', statement: 'Everything was done.' }
    if (i % 10 === 0) return { key, kind: 'hold', title: `Hold ${i}`, body: 'Stop.', signalWord: 'CAUTION', hazard: 'Pinch points ahead.', avoid: 'Keep hands clear.' }
    if (i % 10 === 5) return { key, kind: 'check', title: `Check ${i}`, body: 'Measure.', label: 'Gap', unit: 'mm', min: 0, max: 1 }
    return { key, kind: 'instruction', title: `Step ${i}`, body: 'Do it.' }
  }),
}).steps

export function longLog(total: number): RunEvent[] {
  let t = T0
  const base = (type: string) => {
    t += 250
    return { id: idAt(t), runId: RUN_ID, at: new Date(t).toISOString(), actorId: OPERATOR, deviceId: 'tablet-a', type }
  }
  const events: RunEvent[] = [{ ...base('run.started'), procedureVersionId: 1, machineId: 1, mode: 'solo' } as RunEvent]
  let step = 0
  while (events.length < total - 1) {
    const s = steps[Math.min(step, steps.length - 1)]!
    // Readings re-taken, notes, and undo of a wrong reading, as a long day at the machine would give.
    const r = events.length % 7
    if (r === 0) events.push({ ...base('note.added'), stepKey: s.key, text: 'Remark' } as RunEvent)
    else if (r === 1 && s.kind === 'check') {
      const v = { ...base('value.recorded'), stepKey: s.key, value: 2, unit: 'mm' } as RunEvent
      events.push(v, { ...base('event.undone'), targetId: v.id } as RunEvent)
    }
    else if (step < steps.length) {
      if (s.kind === 'hold') events.push({ ...base('hold.acknowledged'), stepKey: s.key } as RunEvent)
      else if (s.kind === 'check') events.push({ ...base('value.recorded'), stepKey: s.key, value: 0.5, unit: 'mm' } as RunEvent, { ...base('step.done'), stepKey: s.key } as RunEvent)
      else events.push({ ...base('step.done'), stepKey: s.key } as RunEvent)
      step++
    }
    else events.push({ ...base('step.done'), stepKey: 's3' } as RunEvent) // flagged: already done
  }
  events.push({ ...base('run.finished') } as RunEvent)
  // Arrival order scrambled, as after a sync from several tablets.
  return events.map((e, i) => [e, (i * 7919) % events.length] as const).sort((a, b) => a[1] - b[1]).map(([e]) => e)
}
