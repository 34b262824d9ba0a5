import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, BASE_URL, call, db, otherShop } from './client'
import { makePng } from '../support/images'

// Runs done on a printed sheet and entered later (issue 17) against the built server and
// MariaDB: who may enter one, what bad input answers, how the Ledger marks it and that it
// counts for the due list like a tablet run. The due rule is Jogwise's own (server/utils/
// due-list.ts, issue 6); the signal words are ANSI Z535.4's; the range rule is inclusive bounds
// (shared/procedures/schema.ts rangeStatus). Dates are set straight in the database so the
// sheet can be dated days back.

const DAY = 86_400_000
const PROCEDURE = {
  title: `Paper run check ${Date.now()}`,
  summary: 'A short procedure used by the paper run checks.',
  category: 'maintenance',
  steps: [
    { key: 'look', kind: 'instruction', title: 'Look over the gantry', body: 'Look over the gantry and rails.' },
    {
      key: 'power', kind: 'hold', title: 'Isolate the power', body: 'Switch off and lock out the main isolator.',
      signalWord: 'WARNING', hazard: 'A moving gantry can crush hands.', avoid: 'Lock out the isolator before reaching in.', needsTrainerSignoff: true,
    },
    { key: 'belt', kind: 'check', title: 'Belt deflection', body: 'Press the belt at mid span and measure.', label: 'Deflection', unit: 'mm', min: 2, max: 5 },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The belts were checked.' },
  ],
}

let machineId: number
let procedureId: number
let versionId: number
let ids: Record<'owner' | 'trainer' | 'operator' | 'trainee', number>

async function idOf(role: 'owner' | 'trainer' | 'operator' | 'trainee') {
  return (await call('GET', '/api/me', { cookie: await as(role) })).body.user.id as number
}

const sheet = (over: Record<string, unknown> = {}) => ({
  runId: uuidv7(),
  machineId, procedureVersionId: versionId, operatorId: ids.trainee, mode: 'guided',
  startedAt: new Date(Date.now() - 3 * DAY).toISOString(),
  finishedAt: new Date(Date.now() - 3 * DAY + 40 * 60_000).toISOString(),
  outcome: 'finished',
  ticked: ['look', 'power'],
  readings: [{ stepKey: 'belt', value: 3.5 }],
  signerId: ids.trainer,
  ...over,
})
const enter = async (body: unknown, role: 'owner' | 'trainer' | 'operator' | 'trainee' = 'trainer') => call('POST', '/api/paper-runs', { cookie: await as(role), body })
const issuePaths = (res: { body: any }) => (res.body?.data?.issues ?? []).map((i: any) => i.path)

beforeAll(async () => {
  const owner = await as('owner')
  ids = { owner: await idOf('owner'), trainer: await idOf('trainer'), operator: await idOf('operator'), trainee: await idOf('trainee') }
  const machine = await call('POST', '/api/machines', { cookie: owner, body: {
    name: `Paper Router ${Date.now()}`, travelXMm: 600, travelYMm: 400, travelZMm: 80, units: 'mm',
    spindleKind: 'air-spindle', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
  } })
  expect(machine.status, machine.text).toBe(201)
  machineId = machine.body.id
  const made = await call('POST', '/api/procedures', { cookie: owner, body: { procedure: PROCEDURE } })
  expect(made.status, made.text).toBe(201)
  procedureId = made.body.id
  versionId = made.body.versionId
  // Both existed ten days ago, so a sheet from three days ago may follow them.
  await db().query('update machines set created_at = ? where id = ?', [new Date(Date.now() - 10 * DAY), machineId])
  await db().query('update procedure_versions set created_at = ? where id = ?', [new Date(Date.now() - 10 * DAY), versionId])
})
afterAll(async () => { await db().end() })

describe('POST /api/paper-runs: who may enter a paper run', () => {
  it.each(['operator', 'trainee'] as const)('a %s is refused with 403 and nothing is stored', async (role) => {
    const body = sheet()
    const res = await enter(body, role)
    expect(res.status).toBe(403)
    const [rows] = await db().query<any[]>('select id from runs where id = ?', [body.runId])
    expect(rows).toHaveLength(0)
  })
})

