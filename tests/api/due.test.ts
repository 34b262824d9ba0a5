import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, otherShop } from './client'

// Maintenance intervals and the due list against the real server and MariaDB. The due rule is
// Jogwise's own (issue 6 and server/utils/due-list.ts): an interval is met by the last
// FINISHED run of its procedure on the machine; it is "due" within 10 % of the interval (at
// least one day) before the limit, "overdue" past it; never done counts from when the machine
// was added (issue 11: a machine added today is not overdue). Spindle
// hours count runs.spindle_minutes of runs on the machine started after that run finished.
// Run dates are written straight into the database, so every status is set up exactly.

const DAY = 86_400_000
const procedure = (n: number) => ({
  title: `Due check procedure ${n} ${Date.now()}`,
  summary: 'A short procedure used by the due list checks.',
  category: 'maintenance',
  steps: [
    { key: 'look', kind: 'instruction', title: 'Look at the machine', body: 'Look at the machine.' },
    { key: 'hours', kind: 'check', title: 'Spindle hours run', body: 'Read the spindle hour meter for this job.', label: 'Spindle time', unit: 'h', min: 0 },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'I looked at the machine.' },
  ],
})

let shopId: number
let ownerId: number
let machineId: number
const procs: { id: number, versionId: number, title: string }[] = []
let other: Awaited<ReturnType<typeof otherShop>>

async function insertRun(p: { versionId: number }, opts: { finishedDaysAgo?: number, startedDaysAgo: number, spindleMinutes?: number, status?: string }) {
  const id = uuidv7()
  const started = new Date(Date.now() - opts.startedDaysAgo * DAY)
  const finished = opts.finishedDaysAgo === undefined ? null : new Date(Date.now() - opts.finishedDaysAgo * DAY)
  await db().query('insert into runs (id, shop_id, machine_id, procedure_version_id, started_by, mode, status, spindle_minutes, started_at, finished_at) values (?,?,?,?,?,?,?,?,?,?)', [
    id, shopId, machineId, p.versionId, ownerId, 'solo', opts.status ?? (finished ? 'finished' : 'active'), opts.spindleMinutes ?? 0, started, finished,
  ])
  return id
}
const post = async (body: unknown, role: 'owner' | 'trainer' | 'operator' = 'owner') => call('POST', '/api/maintenance-intervals', { cookie: await as(role), body })
const dueFor = async (role: 'owner' | 'operator' = 'operator') => {
  const res = await call('GET', '/api/due', { cookie: await as(role) })
  expect(res.status, res.text).toBe(200)
  return (res.body as any[]).filter(d => d.machineId === machineId)
}

beforeAll(async () => {
  const owner = await as('owner')
  ownerId = (await call('GET', '/api/me', { cookie: owner })).body.user.id
  ;[[{ shop_id: shopId }]] = await db().query<any[]>('select shop_id from users where id = ?', [ownerId]) as any
  const machine = await call('POST', '/api/machines', { cookie: owner, body: {
    name: `Due Router ${Date.now()}`, travelXMm: 600, travelYMm: 400, travelZMm: 80, units: 'mm',
    spindleKind: 'air-spindle', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
  } })
  machineId = machine.body.id
  for (let n = 0; n < 6; n++) {
    const made = await call('POST', '/api/procedures', { cookie: owner, body: { procedure: procedure(n) } })
    expect(made.status, made.text).toBe(201)
    procs.push({ id: made.body.id, versionId: made.body.versionId, title: procedure(n).title.replace(/ \d+$/, '') })
  }
  other = await otherShop()
})
afterAll(async () => { await db().end() })

