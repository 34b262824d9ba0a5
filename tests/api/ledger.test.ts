import { parse } from 'csv-parse/sync'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, otherShop } from './client'

// The Ledger against the real server and MariaDB: entries written by the sync merge for an
// override, a reading out of range, an event past an open hold and a skipped check (and taken
// away by undo), filters, paging and totals counted straight from the table, another shop's
// entries never shown, bad filters refused, and the CSV export read back with csv-parse (the
// same node-csv project as the csv-stringify the server writes with) equal to the table's rows.

const PROCEDURE = {
  title: `Ledger check procedure ${Date.now()}`,
  summary: 'A short procedure with a hold and a measured check, used by the Ledger checks.',
  category: 'maintenance',
  steps: [
    { key: 'prep', kind: 'instruction', title: 'Prepare the machine', body: 'Get the machine ready.' },
    { key: 'isolate', kind: 'hold', title: 'Isolate the power', body: 'Switch off and lock the isolator.', signalWord: 'WARNING', hazard: 'Unexpected start-up can injure hands near the cutter.', avoid: 'Lock the isolator off and prove nothing starts.' },
    { key: 'work', kind: 'instruction', title: 'Do the work', body: 'Do the work with the power off.' },
    { key: 'measure', kind: 'check', title: 'Measure the runout', body: 'Measure the runout at the collet.', label: 'Runout', unit: 'mm', min: 0, max: 0.05 },
    { key: 'tidy', kind: 'instruction', title: 'Tidy the bed', body: 'Put the clamps away.' },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The work is done and the machine is safe.' },
  ],
}

const ids: Record<string, number> = {}
let versionId: number
let procedureId: number
let machineId: number
let other: Awaited<ReturnType<typeof otherShop>>

// Events on 12 January 2026, one minute apart per run (a fixed day, so date filters are exact).
const at = (day: number, minute: number) => new Date(Date.UTC(2026, 0, day, 8, minute)).toISOString()
function ev(runId: string, actor: string, type: string, day: number, minute: number, extra: Record<string, unknown> = {}) {
  return { id: uuidv7(), runId, type, at: at(day, minute), actorId: ids[actor], deviceId: 'ledger-tablet', ...extra }
}
const sync = async (role: 'owner' | 'trainer' | 'operator', events: unknown[]) => {
  const res = await call('POST', '/api/sync', { cookie: await as(role), body: { deviceId: 'ledger-tablet', events } })
  expect(res.status, res.text).toBe(200)
  expect(res.body.rejected, res.text).toEqual([])
  return res
}
// The trainer runs solo; the operator is not qualified for this new procedure, so runs guided
// (its hold needs no trainer's signature, so acknowledging it is enough).
const start = (runId: string, actor: string, day: number) => ev(runId, actor, 'run.started', day, 0, { procedureVersionId: versionId, machineId, mode: actor === 'operator' ? 'guided' : 'solo' })
const ledger = async (query: Record<string, string | number>, role: 'owner' | 'trainer' = 'owner') =>
  call('GET', `/api/ledger?${new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]))}`, { cookie: await as(role) })
const entriesOf = async (runId: string) => (await db().query<any[]>('select kind, step_key, event_id, actor_id from ledger_entries where run_id = ? order by at, kind', [runId]))[0]

beforeAll(async () => {
  for (const role of ['owner', 'trainer', 'operator', 'trainee'] as const) ids[role] = (await call('GET', '/api/me', { cookie: await as(role) })).body.user.id
  const owner = await as('owner')
  const made = await call('POST', '/api/procedures', { cookie: owner, body: { procedure: PROCEDURE } })
  expect(made.status, made.text).toBe(201)
  versionId = made.body.versionId
  procedureId = made.body.id
  // A machine of its own, so the machine filter isolates this file's entries.
  const machine = await call('POST', '/api/machines', { cookie: owner, body: {
    name: `Ledger Router ${Date.now()}`, travelXMm: 600, travelYMm: 400, travelZMm: 80, units: 'mm',
    spindleKind: 'air-spindle', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
  } })
  expect(machine.status, machine.text).toBe(201)
  machineId = machine.body.id
  other = await otherShop()
  // One entry of the other shop on the same day, which must never show here.
  const [[otherOwner]] = await db().query<any[]>('select id from users where shop_id = ? limit 1', [other.shopId])
  await db().query('insert into ledger_entries (shop_id, event_id, run_id, kind, actor_id, machine_id, procedure_id, step_key, at, detail) values (?,?,?,?,?,?,?,?,?,?)', [
    other.shopId, uuidv7(), other.runId, 'override', otherOwner.id, other.machineId, other.procedureId, 'x', new Date(at(12, 30)), JSON.stringify({ reason: 'other-shop-marker' }),
  ])
})
afterAll(async () => { await db().end() })

