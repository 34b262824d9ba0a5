import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db } from './client'
import { deliveredMail } from './mail'
import { seal } from './seal'

// Sealed sign-offs (issue 18 High 1, issue 11) and who may act on a run (issue 18 High 3),
// through the real server and MariaDB. The demo trainer's PIN is 2468 (server/utils/demo-shop.ts).

const PROCEDURE = {
  title: 'Sign-off binding procedure',
  summary: 'Two signed holds and a final sign-off, used by the sign-off checks.',
  category: 'daily',
  steps: [
    { key: 'prep', kind: 'instruction', title: 'Prepare the machine', body: 'Get the machine ready.' },
    { key: 'isolate', kind: 'hold', title: 'Isolate the power', body: 'Switch off and lock the isolator.', signalWord: 'WARNING', hazard: 'Unexpected start-up can injure hands near the cutter.', avoid: 'Lock the isolator off and prove nothing starts.', needsTrainerSignoff: true },
    { key: 'guard', kind: 'hold', title: 'Fit the guard', body: 'Fit the cutter guard.', signalWord: 'CAUTION', hazard: 'Chips fly from an unguarded cutter.', avoid: 'Fit the guard before starting.', needsTrainerSignoff: true },
    { key: 'work', kind: 'instruction', title: 'Do the work', body: 'Do the work with the power off.' },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The work is done and the machine is safe.' },
  ],
}

let versionId: number
let machineId: number
const ids: Record<string, number> = {}
const stamp = Date.now()

function ev(runId: string, actor: string, type: string, at: Date, extra: Record<string, unknown> = {}) {
  return { id: uuidv7(), runId, type, at: at.toISOString(), actorId: ids[actor], deviceId: 'tablet-s', ...extra }
}
const sync = async (role: 'owner' | 'trainer' | 'operator' | 'trainee', events: unknown[]) =>
  call('POST', '/api/sync', { cookie: await as(role), body: { deviceId: 'tablet-s', events } })
const rowsOf = async (runId: string) => (await db().query<any[]>('select id, type, flag, actor_id, payload from run_events where run_id = ? order by at, id', [runId]))[0]
const ago = (minutes: number) => new Date(Date.now() - minutes * 60_000)

/** A guided trainee run with the first hold acknowledged, `minutes` ago. */
async function runAtSignoff(minutes = 5, role: 'trainee' | 'operator' = 'trainee') {
  const runId = uuidv7()
  const res = await sync(role, [
    ev(runId, role, 'run.started', ago(minutes), { procedureVersionId: versionId, machineId, mode: 'guided' }),
    ev(runId, role, 'step.done', ago(minutes - 0.5), { stepKey: 'prep' }),
    ev(runId, role, 'hold.acknowledged', ago(minutes - 1), { stepKey: 'isolate' }),
  ])
  expect(res.body.rejected, res.text).toEqual([])
  return runId
}

/** A trainee's sign-off event for `stepKey`, sealed with `secret`, made at `at`. */
async function signoff(runId: string, stepKey: string | null, at: Date, secret: { pin?: string, password?: string }, signer = ids.trainer!, claimAt = at) {
  const e = ev(runId, 'trainee', 'signoff.given', at, { ...(stepKey ? { stepKey } : {}), signerId: signer, signerRole: 'trainer' })
  const sealed = await seal(await as('trainee'), { runId, stepKey, signerId: signer, eventId: e.id, time: claimAt.toISOString(), ...secret })
  return { ...e, seal: sealed }
}

beforeAll(async () => {
  for (const role of ['owner', 'trainer', 'operator', 'trainee'] as const) {
    ids[role] = (await call('GET', '/api/me', { cookie: await as(role) })).body.user.id
  }
  const made = await call('POST', '/api/procedures', { cookie: await as('owner'), body: { procedure: PROCEDURE } })
  versionId = made.body.versionId
  machineId = (await call('GET', '/api/machines', { cookie: await as('owner') })).body[0].id
})
afterAll(async () => {
  await db().query('delete from sign_in_failures where email like ?', ['signoff:%'])
  await db().end()
})

