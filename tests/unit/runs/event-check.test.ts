import { describe, expect, it } from 'vitest'
import { makeEvent, parseRunEvent, RUN_EVENT_TYPES, RunEventError } from '../../../shared/runs/events'
import { checkRunEvent, CONFIRMED_TYPES } from '../../../shared/runs/event-check'
import { buildEvent, QUICK_TYPES, quickRunEvent } from '../../../shared/runs/event-quick'
import { seededRandom } from '../../support/seeded-random'

// The quick check must be the zod schema's exact twin on every event it vouches for, and defer
// to it on everything else. The schema itself (shared/runs/events.ts) is the reference here:
// thousands of events drawn with a fixed seed, well-formed and damaged, are put through both.

// A seeded generator, so every run draws the same cases
const random = seededRandom

const ID = '01950a6e-1c00-7000-8000-000000000001'
const RUN = '01950a6e-1c00-7000-8000-0000000000a0'
const fields: Record<string, Record<string, unknown>> = {
  'run.started': { procedureVersionId: 3, machineId: 1, mode: 'guided' },
  'step.done': { stepKey: 'clear-bed' },
  'hold.acknowledged': { stepKey: 'isolate-power', lang: 'es' },
  'value.recorded': { stepKey: 'board-thickness', value: 18.4, unit: 'mm', reason: 'Board swelled after the wet week' },
  'note.added': { stepKey: 'clear-bed', text: 'Left clamp is cracked' },
  'photo.attached': { stepKey: 'photo-board', uploadId: 'u-17', note: 'taken offline' },
  'plan.attached': { stepKey: 'plan', planId: '12', summary: '25 mm cutter, 0.3 mm deep' },
  'hold.overridden': { stepKey: 'isolate-power', reason: 'Machine unplugged and plug in my hand' },
  'signoff.given': { stepKey: 'final-signoff', signerId: 2, signerRole: 'trainer' },
  'event.undone': { targetId: ID },
  'run.finished': {},
  'run.abandoned': { reason: 'Spindle bearing noise, stopped for repair' },
  'run.handed-over': { toUserId: 4 },
  'run.withdrawn': {},
}
const wellFormed = (type: string) => ({ id: ID, runId: RUN, at: '2025-03-01T08:15:00.000Z', actorId: 5, deviceId: 'tablet-front', type, ...fields[type] })

// Values that sit on or just past a rule's edge: spaces, lengths, ids, numbers, times, text.
const odd: unknown[] = [
  '', ' ', ' x', 'x ', 'x', 'x'.repeat(16), 'x'.repeat(17), 'x'.repeat(60), 'x'.repeat(61), 'x'.repeat(64), 'x'.repeat(65),
  'x'.repeat(500), 'x'.repeat(501), 'x'.repeat(1000), 'x'.repeat(1001), 'x'.repeat(2000), 'x'.repeat(2001), '\uD800', 'a\uDC00b',
  'tab\there', 'line\nbreak', '\u00A0nbsp', 'ES', 'es', 'spa', 'espa', 'guided', 'solo', 'alone',
  0, -0, 1, -1, 1.5, 2_147_483_647, 2_147_483_648, 1e9, -1e9, 1e9 + 1, 1e16, Number.NaN, Number.POSITIVE_INFINITY,
  null, undefined, true, [], {}, { nested: 'x' },
  '01950a6e-1c00-7000-8000-000000000001', '01950A6E-1C00-7000-8000-000000000001', '3b241101-e2bb-4255-8caf-4136c566a962',
  '00000000-0000-0000-0000-000000000000', '01950a6e-1c00-7000-c000-000000000001', 'run-1',
  '2025-03-01T08:15:00Z', '2025-03-01T08:15:00.123456+02:00', '2025-03-01T08:15:00', '2025-02-29T08:15:00Z', '2024-02-29T08:15:00Z',
  '2025-03-01T24:00:00Z', '2025-03-01', ...RUN_EVENT_TYPES,
]

function draw(rand: () => number) {
  const pick = <T>(list: readonly T[]) => list[Math.floor(rand() * list.length)]!
  const event: Record<string, unknown> = wellFormed(pick(RUN_EVENT_TYPES))
  const keys = [...Object.keys(event), 'verdict', 'extra', 'stepKey', 'lang', 'reason', 'seal', '__proto__']
  const changes = Math.floor(rand() * 3)
  for (let i = 0; i < changes; i++) {
    const key = pick(keys)
    const roll = rand()
    if (roll < 0.15) Reflect.deleteProperty(event, key)
    else if (roll < 0.2) event.verdict = { status: 'verified' }
    else event[key] = pick(odd)
  }
  return event
}

