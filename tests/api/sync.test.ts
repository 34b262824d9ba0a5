import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, otherShop } from './client'

// POST /api/sync against the real server and MariaDB: idempotent merge, per-event rejection,
// convergence of two tablets, and flags for events that went past an open hold.

const PROCEDURE = {
  title: 'Sync check procedure',
  summary: 'A short procedure with a hold, used by the sync checks.',
  category: 'daily',
  steps: [
    { key: 'prep', kind: 'instruction', title: 'Prepare the machine', body: 'Get the machine ready.' },
    { key: 'isolate', kind: 'hold', title: 'Isolate the power', body: 'Switch off and lock the isolator.', signalWord: 'WARNING', hazard: 'Unexpected start-up can injure hands near the cutter.', avoid: 'Lock the isolator off and prove nothing starts.' },
    { key: 'work', kind: 'instruction', title: 'Do the work', body: 'Do the work with the power off.' },
    { key: 'measure', kind: 'check', title: 'Measure the gap', body: 'Measure the gap.', label: 'Gap', unit: 'mm', min: 0, max: 1 },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The work is done and the machine is safe.' },
  ],
}

let versionId: number
let machineId: number
const ids: Record<string, number> = {}

const at = (minute: number) => new Date(Date.UTC(2026, 0, 5, 8, minute)).toISOString()
function ev(runId: string, actor: string, type: string, minute: number, extra: Record<string, unknown> = {}, device = 'tablet-a') {
  return { id: uuidv7(), runId, type, at: at(minute), actorId: ids[actor], deviceId: device, ...extra }
}
const sync = async (role: 'owner' | 'trainer' | 'operator' | 'trainee', events: unknown[], more: Record<string, unknown> = {}) =>
  call('POST', '/api/sync', { cookie: await as(role), body: { deviceId: 'tablet-a', events, ...more } })
const rowsOf = async (runId: string) => (await db().query<any[]>('select id, type, flag, actor_id, payload from run_events where run_id = ? order by id', [runId]))[0]

beforeAll(async () => {
  for (const role of ['owner', 'trainer', 'operator', 'trainee'] as const) {
    ids[role] = (await call('GET', '/api/me', { cookie: await as(role) })).body.user.id
  }
  const made = await call('POST', '/api/procedures', { cookie: await as('owner'), body: { procedure: PROCEDURE } })
  versionId = made.body.versionId
  machineId = (await call('GET', '/api/machines', { cookie: await as('owner') })).body[0].id
})
afterAll(async () => { await db().end() })

const start = (runId: string, actor: string, mode = 'guided', minute = 0) =>
  ev(runId, actor, 'run.started', minute, { procedureVersionId: versionId, machineId, mode })