describe('sealed sign-offs at merge', () => {
  it('accepts a sign-off sealed with the trainer\'s PIN, stores the verdict and never the seal', async () => {
    const runId = await runAtSignoff()
    const signed = await signoff(runId, 'isolate', ago(3), { pin: '2468' })
    const res = await sync('trainee', [signed])
    expect(res.body.accepted).toEqual([signed.id])
    // The tablet gets its own event back with the verdict in place of the seal
    const back = res.body.events.find((e: any) => e.id === signed.id)
    expect(back).toMatchObject({ verdict: { status: 'verified' }, flag: null })
    expect(back.seal).toBeUndefined()
    const row = (await rowsOf(runId)).find(r => r.id === signed.id)
    expect(row.payload).toEqual({ stepKey: 'isolate', signerId: ids.trainer, signerRole: 'trainer', verdict: { status: 'verified' } })
    expect(JSON.stringify(row.payload)).not.toContain('2468')
  })

  it('verifies a sign-off sealed offline hours before it reaches the server', async () => {
    // issue 11: the tablet was offline for 5 hours; the seal is checked when the queue arrives.
    const runId = await runAtSignoff(300)
    const signed = await signoff(runId, 'isolate', ago(298), { pin: '2468' })
    const res = await sync('trainee', [signed])
    expect(res.body.accepted).toEqual([signed.id])
    expect((await rowsOf(runId)).find(r => r.id === signed.id).payload.verdict).toEqual({ status: 'verified' })
  })

  it('refuses a reused signature: the same seal on the next sign-off', async () => {
    const runId = await runAtSignoff()
    const first = await signoff(runId, 'isolate', ago(3), { pin: '2468' })
    expect((await sync('trainee', [first])).body.accepted).toEqual([first.id])
    // The trainee keeps the seal and puts it on the final sign-off (issue 18's reproduction)
    const again = { ...ev(runId, 'trainee', 'signoff.given', ago(2), { stepKey: 'sign', signerId: ids.trainer, signerRole: 'trainer' }), seal: first.seal }
    const res = await sync('trainee', [again])
    expect(res.body.rejected).toEqual([{ id: again.id, reason: expect.stringMatching(/another sign-off|already used/) }])
    expect((await rowsOf(runId)).map(r => r.id)).not.toContain(again.id)
  })

  it('refuses a second event carrying the same nonce, even when bound to it', async () => {
    const runId = await runAtSignoff()
    const nonce = 'reused-nonce-' + String(stamp).padStart(13, '0')
    const a = ev(runId, 'trainee', 'signoff.given', ago(3), { stepKey: 'isolate', signerId: ids.trainer, signerRole: 'trainer' })
    const sa = await seal(await as('trainee'), { runId, stepKey: 'isolate', signerId: ids.trainer!, eventId: a.id, time: a.at, pin: '2468', nonce })
    expect((await sync('trainee', [{ ...a, seal: sa }])).body.accepted).toEqual([a.id])
    await sync('trainee', [ev(runId, 'trainee', 'hold.acknowledged', ago(2.5), { stepKey: 'guard' })])
    const b = ev(runId, 'trainee', 'signoff.given', ago(2), { stepKey: 'guard', signerId: ids.trainer, signerRole: 'trainer' })
    const sb = await seal(await as('trainee'), { runId, stepKey: 'guard', signerId: ids.trainer!, eventId: b.id, time: b.at, pin: '2468', nonce })
    const res = await sync('trainee', [{ ...b, seal: sb }])
    expect(res.body.rejected).toEqual([{ id: b.id, reason: expect.stringContaining('already used once') }])
  })

  it('refuses an expired signature', async () => {
    // Made 73 hours ago: past the 72-hour lifetime (shared/runs/signoff-seal.ts)
    const runId = await runAtSignoff(73 * 60 + 5)
    const signed = await signoff(runId, 'isolate', ago(73 * 60), { pin: '2468' })
    const res = await sync('trainee', [signed])
    expect(res.body.rejected).toEqual([{ id: signed.id, reason: expect.stringContaining('The signature expired') }])
  })

  it('refuses a signature made for another step', async () => {
    const runId = await runAtSignoff()
    const e = ev(runId, 'trainee', 'signoff.given', ago(3), { stepKey: 'isolate', signerId: ids.trainer, signerRole: 'trainer' })
    const forGuard = await seal(await as('trainee'), { runId, stepKey: 'guard', signerId: ids.trainer!, eventId: e.id, time: e.at, pin: '2468' })
    const res = await sync('trainee', [{ ...e, seal: forGuard }])
    expect(res.body.rejected).toEqual([{ id: e.id, reason: 'The signature was given for step "guard", not for this one.' }])
  })

  it('refuses a sign-off with no seal or a made-up one', async () => {
    const runId = await runAtSignoff()
    const none = ev(runId, 'trainee', 'signoff.given', ago(3), { stepKey: 'isolate', signerId: ids.trainer, signerRole: 'trainer' })
    const madeUp = { ...ev(runId, 'trainee', 'signoff.given', ago(3), { stepKey: 'isolate', signerId: ids.trainer, signerRole: 'trainer' }), seal: 'js1.x.aaaa.bbbb.cccc' }
    const forged = { ...ev(runId, 'trainee', 'step.done', ago(3), { stepKey: 'work' }), verdict: { status: 'verified' } }
    const res = await sync('trainee', [none, madeUp])
    expect(res.body.rejected.map((r: any) => r.reason)).toEqual([expect.stringContaining('was not confirmed'), expect.stringContaining('another server key')])
    // A verdict written by the tablet is dropped: the server's own decides
    await sync('trainee', [forged])
    expect((await rowsOf(runId)).find(r => r.id === forged.id).payload.verdict).toBeUndefined()
  })

  it('a wrong PIN sealed offline is stored but not counted: the run is flagged, the Ledger has it, the owner gets mail', async () => {
    const runId = await runAtSignoff(20)
    const signed = await signoff(runId, 'isolate', ago(18), { pin: '1357' })
    const after = ev(runId, 'trainee', 'hold.acknowledged', ago(17), { stepKey: 'guard' })
    const res = await sync('trainee', [signed, after])
    expect(res.body.accepted.sort()).toEqual([signed.id, after.id].sort())
    const rows = await rowsOf(runId)
    expect(rows.find(r => r.id === signed.id)).toMatchObject({ flag: 'signoff-failed', payload: { verdict: { status: 'refused', code: 'signoff-failed' } } })
    expect(rows.find(r => r.id === after.id).flag).toBe('passed-unsigned-hold')
    const [entries] = await db().query<any[]>('select kind, actor_id, step_key, detail from ledger_entries where run_id = ? order by kind', [runId])
    // The exception kinds (every acknowledgement and sign-off is an entry of its own kind too)
    const exceptions = entries.filter(e => e.kind === 'late-past-hold' || e.kind === 'signoff-failed')
    expect(exceptions.map(e => e.kind)).toEqual(['late-past-hold', 'signoff-failed'])
    expect(exceptions[1]).toMatchObject({ actor_id: ids.trainee, step_key: 'isolate' })
    expect(exceptions[1].detail.reason).toContain('That PIN is not')
    const listed = await call('GET', '/api/ledger?kind=signoff-failed', { cookie: await as('owner') })
    expect(listed.status).toBe(200)
    expect(listed.body.rows.filter((r: any) => r.runId === runId).map((r: any) => r.kind)).toEqual(['signoff-failed'])
    // The owner's alert, through the outbox to the fake mail server
    const { mail } = await deliveredMail(`signoff-failed:${signed.id}:${ids.owner}`, 30_000)
    expect(mail.subject).toMatch(/^Sign-off failed its check on /)
    expect(mail.text).toContain('That PIN is not')
    expect(mail.text).toContain(`/runs/${runId}/record`)
  })
})