describe('entries written by the sync merge', () => {
  it('an override the fold accepted is an override entry with its reason', async () => {
    const runId = uuidv7()
    const override = ev(runId, 'trainer', 'hold.overridden', 12, 2, { stepKey: 'isolate', reason: 'Isolator already locked by me for the belt job' })
    await sync('trainer', [start(runId, 'trainer', 12), ev(runId, 'trainer', 'step.done', 12, 1, { stepKey: 'prep' }), override])
    expect(await entriesOf(runId)).toEqual([{ kind: 'override', step_key: 'isolate', event_id: override.id, actor_id: ids.trainer }])
    const res = await ledger({ machineId, kind: 'override' })
    expect(res.status).toBe(200)
    const row = res.body.rows.find((r: any) => r.eventId === override.id)
    expect(row).toMatchObject({ kind: 'override', runId, actorName: expect.any(String), stepTitle: 'Isolate the power', procedureTitle: PROCEDURE.title, detail: { reason: 'Isolator already locked by me for the belt job', signalWord: 'WARNING' } })
  })

  it('a reading out of range is an entry with value, unit, range and reason, and undo takes it away', async () => {
    const runId = uuidv7()
    const reading = ev(runId, 'operator', 'value.recorded', 12, 4, { stepKey: 'measure', value: 0.12, unit: 'mm', reason: 'Collet nut worn, new one ordered' })
    await sync('operator', [
      start(runId, 'operator', 12), ev(runId, 'operator', 'step.done', 12, 1, { stepKey: 'prep' }),
      ev(runId, 'operator', 'hold.acknowledged', 12, 2, { stepKey: 'isolate' }), ev(runId, 'operator', 'step.done', 12, 3, { stepKey: 'work' }), reading,
    ])
    expect(await entriesOf(runId)).toEqual([{ kind: 'out-of-range', step_key: 'measure', event_id: reading.id, actor_id: ids.operator }])
    const [[row]] = await db().query<any[]>('select detail from ledger_entries where event_id = ?', [reading.id])
    const detail = typeof row.detail === 'string' ? JSON.parse(row.detail) : row.detail
    // The step allows 0 to 0.05 mm (PROCEDURE above); 0.12 is above it.
    expect(detail).toMatchObject({ value: 0.12, unit: 'mm', side: 'above', range: '0 to 0.05 mm', reason: 'Collet nut worn, new one ordered' })
    await sync('operator', [ev(runId, 'operator', 'event.undone', 12, 5, { targetId: reading.id })])
    expect(await entriesOf(runId)).toEqual([])
  })

  it('an event that went past an open hold is a late-past-hold entry', async () => {
    const runId = uuidv7()
    // Work marked done at minute 2 on one tablet, the hold acknowledged at minute 3 on another.
    const late = ev(runId, 'operator', 'step.done', 12, 2, { stepKey: 'work' })
    await sync('operator', [start(runId, 'operator', 12), ev(runId, 'operator', 'step.done', 12, 1, { stepKey: 'prep' }), late, ev(runId, 'operator', 'hold.acknowledged', 12, 3, { stepKey: 'isolate' })])
    expect(await entriesOf(runId)).toEqual([{ kind: 'late-past-hold', step_key: 'work', event_id: late.id, actor_id: ids.operator }])
    const [[flagged]] = await db().query<any[]>('select flag from run_events where id = ?', [late.id])
    expect(flagged.flag).toBe('passed-unacknowledged-hold')
  })

  it('work past a check with no reading is a skipped check until the reading is recorded', async () => {
    const runId = uuidv7()
    const tidy = ev(runId, 'operator', 'step.done', 12, 4, { stepKey: 'tidy' })
    await sync('operator', [
      start(runId, 'operator', 12), ev(runId, 'operator', 'step.done', 12, 1, { stepKey: 'prep' }),
      ev(runId, 'operator', 'hold.acknowledged', 12, 2, { stepKey: 'isolate' }), ev(runId, 'operator', 'step.done', 12, 3, { stepKey: 'work' }), tidy,
    ])
    expect(await entriesOf(runId)).toEqual([{ kind: 'skipped-check', step_key: 'measure', event_id: tidy.id, actor_id: ids.operator }])
    await sync('operator', [ev(runId, 'operator', 'value.recorded', 12, 5, { stepKey: 'measure', value: 0.02, unit: 'mm' })])
    expect(await entriesOf(runId)).toEqual([])
  })
})

