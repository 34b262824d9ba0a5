import { parse } from 'csv-parse/sync'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { LEDGER_KIND_LABELS } from '../../shared/runs/ledger-kinds'
import { as, call, db, otherShop } from './client'
import { seal } from './seal'

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
const at = (day: number, minute: number) => new Date(Date.UTC(2026, 0, day, 8, 0) + minute * 60_000).toISOString()
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
// The exception entries still true (not changed later); the routine kinds are checked on their own.
async function csvRecords(query: Record<string, string | number>) {
  const res = await fetch(`${process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'}/api/ledger/export.csv?${new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]))}`, { headers: { cookie: await as('owner') } })
  expect(res.status).toBe(200)
  expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
  expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="jogwise-ledger-\d{4}-\d{2}-\d{2}\.csv"$/)
  // csv-parse (node-csv), the reader beside the csv-stringify the server writes with
  return parse(await res.text(), { columns: true, skip_empty_lines: true }) as Record<string, string>[]
}
const entriesOf = async (runId: string) => (await db().query<any[]>(`select kind, step_key, event_id, actor_id from ledger_entries
  where run_id = ? and changed_at is null and kind not in ('hold-acknowledged', 'signed-off', 'entry-changed', 'backdated') order by at, kind`, [runId]))[0]
// Every row of a run, changed ones included, oldest first.
const allEntriesOf = async (runId: string) => (await db().query<any[]>(`select id, kind, step_key, event_id, actor_id, counted, revision, changed_at, changed_by, received_at, at, detail
  from ledger_entries where run_id = ? order by id`, [runId]))[0].map((r: any) => ({ ...r, counted: !!r.counted, detail: typeof r.detail === 'string' ? JSON.parse(r.detail) : r.detail }))

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
    const [[before]] = await db().query<any[]>('select count(*) as n from ledger_entries where run_id = ?', [runId])
    const undo = ev(runId, 'operator', 'event.undone', 12, 5, { targetId: reading.id })
    await sync('operator', [undo])
    expect(await entriesOf(runId)).toEqual([])
    // Append-only: the entry is still there, marked changed by an entry naming the undo.
    const all = await allEntriesOf(runId)
    expect(all.length).toBe(Number(before.n) + 1)
    const old = all.find(e => e.kind === 'out-of-range')
    const change = all.find(e => e.kind === 'entry-changed')
    expect(old).toMatchObject({ event_id: reading.id, changed_by: change.id })
    expect(old.changed_at).toBeInstanceOf(Date)
    expect(change).toMatchObject({ event_id: undo.id, actor_id: ids.operator, detail: { changedEntryId: old.id, changedKind: 'out-of-range', now: null, cause: { eventType: 'event.undone', claimedAt: undo.at } } })
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
    expect((await allEntriesOf(runId)).filter(e => e.kind === 'skipped-check').map(e => e.changed_at === null)).toEqual([false])
  })
})