describe('POST /api/sync', () => {
  it('stores a batch once however many times it is sent', async () => {
    const runId = uuidv7()
    const batch = [start(runId, 'trainee'), ev(runId, 'trainee', 'step.done', 1, { stepKey: 'prep' }), ev(runId, 'trainee', 'hold.acknowledged', 2, { stepKey: 'isolate' })]
    const answers = []
    for (let i = 0; i < 3; i++) answers.push(await sync('trainee', batch))
    for (const a of answers) {
      expect(a.status).toBe(200)
      expect(a.body.accepted.sort()).toEqual(batch.map(e => e.id).sort())
      expect(a.body.rejected).toEqual([])
    }
    const rows = await rowsOf(runId)
    expect(rows.map(r => r.id)).toEqual(batch.map(e => e.id).sort())
    const [[run]] = await db().query<any[]>('select status, current_step_key from runs where id = ?', [runId])
    expect(run).toMatchObject({ status: 'active', current_step_key: 'work' })
  })

  it('stores the good events of a batch and rejects the bad one with its reason', async () => {
    const runId = uuidv7()
    const bad = { ...ev(runId, 'operator', 'value.recorded', 2, { stepKey: 'measure', unit: 'mm' }), value: 'thin' }
    const good = [start(runId, 'operator'), ev(runId, 'operator', 'step.done', 1, { stepKey: 'prep' })]
    const res = await sync('operator', [...good, bad])
    expect(res.status).toBe(200)
    expect(res.body.accepted.sort()).toEqual(good.map(e => e.id).sort())
    expect(res.body.rejected).toEqual([{ id: bad.id, reason: expect.stringContaining('Value must be a number') }])
    expect((await rowsOf(runId)).map(r => r.id)).toEqual(good.map(e => e.id).sort())
  })

  it.each([
    ['a trainee overriding a hold', 'trainee', (r: string) => ev(r, 'trainee', 'hold.overridden', 3, { stepKey: 'isolate', reason: 'The isolator is broken, the trainer said go ahead.' }), 'Only a trainer or the owner may override a hold.'],
    ['an event made by somebody else', 'trainee', (r: string) => ev(r, 'operator', 'step.done', 3, { stepKey: 'prep' }), 'made by another person'],
    ['a sign-off without the signer\'s proof', 'trainee', (r: string) => ev(r, 'trainee', 'signoff.given', 3, { stepKey: 'sign', signerId: ids.trainer, signerRole: 'trainer' }), 'was not confirmed'],
    ['a sign-off with a forged seal', 'trainee', (r: string) => ev(r, 'trainee', 'signoff.given', 3, { stepKey: 'sign', signerId: ids.trainer, signerRole: 'trainer', seal: 'made-up' }), 'was not confirmed'],
    ['a clock far in the future', 'trainee', (r: string) => ({ ...ev(r, 'trainee', 'step.done', 3, { stepKey: 'prep' }), at: '2099-01-01T00:00:00.000Z' }), 'not believable'],
  ])('rejects %s', async (_what, role, make, reason) => {
    const runId = uuidv7()
    expect((await sync('trainee', [start(runId, 'trainee')])).body.accepted).toHaveLength(1)
    const bad = make(runId)
    const res = await sync(role as 'trainee', [bad])
    expect(res.body.rejected).toEqual([{ id: bad.id, reason: expect.stringContaining(reason) }])
    expect((await rowsOf(runId)).map(r => r.id)).not.toContain(bad.id)
  })

  it('refuses a solo start by a trainee and by an operator not qualified for the procedure', async () => {
    for (const role of ['trainee', 'operator'] as const) {
      const runId = uuidv7()
      const res = await sync(role, [start(runId, role, 'solo'), ev(runId, role, 'step.done', 1, { stepKey: 'prep' })])
      expect(res.body.accepted).toEqual([])
      expect(res.body.rejected[0].reason).toMatch(/always guided|not yet qualified/)
      expect(res.body.rejected[1].reason).toContain('Its run was not accepted')
    }
  })

  it('checks a run\'s start against the machine, the version and the procedure, each in this shop', async () => {
    const other = await otherShop()
    const shopId = (await db().query<any[]>('select shop_id from machines where id = ?', [machineId]))[0][0].shop_id
    const [retired] = await db().query<any>(
      'insert into machines (shop_id, name, travel_x_mm, travel_y_mm, travel_z_mm, units, spindle_kind, has_length_sensor, spoilboard_material, spoilboard_nominal_mm, spoilboard_min_mm, retired_at) values (?,?,?,?,?,?,?,?,?,?,?,now(3))',
      [shopId, 'Retired Sync Router', 600, 600, 100, 'mm', 'trim-router', 0, 'MDF', 18, 12],
    )
    const cases: [Record<string, unknown>, string][] = [
      [{ machineId: other.machineId }, 'No such machine in this shop.'],
      [{ machineId: retired.insertId }, 'That machine is retired.'],
      [{ procedureVersionId: other.versionId }, 'No such procedure version in this shop.'],
    ]
    for (const [change, reason] of cases) {
      const runId = uuidv7()
      const e = { ...start(runId, 'operator'), ...change }
      const res = await sync('operator', [e])
      expect(res.body.rejected, reason).toEqual([{ id: e.id, reason }])
      expect((await db().query<any[]>('select id from runs where id = ?', [runId]))[0]).toEqual([])
    }
  })

  it('refuses a start after its procedure was retired, and takes one a tablet made before', async () => {
    const made = await call('POST', '/api/procedures', { cookie: await as('owner'), body: { procedure: { ...PROCEDURE, title: 'Sync retire check' } } })
    const [[version]] = await db().query<any[]>('select procedure_id from procedure_versions where id = ?', [made.body.versionId])
    // Retired at 08:30 on the day the events claim
    await db().query('update procedures set retired_at = ? where id = ?', [new Date(at(30)), version.procedure_id])
    const before = uuidv7()
    const early = ev(before, 'operator', 'run.started', 10, { procedureVersionId: made.body.versionId, machineId, mode: 'guided' })
    const after = uuidv7()
    const late = ev(after, 'operator', 'run.started', 40, { procedureVersionId: made.body.versionId, machineId, mode: 'guided' })
    expect((await sync('operator', [early])).body.accepted).toEqual([early.id])
    expect((await sync('operator', [late])).body.rejected).toEqual([{ id: late.id, reason: 'This procedure was retired before the run started; it can no longer be run.' }])
  })

  it('answers "No such run" for another shop\'s run', async () => {
    const other = await otherShop()
    const e = ev(other.runId, 'owner', 'step.done', 1, { stepKey: 'prep' })
    const res = await sync('owner', [e])
    expect(res.body.rejected).toEqual([{ id: e.id, reason: 'No such run.' }])
  })

  it('keeps and flags a late event that went past an unacknowledged hold', async () => {
    const runId = uuidv7()
    // Tablet B marks "work" done at 08:03 while the hold was only acknowledged at 08:05 on tablet A.
    await sync('operator', [start(runId, 'operator'), ev(runId, 'operator', 'step.done', 1, { stepKey: 'prep' }), ev(runId, 'operator', 'hold.acknowledged', 5, { stepKey: 'isolate' })])
    const late = ev(runId, 'operator', 'step.done', 3, { stepKey: 'work' }, 'tablet-b')
    expect((await sync('operator', [late])).body.accepted).toEqual([late.id])
    const rows = await rowsOf(runId)
    expect(rows.find(r => r.id === late.id).flag).toBe('passed-unacknowledged-hold')
    const [[run]] = await db().query<any[]>('select current_step_key from runs where id = ?', [runId])
    expect(run.current_step_key).toBe('work')
  })

  it('brings two tablets that worked on one run offline to the same events', async () => {
    const runId = uuidv7()
    await sync('operator', [start(runId, 'operator')])
    const a = [ev(runId, 'operator', 'step.done', 1, { stepKey: 'prep' }, 'tablet-a'), ev(runId, 'operator', 'note.added', 2, { text: 'Dust shoe brush worn.' }, 'tablet-a')]
    const b = [ev(runId, 'operator', 'hold.acknowledged', 3, { stepKey: 'isolate' }, 'tablet-b'), ev(runId, 'operator', 'note.added', 4, { text: 'Collet nut cleaned.' }, 'tablet-b')]
    const resA = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: 'tablet-a', since: 0, events: a } })
    const resB = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: 'tablet-b', since: 0, events: b } })
    // B learns A's events at once; A learns B's at its next sync from its cursor.
    expect(resB.body.events.map((e: any) => e.id)).toEqual(expect.arrayContaining(a.map(e => e.id)))
    const resA2 = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: 'tablet-a', since: resA.body.cursor, watch: [runId], events: [] } })
    expect(resA2.body.events.map((e: any) => e.id).sort()).toEqual(b.map(e => e.id).sort())
    const full = await call('GET', `/api/runs/${runId}`, { cookie: await as('operator') })
    expect(full.body.events).toHaveLength(5)
    expect(full.body.run.currentStepKey).toBe('work')
  })

  it('refuses an event whose id another run already holds, and stores the rest of the new run', async () => {
    const first = uuidv7()
    const taken = ev(first, 'operator', 'step.done', 1, { stepKey: 'prep' })
    await sync('operator', [start(first, 'operator'), taken])
    // A new run whose batch reuses that id: the run and its other events are stored
    const runId = uuidv7()
    const good = [start(runId, 'operator', 'guided', 10), ev(runId, 'operator', 'note.added', 11, { text: 'Dust shoe fitted.' })]
    const clash = { ...ev(runId, 'operator', 'step.done', 12, { stepKey: 'prep' }), id: taken.id }
    const res = await sync('operator', [...good, clash])
    expect(res.body.rejected).toEqual([{ id: taken.id, reason: 'That event id is already used by another event.' }])
    expect(res.body.accepted.sort()).toEqual(good.map(e => e.id).sort())
    expect((await rowsOf(runId)).map(r => r.id)).toEqual(good.map(e => e.id).sort())
    // The first run still holds its own event, unchanged
    const firstRows = await rowsOf(first)
    expect(firstRows.find(r => r.id === taken.id)).toMatchObject({ type: 'step.done' })
    const [[run]] = await db().query<any[]>('select current_step_key from runs where id = ?', [runId])
    expect(run.current_step_key).toBe('prep')
  })

  it('stores a new run once when two tablets send it at the same moment', async () => {
    const runId = uuidv7()
    const batch = [start(runId, 'operator'), ev(runId, 'operator', 'step.done', 1, { stepKey: 'prep' }), ev(runId, 'operator', 'note.added', 2, { text: 'Spindle warmed up.' })]
    const answers = await Promise.all([sync('operator', batch), sync('operator', batch), sync('operator', batch)])
    for (const a of answers) {
      expect(a.body.rejected).toEqual([])
      expect(a.body.accepted.sort()).toEqual(batch.map(e => e.id).sort())
    }
    expect((await rowsOf(runId)).map(r => r.id)).toEqual(batch.map(e => e.id).sort())
    const [[run]] = await db().query<any[]>('select status, current_step_key from runs where id = ?', [runId])
    expect(run).toMatchObject({ status: 'active', current_step_key: 'isolate' })
  })

  it('gives a new run\'s cursor as its newest stored event, and nothing of another shop\'s watched run', async () => {
    const other = await otherShop()
    await db().query('insert into run_events (id, shop_id, run_id, type, actor_id, device_id, at, payload) select ?, ?, ?, \'note.added\', started_by, \'x\', now(3), \'{"text":"Not yours."}\' from runs where id = ?', [uuidv7(), other.shopId, other.runId, other.runId])
    const runId = uuidv7()
    const batch = [start(runId, 'operator'), ev(runId, 'operator', 'note.added', 1, { text: 'Chips cleared.' })]
    const res = await sync('operator', batch, { since: 0, watch: [other.runId] })
    expect(res.body.accepted).toHaveLength(2)
    // The tablet's own events are not sent back to it; the other shop's never are
    expect(res.body.events).toEqual([])
    const [[top]] = await db().query<any[]>('select max(seq) as seq from run_events where run_id = ?', [runId])
    expect(res.body.cursor).toBe(top.seq)
    // Watching only the other shop's run moves nothing
    const only = await sync('operator', [], { since: 0, watch: [other.runId] })
    expect(only.body).toMatchObject({ events: [], cursor: 0 })
  })

  it('answers 400 naming the field for a malformed body, and refuses more than 500 events', async () => {
    const res = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: '', events: 'none' } })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: any) => i.path)).toEqual(expect.arrayContaining(['deviceId', 'events']))
    const many = Array.from({ length: 501 }, () => ({ id: 'x' }))
    const big = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: 'a', events: many } })
    expect(big.status).toBe(400)
    expect(big.body.message).toContain('at most 500')
    // An event that is not an object (a list, a number, null) is named by its place in the list
    for (const bad of [[], 7, null, 'run.started']) {
      const one = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: 'a', events: [{ id: 'x' }, bad] } })
      expect(one.status, JSON.stringify(bad)).toBe(400)
      expect(one.body.data.issues).toContainEqual(expect.objectContaining({ path: 'events.1', message: 'Each event must be an object.' }))
    }
  })
})