describe('quickRunEvent', () => {
  it('vouches for the plain events of every type it covers, as the schema returns them', () => {
    for (const type of RUN_EVENT_TYPES) {
      const input = wellFormed(type)
      const quick = quickRunEvent(input)
      const slow = parseRunEvent(input)
      expect(slow.ok).toBe(true)
      if (['hold.overridden', 'signoff.given', 'run.abandoned'].includes(type)) expect(quick).toBeUndefined()
      else expect(JSON.stringify(quick)).toBe(JSON.stringify(slow.ok && slow.event))
    }
  })

  function agree(input: Record<string, unknown>) {
    const slow = parseRunEvent(input)
    const quick = quickRunEvent(input)
    if (quick) {
      // Same verdict, same fields in the same order, same values.
      expect(slow.ok, JSON.stringify(input)).toBe(true)
      if (slow.ok) {
        expect(quick).toStrictEqual(slow.event)
        expect(JSON.stringify(quick)).toBe(JSON.stringify(slow.event))
      }
    }
    // checkRunEvent answers exactly as parseRunEvent, messages included.
    expect(checkRunEvent(input)).toStrictEqual(slow)
    return { quick: !!quick, ok: slow.ok }
  }

  it('agrees with the zod schema on every single-field change: each field of each type set to each edge value', () => {
    let vouched = 0
    for (const type of RUN_EVENT_TYPES) {
      for (const key of [...Object.keys(wellFormed(type)), 'verdict', 'extra', 'stepKey', 'lang', 'reason']) {
        for (const value of odd) vouched += Number(agree({ ...wellFormed(type), [key]: value }).quick)
        const without: Record<string, unknown> = wellFormed(type)
        Reflect.deleteProperty(without, key)
        agree(without)
      }
    }
    expect(vouched).toBeGreaterThan(300)
  }, 60_000) // about 40,000 parses: seconds on a busy machine

  it('agrees with the zod schema on 8,000 drawn events, well-formed and damaged', () => {
    const rand = random(14)
    let vouched = 0
    let refused = 0
    for (let i = 0; i < 8_000; i++) {
      const { quick, ok } = agree(draw(rand))
      vouched += Number(quick)
      refused += Number(!ok)
    }
    // The draw reaches both sides often enough for the comparison to mean something.
    expect(vouched).toBeGreaterThan(2000)
    expect(refused).toBeGreaterThan(2000)
  }, 60_000)

  it('leaves a field it does not know, text with spaces around it and a verdict to the schema', () => {
    expect(quickRunEvent({ ...wellFormed('step.done'), extra: 1 })).toBeUndefined()
    expect(quickRunEvent({ ...wellFormed('step.done'), stepKey: ' clear-bed' })).toBeUndefined()
    expect(quickRunEvent({ ...wellFormed('step.done'), verdict: { status: 'verified' } })).toBeUndefined()
    expect(quickRunEvent({ ...wellFormed('value.recorded'), reason: '' })).toBeUndefined()
    expect(quickRunEvent(Object.assign(Object.create(null), wellFormed('step.done')))).toBeUndefined()
  })

  it('matches the schemas in every type it covers: the tablet, which has no zod to confirm it, uses them all', () => {
    expect([...CONFIRMED_TYPES.keys()]).toStrictEqual([...QUICK_TYPES.keys()])
    expect(CONFIRMED_TYPES.size).toBe(11)
  })
})

describe('buildEvent', () => {
  const ctx = { runId: RUN, actorId: 5, deviceId: 'tablet-front', id: ID, at: '2025-03-01T08:15:00.000Z' }

  it('makes the event makeEvent makes, by the quick check or by the schema', async () => {
    for (const type of RUN_EVENT_TYPES) {
      const payload = fields[type] as any
      expect(JSON.stringify(await buildEvent(ctx, type, payload))).toBe(JSON.stringify(makeEvent(ctx, type, payload)))
    }
    // Spaces around a reading's reason: the schema trims it.
    const spaced = await buildEvent(ctx, 'value.recorded', { stepKey: 'board-thickness', value: 18.4, unit: 'mm', reason: '  swelled  ' })
    expect(spaced.reason).toBe('swelled')
  })

  it('refuses a wrong payload with the schema\'s field and reason', async () => {
    const wrong = buildEvent(ctx, 'value.recorded', { stepKey: 'board-thickness', value: 2e9, unit: 'mm' })
    await expect(wrong).rejects.toBeInstanceOf(RunEventError)
    await expect(wrong).rejects.toThrow('value: Value must be at most 1000000000.')
    await expect(buildEvent(ctx, 'step.done', { stepKey: ' ' })).rejects.toThrow('stepKey: Step key is required.')
  })

  it('fills the id and the time when the caller gives none', async () => {
    const made = await buildEvent({ runId: RUN, actorId: 5, deviceId: 'tablet-front' }, 'step.done', { stepKey: 'clear-bed' })
    expect(made.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-7/)
    expect(Math.abs(Date.parse(made.at) - Date.now())).toBeLessThan(60_000)
  })
})