describe('GET /api/ledger', () => {
  beforeAll(async () => {
    // Three more overrides by the trainer on 13, 14 and 15 January for the paging and date checks.
    for (const day of [13, 14, 15]) {
      const runId = uuidv7()
      await sync('trainer', [start(runId, 'trainer', day), ev(runId, 'trainer', 'hold.overridden', day, 1, { stepKey: 'isolate', reason: `Isolator checked by hand on day ${day}` })])
    }
  })

  // The expected numbers are counted straight from ledger_entries with SQL, not by the server.
  const countInDb = async (where: string, args: unknown[]) =>
    Number((await db().query<any[]>(`select count(*) as n from ledger_entries e where e.shop_id = (select shop_id from users where id = ?) and ${where}`, [ids.owner, ...args]))[0][0].n)

  it('filters by kind, person, machine, procedure and date range with totals that match the table', async () => {
    const cases: [Record<string, string | number>, string, unknown[]][] = [
      [{ machineId }, 'e.machine_id = ?', [machineId]],
      [{ machineId, kind: 'override' }, 'e.machine_id = ? and e.kind = ?', [machineId, 'override']],
      [{ machineId, actorId: ids.operator! }, 'e.machine_id = ? and e.actor_id = ?', [machineId, ids.operator]],
      [{ procedureId }, 'e.procedure_id = ?', [procedureId]],
      [{ machineId, from: '2026-01-13', to: '2026-01-14' }, 'e.machine_id = ? and e.at >= ? and e.at < ?', [machineId, new Date('2026-01-13T00:00:00Z'), new Date('2026-01-15T00:00:00Z')]],
      [{ machineId, from: '2026-01-14T00:00:00Z' }, 'e.machine_id = ? and e.at >= ?', [machineId, new Date('2026-01-14T00:00:00Z')]],
    ]
    for (const [query, where, args] of cases) {
      const res = await ledger({ ...query, pageSize: 100 })
      expect(res.status, res.text).toBe(200)
      const expected = await countInDb(where, args)
      expect(expected, JSON.stringify(query)).toBeGreaterThan(0)
      expect(res.body.total, JSON.stringify(query)).toBe(expected)
      expect(res.body.rows).toHaveLength(expected)
    }
    const dated = await ledger({ machineId, from: '2026-01-13', to: '2026-01-14' })
    expect(dated.body.rows.map((r: any) => r.at.slice(0, 10)).sort()).toEqual(['2026-01-13', '2026-01-14'])
  })

  it('pages newest first without gaps or repeats', async () => {
    const all = (await ledger({ machineId, pageSize: 100 })).body
    expect(all.total).toBeGreaterThanOrEqual(5)
    const seen: string[] = []
    for (let page = 1; page <= Math.ceil(all.total / 2); page++) {
      const res = await ledger({ machineId, pageSize: 2, page })
      expect(res.body).toMatchObject({ total: all.total, page, pageSize: 2 })
      seen.push(...res.body.rows.map((r: any) => r.id))
    }
    expect(seen).toEqual(all.rows.map((r: any) => r.id))
    const times = all.rows.map((r: any) => Date.parse(r.at))
    expect(times).toEqual([...times].sort((a, b) => b - a))
    expect((await ledger({ machineId, pageSize: 2, page: 999 })).body.rows).toEqual([])
  })

  it('never shows another shop\'s entries, and the other shop sees only its own', async () => {
    const mine = await ledger({ pageSize: 100, from: '2026-01-12', to: '2026-01-12' })
    expect(mine.text).not.toContain('other-shop-marker')
    expect((await ledger({ machineId: other.machineId })).body).toMatchObject({ total: 0, rows: [] })
    const theirs = await call('GET', '/api/ledger', { cookie: other.cookie })
    expect(theirs.status).toBe(200)
    expect(theirs.body.rows.map((r: any) => r.detail.reason)).toEqual(['other-shop-marker'])
    const csv = await call('GET', `/api/ledger/export.csv?machineId=${other.machineId}`, { cookie: await as('owner') })
    expect(csv.text).not.toContain('other-shop-marker')
  })

  it.each([
    ['kind=nope', 'kind'],
    ['pageSize=101', 'pageSize'],
    ['pageSize=0', 'pageSize'],
    ['page=0', 'page'],
    ['page=two', 'page'],
    ['actorId=-3', 'actorId'],
    ['machineId=abc', 'machineId'],
    ['from=yesterday', 'from'],
    ['from=2026-02-30', 'from'],
    ['from=2026-01-14&to=2026-01-13', 'to'],
    ['colour=red', ''],
  ])('refuses ?%s with a 400 naming %s', async (query, path) => {
    // The export takes the same filters (and no paging), so it refuses the same queries.
    for (const url of [`/api/ledger?${query}`, `/api/ledger/export.csv?${query}`]) {
      const res = await call('GET', url, { cookie: await as('owner') })
      expect(res.status, url).toBe(400)
      expect(Array.isArray(res.body.data.issues)).toBe(true)
    }
    const res = await call('GET', `/api/ledger?${query}`, { cookie: await as('owner') })
    expect(res.body.data.issues.map((i: any) => i.path)).toContain(path)
  })

  it('answers 403 to an operator and a trainee, 200 to the trainer', async () => {
    for (const role of ['operator', 'trainee'] as const) expect((await call('GET', '/api/ledger', { cookie: await as(role) })).status).toBe(403)
    expect((await ledger({ machineId }, 'trainer')).status).toBe(200)
  })
})