describe('maintenance intervals', () => {
  it('the owner adds, changes and removes one; everyone reads them', async () => {
    const made = await post({ procedureId: procs[5]!.id, machineId, everyDays: 14 })
    expect(made.status, made.text).toBe(201)
    expect(made.body).toMatchObject({ procedureId: procs[5]!.id, machineId, everyDays: 14, everySpindleHours: null })
    const changed = await call('PATCH', `/api/maintenance-intervals/${made.body.id}`, { cookie: await as('owner'), body: { everyDays: null, everySpindleHours: 50 } })
    expect(changed.status, changed.text).toBe(200)
    expect(changed.body).toMatchObject({ everyDays: null, everySpindleHours: 50 })
    const list = await call('GET', '/api/maintenance-intervals', { cookie: await as('operator') })
    expect(list.body.find((i: any) => i.id === made.body.id)).toMatchObject({ everySpindleHours: 50, machineName: expect.stringMatching(/^Due Router/) })
    // Both limits cleared would leave an interval that is never due.
    const empty = await call('PATCH', `/api/maintenance-intervals/${made.body.id}`, { cookie: await as('owner'), body: { everySpindleHours: null } })
    expect(empty.status).toBe(400)
    expect(empty.body.data.issues[0].path).toBe('everyDays')
    expect((await call('DELETE', `/api/maintenance-intervals/${made.body.id}`, { cookie: await as('owner') })).status).toBe(200)
    expect((await call('DELETE', `/api/maintenance-intervals/${made.body.id}`, { cookie: await as('owner') })).status).toBe(404)
  })

  it.each([
    ['no limit at all', () => ({ procedureId: procs[0]!.id }), 'everyDays'],
    ['zero days', () => ({ procedureId: procs[0]!.id, everyDays: 0 }), 'everyDays'],
    ['days as text', () => ({ procedureId: procs[0]!.id, everyDays: 'weekly' }), 'everyDays'],
    ['negative spindle hours', () => ({ procedureId: procs[0]!.id, everySpindleHours: -4 }), 'everySpindleHours'],
    ['no procedure', () => ({ everyDays: 7 }), 'procedureId'],
    ['another shop\'s procedure', () => ({ procedureId: other.procedureId, everyDays: 7 }), 'procedureId'],
    ['another shop\'s machine', () => ({ procedureId: procs[0]!.id, machineId: other.machineId, everyDays: 7 }), 'machineId'],
    ['an unknown field', () => ({ procedureId: procs[0]!.id, everyDays: 7, colour: 'red' }), ''],
  ])('refuses %s with a 400 naming the field', async (_what, body, path) => {
    const res = await post(body())
    expect(res.status, res.text).toBe(400)
    expect(res.body.data.issues.map((i: any) => i.path)).toContain(path)
  })

  it('is the owner\'s alone to change, and another shop\'s interval is not found', async () => {
    expect((await post({ procedureId: procs[0]!.id, everyDays: 7 }, 'trainer')).status).toBe(403)
    expect((await post({ procedureId: procs[0]!.id, everyDays: 7 }, 'operator')).status).toBe(403)
    const [theirs] = await db().query<any>('insert into maintenance_intervals (shop_id, procedure_id, machine_id, every_days) values (?, ?, ?, 3)', [other.shopId, other.procedureId, other.machineId])
    expect((await call('PATCH', `/api/maintenance-intervals/${theirs.insertId}`, { cookie: await as('owner'), body: { everyDays: 9 } })).status).toBe(404)
    expect((await call('DELETE', `/api/maintenance-intervals/${theirs.insertId}`, { cookie: await as('owner') })).status).toBe(404)
    const mine = await call('GET', '/api/maintenance-intervals', { cookie: await as('owner') })
    expect(mine.body.map((i: any) => i.id)).not.toContain(theirs.insertId)
    const due = await call('GET', '/api/due', { cookie: await as('owner') })
    expect(due.body.map((d: any) => d.machineId)).not.toContain(other.machineId)
    await db().query('delete from maintenance_intervals where id = ?', [theirs.insertId])
  })
})

