import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { compareEvents, foldRun, type RunState } from '../../../shared/runs/fold'
import type { RunEvent } from '../../../shared/runs/events'
import { ev, GUIDED_HAPPY, OPERATOR, OUTSIDER, OWNER, ROLES, SOLO_HAPPY, STEPS, T0, TRAINEE, TRAINER, type Intent } from './fixtures'

// Property tests of the run fold (issue 3: "no sequence of events yields a completed step past
// an unacknowledged hold; undo never removes an override"; issue 4: two tablets converge, a
// replayed sync changes nothing). Random logs mix a correct run with noise: events from every
// role, unknown steps, wrong units, thin reasons, undos of anything, and clashing clock times.

const KEYS = [...STEPS.map(s => s.key), 'ghost']
const actor = fc.constantFrom(TRAINEE, OPERATOR, TRAINER, OWNER, OUTSIDER)
const key = fc.constantFrom(...KEYS)
const goodReason = fc.constantFrom('Lock already on, checked it with the owner', 'Sensor cable damaged, replaced before the run')

// An undo names its target by position in the generated list, or 'last' for the event just
// before it (made by the same person, as the undo button would); resolved after building.
type Noise = Intent | ['undo', number, number] | ['undo-last']

const noise: fc.Arbitrary<Noise> = fc.oneof(
  fc.tuple(key, actor).map(([k, a]): Intent => ['step.done', { stepKey: k }, a]),
  fc.tuple(key, actor).map(([k, a]): Intent => ['hold.acknowledged', { stepKey: k }, a]),
  fc.tuple(fc.constantFrom('thickness', 'intro'), fc.double({ min: 5, max: 25, noNaN: true }), fc.constantFrom('mm', 'in'), fc.option(fc.constantFrom('ok', 'Board swelled in the humid week'), { nil: undefined }), actor)
    .map(([k, v, u, r, a]): Intent => ['value.recorded', r === undefined ? { stepKey: k, value: v, unit: u } : { stepKey: k, value: v, unit: u, reason: r }, a]),
  fc.tuple(fc.option(key, { nil: undefined }), actor).map(([k, a]): Intent => ['note.added', k === undefined ? { text: 'a remark' } : { stepKey: k, text: 'a remark' }, a]),
  fc.tuple(key, actor).map(([k, a]): Intent => ['photo.attached', { stepKey: k, note: 'photo of the board' }, a]),
  fc.tuple(key, actor).map(([k, a]): Intent => ['plan.attached', { stepKey: k, summary: '25 mm cutter, 2 passes' }, a]),
  fc.tuple(key, actor, goodReason).map(([k, a, r]): Intent => ['hold.overridden', { stepKey: k, reason: r }, a]),
  fc.tuple(fc.option(key, { nil: undefined }), actor, fc.constantFrom('trainer', 'owner')).map(([k, a, role]): Intent =>
    ['signoff.given', k === undefined ? { signerId: a, signerRole: role } : { stepKey: k, signerId: a, signerRole: role }, a]),
  fc.tuple(fc.nat(60), actor).map(([i, a]): Noise => ['undo', i, a]),
  // Weighted towards what happens at a real machine: the undo button, and a lead hand
  // overriding the hold in front of the trainee.
  { arbitrary: fc.constant<Noise>(['undo-last']), weight: 3 },
  { arbitrary: fc.tuple(fc.constantFrom('gear', 'isolate'), fc.constantFrom(TRAINER, OWNER), goodReason)
    .map(([k, a, r]): Intent => ['hold.overridden', { stepKey: k, reason: r }, a]), weight: 2 },
  actor.map((a): Intent => ['run.finished', {}, a]),
  actor.map((a): Intent => ['run.abandoned', { reason: 'Machine fault, stopped for the day' }, a]),
)

interface Log { mode: 'guided' | 'solo', events: RunEvent[] }