describe('GET /api/ledger/export.csv', () => {
  async function tableRows(query: Record<string, string | number>) {
    const rows: any[] = []
    for (let page = 1; ; page++) {
      const res = await ledger({ ...query, page, pageSize: 100 })
      rows.push(...res.body.rows)
      if (rows.length >= res.body.total) return rows
    }
  }
  async function csvRecords(query: Record<string, string | number>) {
    const res = await fetch(`${process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'}/api/ledger/export.csv?${new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]))}`, { headers: { cookie: await as('owner') } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="jogwise-ledger-\d{4}-\d{2}-\d{2}\.csv"$/)
    // csv-parse (node-csv), the reader beside the csv-stringify the server writes with
    return parse(await res.text(), { columns: true, skip_empty_lines: true }) as Record<string, string>[]
  }
  const asTable = (r: any) => ({
    'When (UTC)': r.at, 'Kind': r.kind, 'Person': r.actorName, 'Machine': r.machineName, 'Procedure': r.procedureTitle,
    'Step': r.stepTitle ?? '', 'What happened': r.summary, 'Run': r.runId, 'Event': r.eventId, 'Detail (JSON)': r.detail,
  })

  it('parsed back with csv-parse, equals the table\'s rows for the same filter', async () => {
    for (const query of [{ machineId }, { machineId, kind: 'override' }, { procedureId, actorId: ids.operator! }]) {
      const records = await csvRecords(query)
      const rows = await tableRows(query)
      expect(rows.length).toBeGreaterThan(0)
      expect(records.map(r => ({ ...r, 'Detail (JSON)': JSON.parse(r['Detail (JSON)']!) }))).toEqual(rows.map(asTable))
    }
  })

  it('streams a set larger than one read batch, ties on time included, in the table\'s order', async () => {
    // 2,345 entries in one hour, many sharing a millisecond, on a machine of their own.
    const bulk = await call('POST', '/api/machines', { cookie: await as('owner'), body: {
      name: `Ledger Bulk ${Date.now()}`, travelXMm: 600, travelYMm: 400, travelZMm: 80, units: 'mm',
      spindleKind: 'air-spindle', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
    } })
    const [[shop]] = await db().query<any[]>('select shop_id from users where id = ?', [ids.owner])
    const runId = uuidv7()
    const values = Array.from({ length: 2345 }, (_, i) => [shop.shop_id, uuidv7(), runId, i % 3 ? 'out-of-range' : 'skipped-check', ids.operator, bulk.body.id, procedureId, 'measure',
      new Date(Date.UTC(2026, 0, 20, 9, 0, 0, Math.floor(i / 7))), JSON.stringify({ stepTitle: 'Measure the runout', value: i, unit: 'mm', side: 'above', reason: `bulk, "quoted", row ${i}` })])
    await db().query('insert into ledger_entries (shop_id, event_id, run_id, kind, actor_id, machine_id, procedure_id, step_key, at, detail) values ?', [values])
    const records = await csvRecords({ machineId: bulk.body.id })
    expect(records).toHaveLength(2345)
    const rows = await tableRows({ machineId: bulk.body.id })
    expect(records.map(r => r.Event)).toEqual(rows.map(r => r.eventId))
    expect(new Set(records.map(r => r.Event)).size).toBe(2345)
    expect(JSON.parse(records[0]!['Detail (JSON)']!).reason).toMatch(/^bulk, "quoted", row \d+$/)
  })
})

describe('GET /api/ledger/runs', () => {
  it('lists the machine\'s runs newest first with their override, photo and sign-off counts', async () => {
    const res = await call('GET', `/api/ledger/runs?machineId=${machineId}&pageSize=100`, { cookie: await as('owner') })
    expect(res.status, res.text).toBe(200)
    const [[n]] = await db().query<any[]>('select count(*) as n from runs where machine_id = ?', [machineId])
    expect(res.body.total).toBe(Number(n.n))
    const [overrides] = await db().query<any[]>('select run_id, count(*) as n from run_events e join runs r on r.id = e.run_id where r.machine_id = ? and e.type = ? and e.flag is null group by run_id', [machineId, 'hold.overridden'])
    for (const o of overrides) expect(res.body.rows.find((r: any) => r.id === o.run_id)?.overrides).toBe(Number(o.n))
    expect(res.body.rows.filter((r: any) => r.overrides > 0)).toHaveLength(4)
    const starts = res.body.rows.map((r: any) => Date.parse(r.startedAt))
    expect(starts).toEqual([...starts].sort((a, b) => b - a))
    expect((await call('GET', '/api/ledger/runs?status=gone', { cookie: await as('owner') })).status).toBe(400)
    expect((await call('GET', `/api/ledger/runs?machineId=${other.machineId}`, { cookie: await as('owner') })).body.total).toBe(0)
  })

  it('counts a photo that was undone no more', async () => {
    const owner = await as('owner')
    const made = await call('POST', '/api/procedures', { cookie: owner, body: { procedure: {
      title: `Ledger photo count ${Date.now()}`, summary: 'One photo step and a sign-off, for the run list count.', category: 'maintenance',
      steps: [
        { key: 'pic', kind: 'photo', title: 'Photograph the collet', body: 'Take one photo of the collet.', subject: 'The collet, close up.' },
        { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The collet was photographed.' },
      ],
    } } })
    expect(made.status, made.text).toBe(201)
    const runId = uuidv7()
    const first = ev(runId, 'trainer', 'photo.attached', 13, 1, { stepKey: 'pic', note: 'blurred, taken again' })
    await sync('trainer', [
      ev(runId, 'trainer', 'run.started', 13, 0, { procedureVersionId: made.body.versionId, machineId, mode: 'solo' }),
      first,
      ev(runId, 'trainer', 'event.undone', 13, 2, { targetId: first.id }),
      ev(runId, 'trainer', 'photo.attached', 13, 3, { stepKey: 'pic', note: 'sharp' }),
    ])
    const res = await call('GET', `/api/ledger/runs?procedureId=${made.body.id}`, { cookie: owner })
    expect(res.status, res.text).toBe(200)
    expect(res.body.rows.map((r: any) => [r.id, r.photos])).toEqual([[runId, 1]])
  })
})