describe('GET /api/due', () => {
  it('says ok, due or overdue from the last finished run and the spindle hours since', async () => {
    const [p0, p1, p2, p3, p4, p5] = procs
    // Every 10 days: the window is max(1 day, 10 % of 10 days) = 1 day before the limit.
    await insertRun(p0!, { startedDaysAgo: 3.1, finishedDaysAgo: 3 }) // 3 days ago: ok
    await insertRun(p1!, { startedDaysAgo: 9.6, finishedDaysAgo: 9.5 }) // 0.5 day left: due
    await insertRun(p2!, { startedDaysAgo: 12.1, finishedDaysAgo: 12 }) // 2 days late: overdue
    await insertRun(p2!, { startedDaysAgo: 1, status: 'abandoned', finishedDaysAgo: 1 }) // abandoned: does not count
    await insertRun(p3!, { startedDaysAgo: 1 }) // only unfinished: not done yet, machine added today
    // Every 10 spindle hours: done 20 days ago; since then 300 + 240 = 540 min = 9 h on this
    // machine (90 %: due), plus 600 min before it was done, which does not count.
    await insertRun(p0!, { startedDaysAgo: 30, finishedDaysAgo: 29.9, spindleMinutes: 600 })
    await insertRun(p4!, { startedDaysAgo: 20.1, finishedDaysAgo: 20 })
    await insertRun(p0!, { startedDaysAgo: 10, finishedDaysAgo: 9.9, spindleMinutes: 300 })
    await insertRun(p5!, { startedDaysAgo: 5, finishedDaysAgo: 4.9, spindleMinutes: 240 })
    for (const p of [p0, p1, p2, p3]) expect((await post({ procedureId: p!.id, machineId, everyDays: 10 })).status).toBe(201)
    const hours = await post({ procedureId: p4!.id, machineId, everySpindleHours: 10 })
    expect(hours.status).toBe(201)

    const byProc = new Map((await dueFor()).map(d => [d.procedureId, d]))
    expect(byProc.get(p0!.id)).toMatchObject({ status: 'ok', everyDays: 10 })
    expect(byProc.get(p1!.id)).toMatchObject({ status: 'due' })
    expect(byProc.get(p2!.id)).toMatchObject({ status: 'overdue' })
    expect(byProc.get(p3!.id)).toMatchObject({ status: 'ok', lastDoneAt: null, reason: expect.stringMatching(/^Not done yet; machine added 0 days ago, every 10 days/) })
    expect(byProc.get(p4!.id)).toMatchObject({ status: 'due', spindleHoursSince: 9, everySpindleHours: 10 })
    // dueAt = last finished + 10 days
    const p0Item = byProc.get(p0!.id)
    expect(Date.parse(p0Item.dueAt) - Date.parse(p0Item.lastDoneAt)).toBe(10 * DAY)
    // Worst first
    const order = (await dueFor()).map(d => d.status)
    expect(order).toEqual([...order].sort((a, b) => ['overdue', 'due', 'ok'].indexOf(a) - ['overdue', 'due', 'ok'].indexOf(b)))

    // Another 90 minutes of spindle time: 10.5 h > 10 h, overdue.
    await insertRun(p5!, { startedDaysAgo: 1, finishedDaysAgo: 0.9, spindleMinutes: 90 })
    expect((await dueFor()).find(d => d.procedureId === p4!.id)).toMatchObject({ status: 'overdue', spindleHoursSince: 10.5 })
  })

  it('never done counts from when the machine was added: a new machine is not overdue, an old one is', async () => {
    const owner = await as('owner')
    const machine = (name: string) => call('POST', '/api/machines', { cookie: owner, body: {
      name: `${name} ${Date.now()}`, travelXMm: 600, travelYMm: 400, travelZMm: 80, units: 'mm',
      spindleKind: 'air-spindle', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
    } })
    const fresh = (await machine('Due New Router')).body.id
    const old = (await machine('Due Old Router')).body.id
    await db().query('update machines set created_at = ? where id = ?', [new Date(Date.now() - 40 * DAY), old])
    const made = await Promise.all([fresh, old].flatMap(m => [
      post({ procedureId: procs[4]!.id, machineId: m, everyDays: 30 }),
      post({ procedureId: procs[5]!.id, machineId: m, everySpindleHours: 5 }),
    ]))
    for (const m of made) expect(m.status, m.text).toBe(201)
    const due = (await call('GET', '/api/due', { cookie: await as('operator') })).body as any[]
    const mine = new Set(made.map(m => m.body.id))
    const of = (m: number) => due.filter(d => d.machineId === m && mine.has(d.intervalId)).sort((a, b) => a.procedureId - b.procedureId)
    // Added today: 30 days and 5 spindle hours from now; nothing is due.
    expect(of(fresh).map(d => [d.status, d.lastDoneAt])).toEqual([['ok', null], ['ok', null]])
    expect(of(fresh)[0].reason).toMatch(/^Not done yet; machine added 0 days ago, every 30 days\.$/)
    expect(of(fresh)[1].reason).toMatch(/^Not done yet; 0 of 5 spindle hours used\.$/)
    // Added 40 days ago and never done every 30 days: overdue; no spindle time run: ok.
    expect(of(old).map(d => d.status)).toEqual(['overdue', 'ok'])
    expect(of(old)[0].reason).toMatch(/^Not done yet; machine added 40 days ago/)
    for (const m of made) await call('DELETE', `/api/maintenance-intervals/${m.body.id}`, { cookie: owner })
  })

  it('an interval for every machine appears once per machine in service', async () => {
    const made = await post({ procedureId: procs[5]!.id, machineId: null, everyDays: 30 })
    expect(made.status, made.text).toBe(201)
    const res = await call('GET', '/api/due', { cookie: await as('trainee') })
    const machines = await call('GET', '/api/machines', { cookie: await as('trainee') })
    expect(res.body.filter((d: any) => d.intervalId === made.body.id).map((d: any) => d.machineId).sort()).toEqual(machines.body.map((m: any) => m.id).sort())
    await call('DELETE', `/api/maintenance-intervals/${made.body.id}`, { cookie: await as('owner') })
  })

  it('spindle time recorded by a run (a spindle-hours check) is kept on the run by the merge', async () => {
    const operator = await as('operator')
    const me = (await call('GET', '/api/me', { cookie: operator })).body.user.id
    const runId = uuidv7()
    const ev = (type: string, minute: number, extra: Record<string, unknown> = {}) =>
      ({ id: uuidv7(), runId, type, at: new Date(Date.now() - (10 - minute) * 60_000).toISOString(), actorId: me, deviceId: 'due-tablet', ...extra })
    const res = await call('POST', '/api/sync', { cookie: operator, body: { deviceId: 'due-tablet', events: [
      ev('run.started', 0, { procedureVersionId: procs[0]!.versionId, machineId, mode: 'guided' }),
      ev('step.done', 1, { stepKey: 'look' }),
      ev('value.recorded', 2, { stepKey: 'hours', value: 2.25, unit: 'h' }),
    ] } })
    expect(res.body.rejected, res.text).toEqual([])
    // 2.25 h × 60 = 135 min
    const [[run]] = await db().query<any[]>('select spindle_minutes from runs where id = ?', [runId])
    expect(run.spindle_minutes).toBe(135)
  })
})
