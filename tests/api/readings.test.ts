import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, otherShop } from './client'

// Spoilboard readings against the real server and MariaDB: stored in mm with who and when,
// analysed with the shared plane fit, kept within one shop, and every bad grid named by path.

// Test vector F1, computed independently (SVD least squares; a linear program for the minimum zone):
// the exact saddle z = 0.10 + 0.001x − 0.0005y + 0.05(x−100)(y−100)/10⁴ on x, y ∈ {0, 100, 200}
// mm, rows front to back. Expected: LSQ peak-to-valley 0.100 mm, clean-up z_max − z_min 0.300 mm.
const F1 = [
  [0.15, 0.20, 0.25],
  [0.05, 0.15, 0.25],
  [-0.05, 0.10, 0.25],
]
const reading = (extra: Record<string, unknown> = {}) => ({ kind: 'height', units: 'mm', grid: F1, spacing: { x: 100, y: 100 }, ...extra })

let machineId: number
let benchId: number
let other: Awaited<ReturnType<typeof otherShop>>
const post = async (role: 'owner' | 'trainer' | 'operator' | 'trainee', body: unknown, id = machineId) =>
  call('POST', `/api/machines/${id}/readings`, { cookie: await as(role), body })

/** A run of the demo shop on a given machine, written straight into the database. */
async function runOn(onMachine: number) {
  const [[m]] = await db().query<any[]>('select shop_id from machines where id = ?', [onMachine])
  const [[v]] = await db().query<any[]>('select id from procedure_versions where shop_id = ? limit 1', [m.shop_id])
  const [[u]] = await db().query<any[]>('select id from users where email = ?', ['operator@demo.jogwise.test'])
  const id = uuidv7()
  await db().query('insert into runs (id, shop_id, machine_id, procedure_version_id, started_by, mode, started_at) values (?, ?, ?, ?, ?, ?, now(3))', [id, m.shop_id, onMachine, v.id, u.id, 'guided'])
  return id
}

beforeAll(async () => {
  // A machine of its own, so the history checks see only these readings.
  const made = await call('POST', '/api/machines', { cookie: await as('owner'), body: {
    name: `Readings Router ${Date.now()}`, travelXMm: 600, travelYMm: 600, travelZMm: 90, units: 'mm',
    spindleKind: 'trim-router', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 19, spoilboardMinMm: 12,
  } })
  if (made.status !== 201) throw new Error(made.text)
  machineId = made.body.id
  const machines = await call('GET', '/api/machines', { cookie: await as('operator') })
  benchId = machines.body.find((m: any) => m.name === 'Bench Router').id
  other = await otherShop()
})
afterAll(async () => { await db().end() })