// Either pure noise, or a correct run with noise mixed in. Times are whole seconds in a small
// window, so many events share a time and the id has to break the tie.
const log: fc.Arbitrary<Log> = fc.record({
  mode: fc.constantFrom('guided', 'solo') as fc.Arbitrary<'guided' | 'solo'>,
  withHappy: fc.boolean(),
  noise: fc.array(noise, { maxLength: 25 }),
  seed: fc.array(fc.nat(40), { minLength: 60, maxLength: 60 }),
}).map(({ mode, withHappy, noise: extra, seed }) => {
  const happy: Noise[] = withHappy ? (mode === 'guided' ? GUIDED_HAPPY : SOLO_HAPPY) : []
  const starter = mode === 'guided' ? TRAINEE : OPERATOR
  const items: Noise[] = []
  // Interleave: happy events keep their order, noise goes between them.
  let h = 0
  let n = 0
  while (h < happy.length || n < extra.length) {
    if (n >= extra.length || (h < happy.length && (seed[(h + n) % seed.length]! % 2 === 0))) items.push(happy[h++]!)
    else items.push(extra[n++]!)
  }
  const events: RunEvent[] = [ev('run.started', { procedureVersionId: 7, machineId: 2, mode }, { actor: starter, sec: 0 })]
  items.forEach((item, i) => {
    // Mostly in order, sometimes jumping back (a late device clock), often tying.
    const sec = Math.max(0, i + 1 - (seed[i % seed.length]! % 7 === 0 ? seed[(i + 1) % seed.length]! % 5 : 0))
    if (item[0] === 'undo-last') {
      const target = events.at(-1)!
      events.push(ev('event.undone', { targetId: target.id }, { actor: target.actorId, sec }))
    }
    else if (item[0] === 'undo') {
      const target = events[item[1] % events.length]!
      events.push(ev('event.undone', { targetId: target.id }, { actor: item[2], sec }))
    }
    else {
      const [type, payload, a] = item
      events.push(ev(type, (payload ?? {}) as never, { actor: a ?? starter, sec }))
    }
  })
  return { mode, events }
})

const foldAll = (events: RunEvent[]) => foldRun(STEPS, events, { roles: ROLES })

function assertNothingPastOpenHold(s: RunState) {
  const open = s.steps.find(x => x.kind === 'hold' && !x.holdCleared)
  if (!open) return
  for (const later of s.steps.slice(open.index + 1)) {
    expect(later.complete, `${later.key} complete past open hold ${open.key}`).toBe(false)
    expect(later.status).toBe('pending')
    expect(later.done).toBeNull()
    expect(later.acknowledged).toBeNull()
    expect(later.override).toBeNull()
    expect(later.signoff).toBeNull()
    expect(later.readings).toEqual([])
    expect(later.photos).toEqual([])
    expect(later.plans).toEqual([])
  }
  expect(s.status === 'finished').toBe(false)
}

const RUNS = { numRuns: 300 }