describe('append-only Ledger (issue 18) and every acknowledgement and sign-off (issue 11)', () => {
  let auditMachine: number
  const startOn = (runId: string, actor: string, day: number) =>
    ev(runId, actor, 'run.started', day, 0, { procedureVersionId: versionId, machineId: auditMachine, mode: actor === 'operator' ? 'guided' : 'solo' })
  const send = async (role: 'owner' | 'trainer' | 'operator' | 'trainee', events: unknown[], deviceId = 'ledger-tablet') => {
    const res = await call('POST', '/api/sync', { cookie: await as(role), body: { deviceId, events } })
    expect(res.status, res.text).toBe(200)
    return res
  }
  const on = <E extends object>(e: E, deviceId: string) => ({ ...e, deviceId })
  const ledgerRows = async (query: Record<string, string | number>) => (await ledger({ machineId: auditMachine, pageSize: 100, ...query })).body.rows as any[]

  beforeAll(async () => {
    // A machine of its own, so these runs do not change the counts the other checks expect.
    const machine = await call('POST', '/api/machines', { cookie: await as('owner'), body: {
      name: `Ledger Audit Router ${Date.now()}`, travelXMm: 600, travelYMm: 400, travelZMm: 80, units: 'mm',
      spindleKind: 'air-spindle', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
    } })
    expect(machine.status, machine.text).toBe(201)
    auditMachine = machine.body.id
  })

  it('a stranger\'s backdated run.abandoned before an override: the override entry stays in the Ledger and the CSV', async () => {
    const runId = uuidv7()
    const override = on(ev(runId, 'trainer', 'hold.overridden', 16, 2, { stepKey: 'isolate', reason: 'Isolator locked by me for the belt job' }), 'trainer-tablet')
    await send('trainer', [on(startOn(runId, 'trainer', 16), 'trainer-tablet'), on(ev(runId, 'trainer', 'step.done', 16, 1, { stepKey: 'prep' }), 'trainer-tablet'), override], 'trainer-tablet')
    const [first] = await allEntriesOf(runId)
    expect(first).toMatchObject({ kind: 'override', event_id: override.id, counted: true, revision: 1, changed_at: null })
    // The trainee has nothing to do with this run; the event claims one second before the override.
    const abandon = on(ev(runId, 'trainee', 'run.abandoned', 16, 2 - 1 / 60, { reason: 'Machine needed for an urgent job' }), 'trainee-tablet')
    const res = await send('trainee', [abandon], 'trainee-tablet')
    const all = await allEntriesOf(runId)
    // Whatever became of the event (refused as not on the run, or stored), the override stays.
    expect(all.find(e => e.id === first.id)).toMatchObject({ kind: 'override', event_id: override.id, counted: true, revision: 1 })
    const listed = (await ledgerRows({ kind: 'override' })).filter(r => r.eventId === override.id)
    expect(listed.map(r => r.id)).toContain(first.id)
    const csv = await csvRecords({ machineId: auditMachine, kind: 'override' })
    expect(csv.filter(r => r.Event === override.id).map(r => r.Entry)).toContain(String(first.id))
    // The trainee is not on the run (server/utils/run-actors.ts): the event is kept on the record
    // but flagged and not counted, so nothing about the override changes.
    expect(res.body.rejected).toEqual([])
    const [[row]] = await db().query<any[]>('select flag from run_events where id = ?', [abandon.id])
    expect(row.flag).toBe('actor-not-allowed')
    expect(all.filter(e => e.changed_at !== null)).toEqual([])
    expect(all.filter(e => e.kind === 'override').map(e => [e.revision, e.counted])).toEqual([[1, true]])
  })

  it('a lead\'s run.abandoned dated ten minutes before an override another tablet delivered is flagged; the override stays', async () => {
    const runId = uuidv7()
    const override = on(ev(runId, 'trainer', 'hold.overridden', 16, 12, { stepKey: 'isolate', reason: 'Isolator locked by me for the belt job' }), 'trainer-tablet')
    await send('trainer', [on(startOn(runId, 'trainer', 16), 'trainer-tablet'), on(ev(runId, 'trainer', 'step.done', 16, 11, { stepKey: 'prep' }), 'trainer-tablet'), override], 'trainer-tablet')
    const abandon = on(ev(runId, 'owner', 'run.abandoned', 16, 2, { reason: 'Stopped from the office, wrong job loaded' }), 'office-tablet')
    expect((await send('owner', [abandon], 'office-tablet')).body.rejected).toEqual([])
    const all = await allEntriesOf(runId)
    const overrides = all.filter(e => e.kind === 'override')
    expect(overrides.map(e => [e.revision, e.counted, e.changed_at === null])).toEqual([[1, true, false], [2, false, true]])
    const flagged = all.find(e => e.kind === 'backdated')
    // 08:12 (the override, delivered first from another tablet) − 08:02 (claimed) = 600 s
    expect(flagged).toMatchObject({ event_id: abandon.id, actor_id: ids.owner, detail: { eventType: 'run.abandoned', claimedAt: abandon.at, secondsBefore: 600, newestDelivered: { eventId: override.id, deviceId: 'trainer-tablet' } } })
    // The owner finds it by its kind; the record shows the received time beside the claimed one.
    expect((await ledgerRows({ kind: 'backdated' })).map(r => r.eventId)).toContain(abandon.id)
    const audit = await call('GET', `/api/runs/${runId}/audit`, { cookie: await as('owner') })
    expect(audit.status, audit.text).toBe(200)
    expect(Date.parse(audit.body.received[abandon.id])).toBeGreaterThan(Date.parse(abandon.at))
    expect(audit.body.entries.map((e: any) => e.kind)).toEqual(expect.arrayContaining(['override', 'entry-changed', 'backdated']))
    // Another shop member sees the received times but not the Ledger entries.
    expect((await call('GET', `/api/runs/${runId}/audit`, { cookie: await as('operator') })).body).toMatchObject({ entries: null, received: { [abandon.id]: expect.any(String) } })
  })

  it('a backdated hold.acknowledged after going past the hold: the "went past a hold" entry stays, marked changed', async () => {
    const runId = uuidv7()
    const past = on(ev(runId, 'operator', 'step.done', 17, 3, { stepKey: 'work' }), 'op-tablet-a')
    await send('operator', [on(startOn(runId, 'operator', 17), 'op-tablet-a'), on(ev(runId, 'operator', 'step.done', 17, 1, { stepKey: 'prep' }), 'op-tablet-a'), past], 'op-tablet-a')
    expect(await entriesOf(runId)).toEqual([{ kind: 'late-past-hold', step_key: 'work', event_id: past.id, actor_id: ids.operator }])
    const [pastEntry] = (await allEntriesOf(runId)).filter(e => e.kind === 'late-past-hold')
    // Sent later, from another tablet, dated 90 s before the step it would excuse.
    const ack = on(ev(runId, 'operator', 'hold.acknowledged', 17, 1.5, { stepKey: 'isolate' }), 'op-tablet-b')
    expect((await send('operator', [ack], 'op-tablet-b')).body.rejected).toEqual([])
    const all = await allEntriesOf(runId)
    const change = all.find(e => e.kind === 'entry-changed')
    expect(all.find(e => e.id === pastEntry.id)).toMatchObject({ kind: 'late-past-hold', event_id: past.id, changed_by: change.id })
    expect(change).toMatchObject({ event_id: ack.id, actor_id: ids.operator, detail: { changedKind: 'late-past-hold', now: null, cause: { eventType: 'hold.acknowledged', claimedAt: ack.at } } })
    expect(all.find(e => e.kind === 'hold-acknowledged')).toMatchObject({ event_id: ack.id, counted: true })
    expect(all.find(e => e.kind === 'backdated')).toMatchObject({ event_id: ack.id, detail: { secondsBefore: 90 } })
    // Still listed and exported under its kind
    expect((await ledgerRows({ kind: 'late-past-hold' })).find(r => r.id === pastEntry.id)).toMatchObject({ changedBy: change.id, changedAt: expect.any(String) })
    const csv = (await csvRecords({ machineId: auditMachine, kind: 'late-past-hold' })).find(r => r.Entry === String(pastEntry.id))
    expect(csv).toMatchObject({ 'Kind': 'Went past a hold', 'Changed later': `yes, see entry ${change.id}` })
  })

  it('an override the fold did not count (two tablets on one hold) is listed, not counted, with the reason', async () => {
    const runId = uuidv7()
    await send('trainer', [on(startOn(runId, 'trainer', 18), 'tablet-a'), on(ev(runId, 'trainer', 'step.done', 18, 1, { stepKey: 'prep' }), 'tablet-a'),
      on(ev(runId, 'trainer', 'hold.overridden', 18, 2, { stepKey: 'isolate', reason: 'Isolator locked by me for the belt job' }), 'tablet-a')], 'tablet-a')
    const second = on(ev(runId, 'owner', 'hold.overridden', 18, 3, { stepKey: 'isolate', reason: 'Checked the isolator from the office camera' }), 'tablet-b')
    expect((await send('owner', [second], 'tablet-b')).body.rejected).toEqual([])
    const rows = (await ledgerRows({ kind: 'override' })).filter(r => r.runId === runId)
    expect(rows.map(r => [r.actorId, r.counted])).toEqual([[ids.owner, false], [ids.trainer, true]])
    expect(rows[0].detail.notCounted).toMatch(/already cleared/)
    expect(rows[0].summary).toMatch(/^Override reason: Checked the isolator from the office camera Not counted: /)
    const csv = (await csvRecords({ machineId: auditMachine, kind: 'override' })).find(r => r.Event === second.id)
    expect(csv).toMatchObject({ 'Kind': 'Hold overridden', 'Counted': 'no', 'Reason': 'Checked the isolator from the office camera', 'Signal word': 'WARNING' })
    expect(csv!['Not counted because']).toMatch(/already cleared/)
  })

  it('every acknowledgement and sign-off is an entry, filterable by kind, in the CSV and in the run list', async () => {
    const runId = uuidv7()
    const ack = ev(runId, 'operator', 'hold.acknowledged', 19, 2, { stepKey: 'isolate' })
    await sync('operator', [startOn(runId, 'operator', 19), ev(runId, 'operator', 'step.done', 19, 1, { stepKey: 'prep' }), ack,
      ev(runId, 'operator', 'step.done', 19, 3, { stepKey: 'work' }), ev(runId, 'operator', 'value.recorded', 19, 4, { stepKey: 'measure', value: 0.02, unit: 'mm' }),
      ev(runId, 'operator', 'step.done', 19, 5, { stepKey: 'measure' }), ev(runId, 'operator', 'step.done', 19, 6, { stepKey: 'tidy' })])
    // The trainer's PIN on the operator's tablet (demo trainer PIN, server/utils/demo-shop.ts),
    // sealed to the server's key and bound to this very event (tests/api/seal.ts)
    // A seal lives 72 hours, so this sign-off is dated now, after the run's January events.
    const signoff = { ...ev(runId, 'operator', 'signoff.given', 19, 7, { stepKey: 'sign', signerId: ids.trainer, signerRole: 'trainer' }), at: new Date().toISOString() }
    Object.assign(signoff, { seal: await seal(await as('operator'), { runId, stepKey: 'sign', signerId: ids.trainer!, eventId: signoff.id, time: signoff.at, pin: '2468' }) })
    await sync('operator', [signoff])
    const acks = (await ledgerRows({ kind: 'hold-acknowledged' })).filter(r => r.runId === runId)
    expect(acks.map(r => [r.eventId, r.actorId, r.counted, r.stepTitle])).toEqual([[ack.id, ids.operator, true, 'Isolate the power']])
    const signed = (await ledgerRows({ kind: 'signed-off' })).filter(r => r.runId === runId)
    // Entered under the signer, with who sent it beside
    expect(signed.map(r => [r.eventId, r.actorId, r.counted])).toEqual([[signoff.id, ids.trainer, true]])
    expect(signed[0].detail).toMatchObject({ signerRole: 'trainer', sentBy: ids.operator })
    expect(signed[0].summary).toBe('Signed off "Sign off" as trainer.')
    // The CSV for people: readable kind, local time beside UTC (America/Chicago is UTC−6 in
    // January: CST, IANA time zone database), details in their own columns, JSON last.
    const [record] = (await csvRecords({ machineId: auditMachine, kind: 'hold-acknowledged', tz: 'America/Chicago' })).filter(r => r.Event === ack.id)
    expect(record).toMatchObject({ 'When (UTC)': '2026-01-19T08:02:00.000Z', 'When (local, America/Chicago)': '2026-01-19 02:02:00', 'Kind': 'Hold acknowledged', 'Kind (code)': 'hold-acknowledged', 'Counted': 'yes', 'Step': 'Isolate the power' })
    expect(Object.keys(record!).at(-1)).toBe('Detail (JSON)')
    const [signedRecord] = (await csvRecords({ machineId: auditMachine, kind: 'signed-off', tz: 'America/Chicago' })).filter(r => r.Event === signoff.id)
    expect(signedRecord).toMatchObject({ 'Kind': 'Signed off', 'Kind (code)': 'signed-off', 'Counted': 'yes', 'Step': 'Sign off' })
    expect(JSON.parse(signedRecord!['Detail (JSON)']!)).toMatchObject({ signerId: ids.trainer })
    // The run list follows the kind filter: only runs with a sign-off entry
    const runs = await call('GET', `/api/ledger/runs?machineId=${auditMachine}&kind=signed-off`, { cookie: await as('owner') })
    expect(runs.status, runs.text).toBe(200)
    expect(runs.body.rows.map((r: any) => r.id)).toEqual([runId])
    expect((await call('GET', '/api/ledger/export.csv?tz=Mars/Olympus', { cookie: await as('owner') })).status).toBe(400)
  })

  it('neutralises formulas in names, titles and text (OWASP CSV Injection) and keeps negative readings as numbers', async () => {
    const owner = await as('owner')
    const machine = await call('POST', '/api/machines', { cookie: owner, body: {
      name: '=cmd|\' /C calc\'!A0', travelXMm: 600, travelYMm: 400, travelZMm: 80, units: 'mm',
      spindleKind: 'air-spindle', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
    } })
    expect(machine.status, machine.text).toBe(201)
    const made = await call('POST', '/api/procedures', { cookie: owner, body: { procedure: { ...PROCEDURE, title: `@SUM A1 cmd ${Date.now()}` } } })
    // (no regular-expression characters in the title: other files build patterns from the newest procedure's)
    expect(made.status, made.text).toBe(201)
    const [[shop]] = await db().query<any[]>('select shop_id from users where id = ?', [ids.owner])
    const [person] = await db().query<any>('insert into users (shop_id, email, name, password_hash, role) values (?,?,?,?,?)', [shop.shop_id, `csv-${Date.now()}@demo.jogwise.test`, '-2+3+cmd', 'not-a-hash', 'operator'])
    await db().query('insert into ledger_entries (shop_id, event_id, run_id, kind, actor_id, machine_id, procedure_id, step_key, at, detail) values (?,?,?,?,?,?,?,?,?,?)', [
      shop.shop_id, uuidv7(), uuidv7(), 'out-of-range', person.insertId, machine.body.id, made.body.id, 'measure', new Date(at(20, 0)),
      JSON.stringify({ stepTitle: '+Measure the runout', value: -0.4, unit: 'mm', side: 'below', range: '0 to 0.05 mm', reason: '=HYPERLINK("http://example.invalid","look")' }),
    ])
    const res = await fetch(`${process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'}/api/ledger/export.csv?machineId=${machine.body.id}`, { headers: { cookie: owner } })
    const text = await res.text()
    const [record] = parse(text, { columns: true }) as Record<string, string>[]
    expect(record).toMatchObject({
      Person: '\'-2+3+cmd', Machine: '\'=cmd|\' /C calc\'!A0', Step: '\'+Measure the runout',
      Reason: '\'=HYPERLINK("http://example.invalid","look")', Reading: '-0.4', Unit: 'mm',
    })
    expect(record!.Procedure).toMatch(/^'@SUM A1 cmd \d+$/)
    // The reading is written bare, a number a spreadsheet sums; no cell of the file starts a formula.
    expect(text).toMatch(/,-0\.4,mm,/)
    for (const cell of Object.values(record!)) expect(cell).not.toMatch(/^[=+@\t\r]|^-(?!\d)/)
    // Out of service again, so other files that take the shop's first machine by name never get this one.
    await db().query('update machines set retired_at = now(3) where id = ?', [machine.body.id])
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
  // The CSV's columns from a table row (none of these cells starts a formula, so none is quoted).
  const asTable = (r: any) => ({
    'When (UTC)': r.at, 'When (local, UTC)': r.at.slice(0, 19).replace('T', ' '), 'Received (UTC)': r.receivedAt ?? '',
    'Kind': LEDGER_KIND_LABELS[r.kind as keyof typeof LEDGER_KIND_LABELS], 'Counted': r.counted ? 'yes' : 'no',
    'Not counted because': r.detail.notCounted ?? '', 'Changed later': r.changedAt ? `yes, see entry ${r.changedBy}` : 'no',
    'Person': r.actorName, 'Machine': r.machineName, 'Procedure': r.procedureTitle, 'Step': r.stepTitle ?? '', 'What happened': r.summary,
    'Reason': r.detail.reason ?? '', 'Reading': r.detail.value === undefined ? '' : String(r.detail.value), 'Unit': r.detail.unit ?? '',
    'Allowed range': r.detail.range ?? '', 'Signal word': r.detail.signalWord ?? '', 'Language on screen': r.detail.lang ?? '', 'Entry': String(r.id), 'Revision': String(r.revision),
    'Run': r.runId, 'Event': r.eventId, 'Kind (code)': r.kind, 'Detail (JSON)': r.detail,
  })

  it('parsed back with csv-parse, equals the table\'s rows for the same filter', async () => {
    const queries: Record<string, string | number>[] = [{ machineId }, { machineId, kind: 'override' }, { procedureId, actorId: ids.operator! }]
    for (const query of queries) {
      const records = await csvRecords({ ...query, tz: 'UTC' })
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