describe('POST then GET /api/machines/:id/readings', () => {
  let savedId: number
  it('stores a 3 × 3 grid in mm with who and when, and reads it back with the F1 analysis (hand-calculated saddle)', async () => {
    const me = (await call('GET', '/api/me', { cookie: await as('operator') })).body.user
    const before = Date.now()
    const saved = await post('operator', reading({ note: 'Morning check' }))
    expect(saved.status, saved.text).toBe(201)
    savedId = saved.body.id
    expect(saved.body).toMatchObject({ kind: 'height', grid: F1, spacingXMm: 100, spacingYMm: 100, takenById: me.id, takenByName: me.name, note: 'Morning check' })
    expect(Date.parse(saved.body.takenAt)).toBeGreaterThanOrEqual(before - 5000)

    const list = await call('GET', `/api/machines/${machineId}/readings`, { cookie: await as('trainee') })
    expect(list.status).toBe(200)
    const back = list.body.find((r: any) => r.id === savedId)
    expect(back.grid).toEqual(F1)
    // F1: LSQ P-V 0.100 and clean-up 0.300 mm (hand calculation); the vertical-residual P-V is
    // exact here, so a tight tolerance.
    expect(back.summary.flatnessAboutPlaneMm).toBeCloseTo(0.1, 9)
    // Minimum zone (ISO 1101): the saddle's corner residuals keep r(+,+) − r(+,−) − r(−,+) + r(−,−)
    // = 0.2 mm under any plane, so two differences of at most the zone width sum to 0.2: the
    // zone is at least 0.1 mm, and the least-squares plane already reaches it (hand-worked).
    expect(back.summary.flatnessMinimumZoneMm).toBeCloseTo(0.1, 9)
    expect(back.summary.flatnessAboutXYMm).toBeCloseTo(0.3, 9)
    expect(back.summary.cleanupDepthMm).toBeCloseTo(0.3, 9)
    // Heights only give the shape: the thickness is an estimate anchored on the nominal 19 mm,
    // and the thinnest point lies (mean − lowest) under it.
    expect(back.summary.thicknessEstimated).toBe(true)
    expect(back.summary.thicknessMeanMm).toBeCloseTo(19, 9)
    const mean = F1.flat().reduce((s, z) => s + z, 0) / 9
    expect(back.summary.thicknessAfterMm).toBeCloseTo(19 - (mean - -0.05), 9)
    // Facings of the clean-up depth (0.3 mm) until the 12 mm minimum.
    expect(back.summary.facingsLeft).toBe(Math.floor((19 - (mean + 0.05) - 12) / 0.3))

    const [[row]] = await db().query<any[]>('select taken_by, grid, spacing_x_mm from spoilboard_readings where id = ?', [savedId])
    expect(row.taken_by).toBe(me.id)
    expect(typeof row.grid === 'string' ? JSON.parse(row.grid) : row.grid).toEqual(F1)
  })

  it('converts inches to mm exactly on the way in (1 in = 25.4 mm, NBS Circular 572 addendum, 1960)', async () => {
    const saved = await post('trainer', { kind: 'thickness', units: 'in', grid: [[0.75, 0.7], [0.72, 0.74]], spacing: { x: 4, y: 6 }, facedDepth: 0.01, takenAt: new Date(Date.now() + 60_000).toISOString() })
    expect(saved.status, saved.text).toBe(201)
    const [[row]] = await db().query<any[]>('select grid, spacing_x_mm, spacing_y_mm, faced_depth_mm from spoilboard_readings where id = ?', [saved.body.id])
    const grid = typeof row.grid === 'string' ? JSON.parse(row.grid) : row.grid
    expect(grid[0][0]).toBeCloseTo(19.05, 12)
    expect(grid[1][0]).toBeCloseTo(18.288, 12)
    expect(row.spacing_x_mm).toBeCloseTo(101.6, 12)
    expect(row.spacing_y_mm).toBeCloseTo(152.4, 12)
    expect(row.faced_depth_mm).toBeCloseTo(0.254, 12)
    // Thickness readings are measured, not estimated: the thinnest is 0.7 in = 17.78 mm.
    expect(saved.body.summary.thicknessEstimated).toBe(false)
    expect(saved.body.summary.thicknessMinMm).toBeCloseTo(17.78, 12)
  })

  it('lists the newest first', async () => {
    const list = await call('GET', `/api/machines/${machineId}/readings`, { cookie: await as('operator') })
    const times = list.body.map((r: any) => Date.parse(r.takenAt))
    expect(times).toEqual([...times].sort((a, b) => b - a))
    expect(list.body.length).toBeGreaterThanOrEqual(2)
    const limited = await call('GET', `/api/machines/${machineId}/readings?limit=1`, { cookie: await as('operator') })
    expect(limited.body).toHaveLength(1)
    expect(limited.body[0].id).toBe(list.body[0].id)
  })

  it('lets a trainee log readings too (each is recorded under its taker)', async () => {
    const saved = await post('trainee', reading())
    expect(saved.status, saved.text).toBe(201)
    expect(saved.body.takenByName).toBe('Sam Ibarra')
  })

  it('attaches a run of the same machine, and refuses another machine\'s or another shop\'s run', async () => {
    const runId = await runOn(machineId)
    const ok = await post('operator', reading({ runId, facedDepth: 0.3 }))
    expect(ok.status, ok.text).toBe(201)
    expect(ok.body).toMatchObject({ runId, facedDepthMm: 0.3 })
    const elsewhere = await post('operator', reading({ runId: await runOn(benchId) }))
    expect(elsewhere.status).toBe(400)
    expect(elsewhere.body.data.issues).toEqual([{ path: 'runId', message: 'That run was on another machine.' }])
    const foreign = await post('operator', reading({ runId: other.runId }))
    expect(foreign.status).toBe(400)
    expect(foreign.body.data.issues).toEqual([{ path: 'runId', message: 'No such run in this shop.' }])
  })
})

