import { v7 } from 'uuid'
import { ProcedureSchema, type ProcedureStep } from '../../../shared/procedures/schema'
import { makeEvent, type RunEvent, type RunEventPayload, type RunEventType, type RunMode } from '../../../shared/runs/events'
import { foldRun, type RunState } from '../../../shared/runs/fold'
import type { Role } from '../../../shared/types/roles'

// A small procedure with one step of every kind, and a crew with one person per role.

export const TRAINEE = 1
export const OPERATOR = 2
export const TRAINER = 3
export const OWNER = 4
export const OUTSIDER = 9
export const ROLES: Record<number, Role> = { [TRAINEE]: 'trainee', [OPERATOR]: 'operator', [TRAINER]: 'trainer', [OWNER]: 'owner' }

export const T0 = Date.UTC(2025, 2, 1, 8, 0, 0)

export const STEPS: ProcedureStep[] = ProcedureSchema.parse({
  title: 'Fold test procedure',
  summary: 'One step of every kind, in the order a real procedure would use them.',
  category: 'maintenance',
  steps: [
    { key: 'intro', kind: 'instruction', title: 'Read the overview', body: 'Read the overview.' },
    {
      key: 'gear', kind: 'hold', title: 'Wear protection', body: 'Put on glasses and ear muffs.',
      signalWord: 'WARNING', hazard: 'Flying chips can blind you.', avoid: 'Wear safety glasses with side shields.',
    },
    {
      key: 'isolate', kind: 'hold', title: 'Isolate the power', body: 'Lock off the isolator.',
      signalWord: 'WARNING', hazard: 'An unexpected start can cause serious injury.', avoid: 'Lock and tag the main isolator.',
      needsTrainerSignoff: true,
    },
    { key: 'clear', kind: 'instruction', title: 'Clear the bed', body: 'Remove clamps and fences.' },
    { key: 'thickness', kind: 'check', title: 'Measure the board', body: 'Enter the thickness.', label: 'Board thickness', unit: 'mm', min: 12, max: 19.5 },
    { key: 'photo', kind: 'photo', title: 'Photograph the board', body: 'Take one photo.', subject: 'The whole board.' },
    { key: 'plan', kind: 'planner', title: 'Plan the facing', body: 'Open the planner and attach the plan.' },
    { key: 'final', kind: 'signoff', title: 'Sign off', body: 'Sign if all is true.', statement: 'Every step was done as written.' },
  ],
}).steps

export const RUN_ID = v7({ msecs: T0, seq: 0, random: new Uint8Array(16) })
export const OTHER_RUN_ID = v7({ msecs: T0, seq: 1, random: new Uint8Array(16).fill(1) })

let counter = 1
/** A valid, deterministic UUIDv7 for a given time. */
export function idAt(ms: number): string {
  const n = counter++
  const random = new Uint8Array(16)
  for (let i = 0; i < 16; i++) random[i] = (n * 31 + i * 7) & 0xff
  return v7({ msecs: ms, seq: n & 0x3ffff, random })
}

export interface EvOptions { actor?: number, sec?: number, id?: string, runId?: string, device?: string }

/** One validated event at T0 + sec seconds. */
export function ev<T extends RunEventType>(type: T, payload: RunEventPayload<T>, o: EvOptions = {}): RunEvent {
  const ms = T0 + (o.sec ?? 0) * 1000
  return makeEvent(
    { runId: o.runId ?? RUN_ID, actorId: o.actor ?? TRAINEE, deviceId: o.device ?? 'tablet-a', at: new Date(ms), id: o.id ?? idAt(ms) },
    type,
    payload as never,
  )
}

export type Intent = [type: RunEventType, payload?: Record<string, unknown>, actor?: number]

/** Turns a script into events one second apart, after a run.started at second 0. */
export function script(mode: RunMode, intents: Intent[], starter = TRAINEE): RunEvent[] {
  const out: RunEvent[] = [ev('run.started', { procedureVersionId: 7, machineId: 2, mode }, { actor: starter, sec: 0 })]
  intents.forEach(([type, payload, actor], i) => {
    out.push(ev(type, (payload ?? {}) as never, { actor: actor ?? starter, sec: i + 1 }))
  })
  return out
}

export const fold = (events: RunEvent[], roles: Record<number, Role> | undefined = ROLES): RunState =>
  foldRun(STEPS, events, { roles })

/** Everything a guided trainee run needs, in order, with the trainer signing. */
export const GUIDED_HAPPY: Intent[] = [
  ['step.done', { stepKey: 'intro' }],
  ['hold.acknowledged', { stepKey: 'gear' }],
  ['hold.acknowledged', { stepKey: 'isolate' }],
  ['signoff.given', { stepKey: 'isolate', signerId: TRAINER, signerRole: 'trainer' }, TRAINER],
  ['step.done', { stepKey: 'clear' }],
  ['value.recorded', { stepKey: 'thickness', value: 18.2, unit: 'mm' }],
  ['step.done', { stepKey: 'thickness' }],
  ['photo.attached', { stepKey: 'photo', note: 'Board photographed from above' }],
  ['step.done', { stepKey: 'photo' }],
  ['plan.attached', { stepKey: 'plan', summary: '25 mm cutter, 0.3 mm deep, 12 min' }],
  ['step.done', { stepKey: 'plan' }],
  ['signoff.given', { stepKey: 'final', signerId: TRAINER, signerRole: 'trainer' }, TRAINER],
  ['run.finished', {}],
]

/** The same run done alone by an operator. */
export const SOLO_HAPPY: Intent[] = GUIDED_HAPPY
  .filter(([type]) => type !== 'signoff.given')
  .flatMap((i): Intent[] => (i[0] === 'run.finished' ? [['step.done', { stepKey: 'final' }], i] : [i]))
  .map(([type, payload]) => [type, payload, OPERATOR])

/** Codes of flagged events, as [index in the input, code] pairs, sorted by index. */
export function flagsOf(state: RunState, events: RunEvent[]): [number, string][] {
  return state.flagged
    .map(f => [events.findIndex(e => e === f.event), f.code] as [number, string])
    .sort((a, b) => a[0] - b[0])
}