describe('when MariaDB refuses a write', () => {
  // Triggers of this test's own stand in for a database that refuses one row (a full disk, a
  // constraint added later); each matches only this test's rows, so other tests are untouched.
  const trigger = async (name: string, body: string) => {
    await db().query(`drop trigger if exists ${name}`)
    await db().query(body)
  }

  it('rejects only the event it refuses, with a reason, and stores the rest of the run', async () => {
    const runId = uuidv7()
    const marker = `refuse ${runId}`
    await trigger('jogwise_test_refuse_event', `create trigger jogwise_test_refuse_event before insert on run_events for each row
      if json_value(new.payload, '$.text') = '${marker}' then signal sqlstate '45000' set message_text = 'refused by the test'; end if`)
    try {
      const bad = ev(runId, 'operator', 'note.added', 2, { text: marker })
      const batch = [start(runId, 'operator'), ev(runId, 'operator', 'note.added', 1, { text: 'first' }), bad, ev(runId, 'operator', 'note.added', 3, { text: 'third' })]
      const res = await sync('operator', batch)
      expect(res.status, res.text).toBe(200)
      expect(res.body.rejected).toEqual([{ id: bad.id, reason: expect.stringContaining('the database refused it') }])
      expect(res.body.rejected[0].reason).not.toContain('refused by the test')
      expect(res.body.accepted.sort()).toEqual(batch.filter(e => e !== bad).map(e => e.id).sort())
      expect((await rowsOf(runId)).map((r: any) => r.type).sort()).toEqual(['note.added', 'note.added', 'run.started'])
    }
    finally {
      await db().query('drop trigger if exists jogwise_test_refuse_event')
    }
  })

  it('stores nothing of a run that cannot be stored at all, says why for each event, and takes the same run once it can', async () => {
    const runId = uuidv7()
    // The run's summary is written after its events: a refusal there undoes the events too.
    await trigger('jogwise_test_refuse_run', `create trigger jogwise_test_refuse_run before update on runs for each row
      if new.id = '${runId}' then signal sqlstate '45000' set message_text = 'refused by the test'; end if`)
    const batch = [start(runId, 'operator'), ev(runId, 'operator', 'note.added', 1, { text: 'kept on the tablet' })]
    try {
      const res = await sync('operator', batch)
      expect(res.status, res.text).toBe(200)
      expect(res.body.accepted).toEqual([])
      expect(res.body.rejected.map((r: any) => r.id).sort()).toEqual(batch.map(e => e.id).sort())
      for (const r of res.body.rejected) expect(r.reason).toContain('stays on this tablet')
      expect(await rowsOf(runId)).toEqual([])
      const [runs] = await db().query<any[]>('select id from runs where id = ?', [runId])
      expect(runs).toEqual([])
    }
    finally {
      await db().query('drop trigger if exists jogwise_test_refuse_run')
    }
    // The tablet sends the same events again later: stored whole.
    const again = await sync('operator', batch)
    expect(again.body.accepted.sort()).toEqual(batch.map(e => e.id).sort())
    expect(await rowsOf(runId)).toHaveLength(2)
  })
})