describe('bad readings answer 400 naming the path', () => {
  it('a ragged grid names the short row', async () => {
    const res = await post('operator', reading({ grid: [[1, 2, 3], [1, 2], [1, 2, 3]] }))
    expect(res.status).toBe(400)
    expect(res.body.data.issues).toContainEqual({ path: 'grid.1', message: 'Row 2 has 2 readings but row 1 has 3; every row needs the same number.' })
    expect(res.text).not.toMatch(/at .*\.(mjs|js|ts):\d+|sqlMessage|ER_[A-Z_]+/)
  })

  it.each([
    ['a cell that is not a number', { grid: [[1, '2', 3], [1, 2, 3]] }, 'grid.0.1', 'Reading in row 1, column 2 is not a number.'],
    ['too many rows', { grid: Array.from({ length: 21 }, () => [0, 0]) }, 'grid', 'Take readings on 2 to 20 rows (got 21).'],
    ['too many columns', { grid: [Array.from({ length: 21 }, () => 0), Array.from({ length: 21 }, () => 0)] }, 'grid.0', 'Take 2 to 20 readings in each row (row 1 has 21).'],
    ['a single row', { grid: [[1, 2, 3]] }, 'grid', 'Take readings on 2 to 20 rows (got 1).'],
    ['a zero thickness', { kind: 'thickness', grid: [[18, 18], [0, 18]] }, 'grid.1.0', 'Thickness in row 2, column 1 must be more than 0.'],
    ['a spacing of zero', { spacing: { x: 0, y: 100 } }, 'spacing.x', 'Spacing X must be more than 0.'],
    ['a spacing of 1e-200 mm', { spacing: { x: 100, y: 1e-200 } }, 'spacing.y', 'Spacing Y must be at least 1 mm; readings closer than that are one spot.'],
    ['a faced depth too thin to be a facing', { facedDepth: 0.001 }, 'facedDepth', 'Faced depth must be at least 0.01 mm.'],
    ['unknown units', { units: 'cm' }, 'units', 'Units must be \'mm\' or \'in\'.'],
    ['a run id that is not a UUID', { runId: 'run-1' }, 'runId', 'Run id must be a run\'s UUID.'],
    ['another machine id in the body', { machineId: 999999 }, 'machineId', expect.stringContaining('address names machine')],
  ])('%s', async (_, change, path, message) => {
    const res = await post('operator', reading(change))
    expect(res.status, res.text).toBe(400)
    expect(res.body.data.issues).toContainEqual({ path, message })
  })

  it('an empty body says so', async () => {
    const res = await call('POST', `/api/machines/${machineId}/readings`, { cookie: await as('operator') })
    expect(res.status).toBe(400)
  })
})

describe('one stored reading that cannot be analysed', () => {
  it('leaves the rest of the history answering, and says why for that reading', async () => {
    // A machine of its own: one good reading, then a bad row written straight into the table
    // (spacing 1e-200 mm passed the input check of earlier versions).
    const made = await call('POST', '/api/machines', { cookie: await as('owner'), body: {
      name: `Odd Reading Router ${Date.now()}`, travelXMm: 600, travelYMm: 600, travelZMm: 90, units: 'mm',
      spindleKind: 'trim-router', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 19, spoilboardMinMm: 12,
    } })
    const good = await post('operator', reading(), made.body.id)
    expect(good.status, good.text).toBe(201)
    const [[m]] = await db().query<any[]>('select shop_id from machines where id = ?', [made.body.id])
    const [[u]] = await db().query<any[]>('select id from users where email = ?', ['operator@demo.jogwise.test'])
    const [bad] = await db().query<any>(
      'insert into spoilboard_readings (shop_id, machine_id, taken_by, taken_at, kind, grid, spacing_x_mm, spacing_y_mm) values (?, ?, ?, now(3), ?, ?, ?, ?)',
      [m.shop_id, made.body.id, u.id, 'height', JSON.stringify(F1), 1e-200, 1e-200],
    )
    const list = await call('GET', `/api/machines/${made.body.id}/readings`, { cookie: await as('trainee') })
    expect(list.status, list.text).toBe(200)
    expect(list.text).not.toMatch(/at .*\.(mjs|js|ts):\d+|sqlMessage|ER_[A-Z_]+/)
    const odd = list.body.find((r: any) => r.id === bad.insertId)
    expect(odd.summary).toBeNull()
    expect(odd.problem).toMatch(/^This reading cannot be analysed: /)
    const fine = list.body.find((r: any) => r.id === good.body.id)
    expect(fine.problem).toBeNull()
    expect(fine.summary.flatnessMinimumZoneMm).toBeCloseTo(0.1, 9)
    // A new reading after the odd one still saves and answers with its analysis.
    const after = await post('operator', reading({ note: 'after the odd row' }), made.body.id)
    expect(after.status, after.text).toBe(201)
    expect(after.body.summary.flatnessAboutPlaneMm).toBeCloseTo(0.1, 9)
  })
})

describe('readings stay within one shop', () => {
  it('another shop\'s machine is 404 for reading and writing, with none of its data', async () => {
    const read = await call('GET', `/api/machines/${other.machineId}/readings`, { cookie: await as('operator') })
    expect(read.status).toBe(404)
    const write = await post('operator', reading(), other.machineId)
    expect(write.status).toBe(404)
    expect(write.text).not.toContain('Other Router')
    const [[n]] = await db().query<any[]>('select count(*) as n from spoilboard_readings where machine_id = ?', [other.machineId])
    expect(Number(n.n)).toBe(0)
    // and the other shop cannot see ours
    const back = await call('GET', `/api/machines/${machineId}/readings`, { cookie: other.cookie })
    expect(back.status).toBe(404)
  })

  it('needs a session', async () => {
    expect((await call('GET', `/api/machines/${machineId}/readings`)).status).toBe(401)
    expect((await call('POST', `/api/machines/${machineId}/readings`, { body: reading() })).status).toBe(401)
  })
})