// Generous timeouts: the test machine is shared, and each property folds thousands of logs.
describe('fold properties', { timeout: 120_000 }, () => {
  it('no log, at any point of it, yields progress past a hold that is not cleared', () => {
    fc.assert(fc.property(log, ({ events }) => {
      const ordered = [...events].sort(compareEvents)
      for (let k = 1; k <= ordered.length; k++) assertNothingPastOpenHold(foldAll(ordered.slice(0, k)))
    }), { numRuns: 150 })
  })

  it('in guided mode nothing after a sign-off hold completes without a trainer\'s signature or an override', () => {
    fc.assert(fc.property(log, ({ mode, events }) => {
      const s = foldAll(events)
      if (mode !== 'guided') return
      const isolate = s.steps.find(x => x.key === 'isolate')!
      const laterDone = s.steps.slice(isolate.index + 1).some(x => x.complete)
      if (laterDone) {
        expect(isolate.signoff !== null || isolate.override !== null).toBe(true)
        if (isolate.signoff) expect(['trainer', 'owner']).toContain(ROLES[isolate.signoff.signerId])
      }
      if (s.status === 'finished') {
        const final = s.steps.at(-1)!
        expect(final.signoff).not.toBeNull()
        expect(final.signoff!.signerId).not.toBe(s.started!.actorId)
        expect(['trainer', 'owner']).toContain(ROLES[final.signoff!.signerId])
      }
    }), RUNS)
  })

  it('every override that took effect stays on the record, whatever is undone later', () => {
    fc.assert(fc.property(log, fc.array(actor, { minLength: 1, maxLength: 4 }), ({ events }, undoers) => {
      const ordered = [...events].sort(compareEvents)
      let previous: string[] = []
      let previousSignoffs: string[] = []
      for (let k = 1; k <= ordered.length; k++) {
        const s = foldAll(ordered.slice(0, k))
        const ids = s.overrides.map(o => o.eventId)
        expect(ids.slice(0, previous.length)).toEqual(previous)
        expect(s.signoffs.map(o => o.eventId).slice(0, previousSignoffs.length)).toEqual(previousSignoffs)
        previous = ids
        previousSignoffs = s.signoffs.map(o => o.eventId)
        expect(ids).toEqual(s.applied.filter(e => e.type === 'hold.overridden').map(e => e.id))
        for (const o of s.overrides) expect(s.steps.find(x => x.key === o.stepKey)!.status).toBe('overridden')
      }
      // Then everyone tries to undo everything, after the fact.
      const before = foldAll(events)
      const lastSec = (Math.max(...events.map(e => Date.parse(e.at))) - T0) / 1000
      const undos = before.applied.flatMap((t, i) => undoers.map((a, j) =>
        ev('event.undone', { targetId: t.id }, { actor: a, sec: lastSec + 1 + i + j / 10 })))
      const after = foldAll([...events, ...undos])
      expect(after.overrides).toEqual(before.overrides)
      expect(after.signoffs).toEqual(before.signoffs)
      for (const o of after.overrides) expect(after.holdsCleared[o.stepKey]).toBe(true)
    }), { numRuns: 100 })
  })

  it('the state depends only on the set of events, not the order they arrive in', () => {
    fc.assert(fc.property(log.chain(l => fc.tuple(fc.constant(l), fc.shuffledSubarray(l.events, { minLength: l.events.length, maxLength: l.events.length }))), ([{ events }, shuffled]) => {
      expect(foldAll(shuffled)).toEqual(foldAll(events))
    }), RUNS)
  })

  it('replaying any events again (a repeated sync) changes nothing', () => {
    fc.assert(fc.property(log.chain(l => fc.tuple(fc.constant(l), fc.subarray(l.events), fc.nat())), ([{ events }, again, cut]) => {
      const at = events.length === 0 ? 0 : cut % events.length
      const replayed = [...events.slice(0, at), ...again.map(e => ({ ...e })), ...events.slice(at), ...again]
      expect(foldAll(replayed)).toEqual(foldAll(events))
    }), RUNS)
  })

  it('every event is either applied or flagged, exactly once; none is dropped', () => {
    fc.assert(fc.property(log, ({ events }) => {
      const s = foldAll(events)
      const seen = [...s.applied.map(e => e.id), ...s.flagged.map(f => f.event.id)].sort()
      expect(seen).toEqual(events.map(e => e.id).sort())
    }), RUNS)
  })

  it('current step, completion and finishing agree with each other', () => {
    fc.assert(fc.property(log, ({ events }) => {
      const s = foldAll(events)
      const firstOpen = s.steps.findIndex(x => !x.complete)
      expect(s.currentStepIndex).toBe(firstOpen === -1 ? s.steps.length : firstOpen)
      expect(s.completedCount).toBe(s.steps.filter(x => x.complete).length)
      if (s.canFinish || s.status === 'finished') expect(s.steps.every(x => x.complete)).toBe(true)
      for (const v of s.values) if (v.outOfRange === null) expect(v.reasonOk).toBe(true)
      const thickness = s.steps.find(x => x.key === 'thickness')!
      if (thickness.done) expect(thickness.value?.reasonOk).toBe(true)
    }), RUNS)
  })
})