describe('POST /api/runs/:id/signoff-check', () => {
  it('answers at once online: a wrong PIN is 403, the right one 200, and neither uses the nonce up', async () => {
    const runId = await runAtSignoff()
    const cookie = await as('trainee')
    const e = ev(runId, 'trainee', 'signoff.given', new Date(), { stepKey: 'isolate', signerId: ids.trainer, signerRole: 'trainer' })
    const wrong = await call('POST', `/api/runs/${runId}/signoff-check`, { cookie, body: { seal: await seal(cookie, { runId, stepKey: 'isolate', signerId: ids.trainer!, eventId: e.id, time: e.at, pin: '0000' }) } })
    expect(wrong.status).toBe(403)
    expect(wrong.body.data.issues).toEqual([{ path: 'pin', message: expect.stringContaining('is not') }])
    const right = await seal(cookie, { runId, stepKey: 'isolate', signerId: ids.trainer!, eventId: e.id, time: e.at, pin: '2468' })
    const ok = await call('POST', `/api/runs/${runId}/signoff-check`, { cookie, body: { seal: right } })
    expect(ok.status).toBe(200)
    expect(ok.body).toMatchObject({ signerId: ids.trainer, signerRole: 'trainer' })
    expect((await sync('trainee', [{ ...e, seal: right }])).body.accepted).toEqual([e.id])
  })

  it('seals the claim itself for a page without WebCrypto, after checking the PIN', async () => {
    const runId = await runAtSignoff()
    const cookie = await as('trainee')
    const e = ev(runId, 'trainee', 'signoff.given', new Date(), { stepKey: 'isolate', signerId: ids.trainer, signerRole: 'trainer' })
    const claim = { stepKey: 'isolate', signerId: ids.trainer, eventId: e.id, time: e.at }
    const wrong = await call('POST', `/api/runs/${runId}/signoff-check`, { cookie, body: { claim: { ...claim, pin: '0000' } } })
    expect(wrong.status).toBe(403)
    const bad = await call('POST', `/api/runs/${runId}/signoff-check`, { cookie, body: { claim: { ...claim, pin: '12' } } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues).toEqual([{ path: 'claim.pin', message: 'A PIN is 4 to 8 digits.' }])
    const ok = await call('POST', `/api/runs/${runId}/signoff-check`, { cookie, body: { claim: { ...claim, pin: '2468' } } })
    expect(ok.status).toBe(200)
    expect(ok.body.seal).toMatch(/^js1\./)
    expect((await sync('trainee', [{ ...e, seal: ok.body.seal }])).body.accepted).toEqual([e.id])
  })

  it('refuses a stale seal and a seal for another run with a 400 naming the field', async () => {
    const runId = await runAtSignoff()
    const cookie = await as('trainee')
    const old = await seal(cookie, { runId, stepKey: 'isolate', signerId: ids.trainer!, eventId: uuidv7(), time: ago(30).toISOString(), pin: '2468' })
    const stale = await call('POST', `/api/runs/${runId}/signoff-check`, { cookie, body: { seal: old } })
    expect(stale.status).toBe(400)
    expect(stale.body.data.issues[0]).toEqual({ path: 'seal', message: expect.stringContaining('expired') })
    const other = await runAtSignoff()
    const wrongRun = await call('POST', `/api/runs/${other}/signoff-check`, { cookie, body: { seal: old } })
    expect(wrongRun.body.data.issues[0]).toEqual({ path: 'seal', message: 'The signature was given for another run.' })
  })
})

describe('who may act on a run', () => {
  it('keeps a trainee\'s events in a trainer\'s solo run on the record but does not count them', async () => {
    const runId = uuidv7()
    expect((await sync('trainer', [ev(runId, 'trainer', 'run.started', ago(10), { procedureVersionId: versionId, machineId, mode: 'solo' }), ev(runId, 'trainer', 'step.done', ago(9), { stepKey: 'prep' })])).body.accepted).toHaveLength(2)
    const trainee = [
      ev(runId, 'trainee', 'hold.acknowledged', ago(8), { stepKey: 'isolate' }),
      ev(runId, 'trainee', 'hold.acknowledged', ago(7), { stepKey: 'guard' }),
      ev(runId, 'trainee', 'step.done', ago(6), { stepKey: 'work' }),
      ev(runId, 'trainee', 'step.done', ago(5), { stepKey: 'sign' }),
      ev(runId, 'trainee', 'run.finished', ago(4)),
    ]
    const res = await sync('trainee', trainee)
    expect(res.body.accepted).toHaveLength(5)
    const rows = await rowsOf(runId)
    for (const e of trainee) {
      const row = rows.find(r => r.id === e.id)
      expect(row.flag).toBe('actor-not-allowed')
      expect(row.payload.verdict.reason).toMatch(/is not on this run|trainee and may not act in a solo run/)
    }
    const [[run]] = await db().query<any[]>('select status, current_step_key from runs where id = ?', [runId])
    expect(run).toEqual({ status: 'active', current_step_key: 'isolate' })
  })

  it('lets the person a run was handed to act, and still refuses a trainee in a solo run', async () => {
    const runId = uuidv7()
    await sync('trainer', [ev(runId, 'trainer', 'run.started', ago(10), { procedureVersionId: versionId, machineId, mode: 'solo' })])
    const handTrainee = ev(runId, 'trainer', 'run.handed-over', ago(9), { toUserId: ids.trainee })
    expect((await sync('trainer', [handTrainee])).body.accepted).toEqual([handTrainee.id])
    const byTrainee = ev(runId, 'trainee', 'step.done', ago(8), { stepKey: 'prep' })
    await sync('trainee', [byTrainee])
    expect((await rowsOf(runId)).find(r => r.id === byTrainee.id).payload.verdict.reason).toContain('trainee and may not act in a solo run')

    // A guided run of the trainee, handed to an operator: the operator's work counts
    const guided = await runAtSignoff(10)
    const stranger = ev(guided, 'operator', 'note.added', ago(8), { text: 'Operator note before the hand-over.' })
    await sync('operator', [stranger])
    expect((await rowsOf(guided)).find(r => r.id === stranger.id).flag).toBe('actor-not-allowed')
    const hand = ev(guided, 'trainee', 'run.handed-over', ago(7), { toUserId: ids.operator })
    expect((await sync('trainee', [hand])).body.accepted).toEqual([hand.id])
    const note = ev(guided, 'operator', 'note.added', ago(6), { text: 'Operator took over at shift change.' })
    expect((await sync('operator', [note])).body.accepted).toEqual([note.id])
    expect((await rowsOf(guided)).find(r => r.id === note.id).flag).toBeNull()
  })
})