describe('POST /api/paper-runs: bad input names the field and the reason', () => {
  it.each([
    ['no machine', { machineId: undefined }, 'machineId'],
    ['a machine of another shop', { machineId: 'other' }, 'machineId'],
    ['a finish in the future', { finishedAt: new Date(Date.now() + DAY).toISOString() }, 'finishedAt'],
    ['a finish before the start', { finishedAt: new Date(Date.now() - 4 * DAY).toISOString() }, 'finishedAt'],
    ['a start before the machine was added', { startedAt: new Date(Date.now() - 20 * DAY).toISOString(), finishedAt: new Date(Date.now() - 20 * DAY + 60_000).toISOString() }, 'startedAt'],
    ['a reading beyond every gauge', { readings: [{ stepKey: 'belt', value: 1e12 }] }, 'readings.0.value'],
    ['a reading that is not a number', { readings: [{ stepKey: 'belt', value: '3,5' }] }, 'readings.0.value'],
    ['an out-of-range reading without a reason', { readings: [{ stepKey: 'belt', value: 7 }] }, 'readings.0.reason'],
    ['a reading on a step that is no check', { readings: [{ stepKey: 'belt', value: 3 }, { stepKey: 'look', value: 1 }] }, 'readings.1.stepKey'],
    ['a step the version does not have', { ticked: ['look', 'power', 'nope'] }, 'ticked.2'],
    ['a hold not ticked on a finished run', { ticked: ['look'] }, 'ticked'],
    ['a guided run without its signer', { signerId: undefined }, 'signerId'],
    ['an operator as the signer', { signerId: 'operator' }, 'signerId'],
    ['a stopped run without a reason', { outcome: 'stopped', ticked: ['look'], readings: [] }, 'stopReason'],
    ['a solo run by a person not qualified', { mode: 'solo', signerId: undefined }, 'mode'],
    ['an unknown field', { extra: 1 }, ''],
  ] as [string, Record<string, unknown>, string][])('%s', async (_what, over, path) => {
    const other = over.machineId === 'other' ? await otherShop() : null
    const patch: Record<string, unknown> = { ...over }
    if (other) patch.machineId = other.machineId
    if (over.signerId === 'operator') patch.signerId = ids.operator
    const body = sheet(patch)
    const res = await enter(body)
    expect(res.status, res.text).toBe(400)
    expect(issuePaths(res)).toContain(path)
    expect(res.body.data.issues.every((i: any) => typeof i.message === 'string' && i.message.length > 5)).toBe(true)
    const [rows] = await db().query<any[]>('select id from runs where id = ?', [body.runId])
    expect(rows).toHaveLength(0)
  })
})