describe('a batch that starts its run, sent in few round trips', () => {
  it('stores text with quotes, semicolons and backslashes as written, and nothing else runs', async () => {
    // Such a batch goes to MariaDB as several statements at once (server/utils/sync.ts,
    // storeStartedRun): text that looks like SQL must stay text.
    const runId = uuidv7()
    const texts = [
      'Nut \'tight\'; drop table runs; --',
      'Back\\slash \\\'; insert into runs (id) values (\'x\'); #',
      '"; commit; rollback; select 1; /* */',
    ]
    const batch = [start(runId, 'operator'), ...texts.map((text, i) => ev(runId, 'operator', 'note.added', i + 1, { text }))]
    const res = await sync('operator', batch)
    expect(res.body.rejected).toEqual([])
    expect(res.body.accepted).toHaveLength(batch.length)
    const rows = await rowsOf(runId)
    const stored = rows.filter(r => r.type === 'note.added').map(r => (typeof r.payload === 'string' ? JSON.parse(r.payload) : r.payload).text)
    expect(stored.sort()).toEqual([...texts].sort())
    const [[runs]] = await db().query<any[]>('select count(*) as n from runs where id in (?, \'x\')', [runId])
    expect(Number(runs.n)).toBe(1)
  })

  it('leaves no half-done transaction behind when the last statements are refused', async () => {
    const runId = uuidv7()
    // The Ledger's entries go with the COMMIT: refusing the hold's entry refuses that whole
    // transaction; the batch is then stored the careful way, event by event, without the hold.
    await db().query('drop trigger if exists jogwise_test_refuse_ledger')
    await db().query(`create trigger jogwise_test_refuse_ledger before insert on ledger_entries for each row
      if new.run_id = '${runId}' then signal sqlstate '45000' set message_text = 'refused by the test'; end if`)
    const kept = [start(runId, 'operator'), ev(runId, 'operator', 'step.done', 1, { stepKey: 'prep' })]
    // (an acknowledged hold is a Ledger entry)
    const hold = ev(runId, 'operator', 'hold.acknowledged', 2, { stepKey: 'isolate' })
    try {
      const res = await sync('operator', [...kept, hold])
      expect(res.body.accepted.sort()).toEqual(kept.map(e => e.id).sort())
      expect(res.body.rejected).toEqual([{ id: hold.id, reason: expect.stringContaining('stays on this tablet') }])
    }
    finally {
      await db().query('drop trigger if exists jogwise_test_refuse_ledger')
    }
    // Runs started on the same connections afterwards must not carry the refused transaction in with them
    for (let i = 0; i < 4; i++) {
      const other = uuidv7()
      expect((await sync('operator', [start(other, 'operator', 'guided', 20 + i)])).body.accepted).toHaveLength(1)
    }
    expect((await rowsOf(runId)).map(r => r.id)).toEqual(kept.map(e => e.id).sort())
    const [entries] = await db().query<any[]>('select kind from ledger_entries where run_id = ?', [runId])
    expect(entries).toEqual([])
  })
})

