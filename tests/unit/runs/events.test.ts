import { validate as uuidValidate, version as uuidVersion } from 'uuid'
import { describe, expect, it } from 'vitest'
import { makeEvent, newEventId, newRunId, parseRunEvent, RUN_EVENT_TYPES, RunEventError } from '../../../shared/runs/events'

// Event envelope checks. The UUID version is checked with the uuid package's own `version()`
// (RFC 9562 layout: version nibble 7 for time-ordered ids), independently of our schema.

const ctx = { runId: '01950a6e-1c00-7000-8000-000000000001', actorId: 5, deviceId: 'tablet-front' }
const AT = '2025-03-01T08:15:00.000Z'

function valid(type: string, payload: Record<string, unknown> = {}) {
  return { id: newEventId(), runId: ctx.runId, at: AT, actorId: 5, deviceId: 'tablet-front', type, ...payload }
}

describe('ids', () => {
  it('newEventId and newRunId give RFC 9562 version-7 UUIDs', () => {
    for (const id of [newEventId(), newRunId()]) {
      expect(uuidValidate(id)).toBe(true)
      expect(uuidVersion(id)).toBe(7)
    }
  })

  it('ids made one after another sort in the order they were made', () => {
    const ids = Array.from({ length: 200 }, () => newEventId())
    expect([...ids].sort()).toEqual(ids)
    expect(new Set(ids).size).toBe(200)
  })
})

describe('makeEvent', () => {
  it('fills the envelope and validates the payload', () => {
    const e = makeEvent({ ...ctx, at: new Date(AT) }, 'hold.acknowledged', { stepKey: 'isolate-power' })
    expect(e).toEqual({ ...ctx, id: e.id, at: AT, type: 'hold.acknowledged', stepKey: 'isolate-power' })
    expect(uuidVersion(e.id)).toBe(7)
  })

  it('needs no payload for run.finished and stamps the current time', () => {
    const before = Date.now()
    const e = makeEvent(ctx, 'run.finished')
    expect(Date.parse(e.at)).toBeGreaterThanOrEqual(before)
    expect(Date.parse(e.at)).toBeLessThanOrEqual(Date.now())
  })

  it('drops an empty reason on a reading', () => {
    const e = makeEvent(ctx, 'value.recorded', { stepKey: 'board-thickness', value: 18.4, unit: 'mm', reason: '   ' })
    expect(e.reason).toBeUndefined()
  })

  it('throws an error naming the field when the payload is wrong', () => {
    expect(() => makeEvent(ctx, 'hold.overridden', { stepKey: 'isolate-power', reason: 'ok' }))
      .toThrowError(new RunEventError([{ path: 'reason', message: 'Override reason is too short: write at least 10 characters saying why.' }]))
    try {
      makeEvent({ ...ctx, actorId: 0 }, 'step.done', { stepKey: '' })
    }
    catch (err) {
      expect(err).toBeInstanceOf(RunEventError)
      expect((err as RunEventError).issues.map(i => i.path).sort()).toEqual(['actorId', 'stepKey'])
    }
  })
})

describe('parseRunEvent', () => {
  it.each(RUN_EVENT_TYPES.map(t => [t]))('accepts a well-formed %s event', (type) => {
    const payloads: Record<string, Record<string, unknown>> = {
      'run.started': { procedureVersionId: 3, machineId: 1, mode: 'guided' },
      'step.done': { stepKey: 'clear-bed' },
      'hold.acknowledged': { stepKey: 'isolate-power' },
      'value.recorded': { stepKey: 'board-thickness', value: 18.4, unit: 'mm' },
      'note.added': { text: 'Left clamp is cracked' },
      'photo.attached': { stepKey: 'photo-board', note: 'taken offline' },
      'plan.attached': { stepKey: 'plan', summary: '25 mm cutter, 0.3 mm deep' },
      'hold.overridden': { stepKey: 'isolate-power', reason: 'Machine unplugged and plug in my hand' },
      'signoff.given': { stepKey: 'final-signoff', signerId: 2, signerRole: 'trainer' },
      'event.undone': { targetId: newEventId() },
      'run.finished': {},
      'run.abandoned': { reason: 'Spindle bearing noise, stopped for repair' },
      'run.handed-over': { toUserId: 4 },
    }
    const r = parseRunEvent(valid(type, payloads[type]))
    expect(r.ok).toBe(true)
  })

  it.each<[string, Record<string, unknown>, string, RegExp]>([
    ['an unknown type', valid('step.skipped', { stepKey: 'a' }), 'type', /Event type must be one of run\.started, step\.done/],
    ['a v4 id', { ...valid('step.done', { stepKey: 'a' }), id: '3b241101-e2bb-4255-8caf-4136c566a962' }, 'id', /UUIDv7/],
    ['a run id that is not a UUID', { ...valid('step.done', { stepKey: 'a' }), runId: 'run-1' }, 'runId', /Run id must be a UUID/],
    ['a time without a zone', { ...valid('step.done', { stepKey: 'a' }), at: '2025-03-01T08:15:00' }, 'at', /time zone/],
    ['a date only', { ...valid('step.done', { stepKey: 'a' }), at: '2025-03-01' }, 'at', /ISO 8601/],
    ['a fractional actor id', { ...valid('step.done', { stepKey: 'a' }), actorId: 1.5 }, 'actorId', /whole number/],
    ['a missing device id', { ...valid('step.done', { stepKey: 'a' }), deviceId: undefined }, 'deviceId', /Device id is required/],
    ['a missing step key', valid('step.done'), 'stepKey', /Step key is required/],
    ['a value that is not a number', valid('value.recorded', { stepKey: 'a', value: '18', unit: 'mm' }), 'value', /Value must be a number/],
    ['an infinite value', valid('value.recorded', { stepKey: 'a', value: Number.POSITIVE_INFINITY, unit: 'mm' }), 'value', /Value must be a finite number/],
    ['an override without a reason', valid('hold.overridden', { stepKey: 'a' }), 'reason', /Override reason is required/],
    ['an override with one word', valid('hold.overridden', { stepKey: 'a', reason: 'checked!!!!!!!' }), 'reason', /at least two words/],
    ['an override with filler', valid('hold.overridden', { stepKey: 'a', reason: 'aa aa aa aa aa' }), 'reason', /not filler/],
    ['a signer who is an operator', valid('signoff.given', { signerId: 2, signerRole: 'operator' }), 'signerRole', /trainer or owner/],
    ['a bad mode', valid('run.started', { procedureVersionId: 1, machineId: 1, mode: 'alone' }), 'mode', /guided or solo/],
    ['an empty note', valid('note.added', { text: '  ' }), 'text', /Note is required/],
    ['an undo of nothing', valid('event.undone', { targetId: 'last' }), 'targetId', /id of an earlier event/],
    ['an abandon without a reason', valid('run.abandoned'), 'reason', /Reason for abandoning the run is required/],
  ])('rejects %s with the field and reason', (_name, input, path, message) => {
    const r = parseRunEvent(input)
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.issues).toContainEqual({ path, message: expect.stringMatching(message) })
  })

  it('rejects something that is not an object with a plain sentence', () => {
    const r = parseRunEvent('step.done')
    expect(r).toEqual({ ok: false, issues: [{ path: '', message: 'An event must be an object with id, runId, type, at, actorId and deviceId.' }] })
  })
})