describe('a paper run lands in the record, the Ledger and the due list', () => {
  let runId: string
  let intervalId: number
  beforeAll(async () => {
    const made = await call('POST', '/api/maintenance-intervals', { cookie: await as('owner'), body: { procedureId, machineId, everyDays: 7 } })
    expect(made.status, made.text).toBe(201)
    intervalId = made.body.id
  })
  afterAll(async () => { await call('DELETE', `/api/maintenance-intervals/${intervalId}`, { cookie: await as('owner') }) })

  it('the due list counts it like a tablet run', async () => {
    const due = async () => ((await call('GET', '/api/due', { cookie: await as('operator') })).body as any[]).find(d => d.intervalId === intervalId && d.machineId === machineId)
    // Machine added 10 days ago, every 7 days, never done: overdue (due-list.ts rule).
    expect((await due()).status).toBe('overdue')
    const body = sheet({ readings: [{ stepKey: 'belt', value: 5.5, reason: 'Belt stretched, new one ordered for Monday.' }], note: 'Done from the laminated sheet.' })
    const res = await enter(body)
    expect(res.status, res.text).toBe(201)
    runId = res.body.runId
    const after = await due()
    expect(after.status).toBe('ok')
    expect(after.lastDoneAt).toBe(body.finishedAt)
  })

  it('the run record says entered from paper, by whom and when, with the sheet\'s events', async () => {
    const res = await call('GET', `/api/runs/${runId}`, { cookie: await as('operator') })
    expect(res.status, res.text).toBe(200)
    expect(res.body.run).toMatchObject({ origin: 'paper', enteredBy: ids.trainer, status: 'finished', startedBy: ids.trainee, mode: 'guided' })
    expect(Date.now() - Date.parse(res.body.run.enteredAt)).toBeLessThan(5 * 60_000)
    expect(res.body.people[ids.trainer]).toBeTruthy()
    const types = res.body.events.map((e: any) => e.type)
    expect(types[0]).toBe('run.started')
    expect(types.at(-1)).toBe('run.finished')
    expect(types).toEqual(expect.arrayContaining(['hold.acknowledged', 'value.recorded', 'signoff.given', 'note.added']))
    expect(res.body.events.every((e: any) => e.deviceId === 'paper-sheet' && e.flag === null)).toBe(true)
  })

  it('the Ledger has one entered-from-paper entry and marks the run\'s other entries', async () => {
    const owner = await as('owner')
    const mine = ((await call('GET', '/api/ledger?kind=entered-from-paper&pageSize=100', { cookie: owner })).body.rows ?? []).filter((e: any) => e.runId === runId)
    expect(mine).toHaveLength(1)
    expect(mine[0]).toMatchObject({ kind: 'entered-from-paper', detail: { enteredBy: ids.trainer, operatorId: ids.trainee, signerId: ids.trainer } })
    expect(mine[0].summary).toMatch(/^Run done on paper/)
    const [rows] = await db().query<any[]>('select kind, detail from ledger_entries where run_id = ? order by id', [runId])
    const kinds = rows.map(r => r.kind)
    // WARNING hold acknowledged, two sign-offs (hold and sign-off step), the 5.5 mm reading above 2 to 5 mm.
    expect(kinds).toEqual(expect.arrayContaining(['hold-acknowledged', 'signed-off', 'out-of-range', 'entered-from-paper']))
    for (const r of rows.filter(r => r.kind !== 'entered-from-paper')) {
      const detail = typeof r.detail === 'string' ? JSON.parse(r.detail) : r.detail
      expect(detail.fromPaper).toMatchObject({ enteredBy: ids.trainer })
    }
    const signed = ((await call('GET', '/api/ledger?kind=signed-off&pageSize=100', { cookie: owner })).body.rows ?? []).filter((e: any) => e.runId === runId)
    expect(signed.length).toBe(2)
    for (const e of signed) expect(e.summary).toMatch(/\(Entered from paper\.\)$/)
    const csv = await fetch(`${BASE_URL}/api/ledger/export.csv?kind=entered-from-paper`, { headers: { cookie: owner } })
    expect(await csv.text()).toContain('Entered from paper')
  })

  it('the same sheet sent twice is stored once', async () => {
    const [[before]] = await db().query<any[]>('select count(*) as n from run_events where run_id = ?', [runId])
    const res = await enter({ ...sheet(), runId })
    expect(res.status, res.text).toBe(200)
    expect(res.body).toMatchObject({ runId, created: false })
    const [[after]] = await db().query<any[]>('select count(*) as n from run_events where run_id = ?', [runId])
    expect(after.n).toBe(before.n)
  })

  it('the same sheet sent twice at once is stored once', async () => {
    const body = sheet()
    const [a, b] = await Promise.all([enter(body), enter(body)])
    expect([a.status, b.status].sort(), a.text + b.text).toEqual([200, 201])
    const [[row]] = await db().query<any[]>('select count(*) as n from ledger_entries where run_id = ? and kind = ?', [body.runId, 'entered-from-paper'])
    expect(row.n).toBe(1)
  })

  it('the photo of the sheet is filed with the run', async () => {
    const uploadId = uuidv7()
    const cookie = await as('trainer')
    const put = await fetch(`${BASE_URL}/api/uploads/${uploadId}?runId=${runId}`, {
      method: 'PUT', headers: { 'content-type': 'application/octet-stream', cookie }, body: new Uint8Array(makePng(8, 8, 0x80)),
    })
    expect(put.status, await put.text()).toBe(201)
    const wrong = await call('PUT', `/api/paper-runs/${runId}/sheet`, { cookie, body: { uploadId: uuidv7() } })
    expect(wrong.status).toBe(400)
    expect(issuePaths(wrong)).toEqual(['uploadId'])
    const ok = await call('PUT', `/api/paper-runs/${runId}/sheet`, { cookie, body: { uploadId } })
    expect(ok.status, ok.text).toBe(200)
    expect((await call('GET', `/api/runs/${runId}`, { cookie })).body.run.sheetUploadId).toBe(uploadId)
  })

  it('a stopped sheet is stored as a stopped run and does not count for the due list', async () => {
    const res = await enter(sheet({ outcome: 'stopped', stopReason: 'The belt tensioner was seized, so we stopped.', ticked: ['look'], readings: [], signerId: undefined }))
    expect(res.status, res.text).toBe(201)
    const run = (await call('GET', `/api/runs/${res.body.runId}`, { cookie: await as('owner') })).body.run
    expect(run).toMatchObject({ origin: 'paper', status: 'abandoned' })
  })
})