describe('withdrawing a run started by mistake', () => {
  it('is stored as withdrawn with no reason while nothing is done, and listed as withdrawn', async () => {
    const runId = uuidv7()
    const res = await sync('operator', [start(runId, 'operator'), ev(runId, 'operator', 'run.withdrawn', 1)])
    expect(res.status, res.text).toBe(200)
    expect(res.body.rejected).toEqual([])
    const [[row]] = await db().query<any[]>('select status, finished_at from runs where id = ?', [runId])
    expect(row.status).toBe('withdrawn')
    expect(row.finished_at).not.toBeNull()
    const list = await call('GET', `/api/ledger/runs?status=withdrawn&machineId=${machineId}&pageSize=100`, { cookie: await as('owner') })
    expect(list.status, list.text).toBe(200)
    expect(list.body.rows.find((r: any) => r.id === runId)?.status).toBe('withdrawn')
  })

  it('does not count once work is on the record: the run stays active and the event is flagged', async () => {
    const runId = uuidv7()
    await sync('operator', [start(runId, 'operator'), ev(runId, 'operator', 'step.done', 1, { stepKey: 'prep' })])
    const late = ev(runId, 'operator', 'run.withdrawn', 2)
    const res = await sync('operator', [late])
    expect(res.status, res.text).toBe(200)
    const [[row]] = await db().query<any[]>('select status from runs where id = ?', [runId])
    expect(row.status).toBe('active')
    expect((await rowsOf(runId)).find((r: any) => r.id === late.id)?.flag).toBe('withdraw-after-work')
  })
})
