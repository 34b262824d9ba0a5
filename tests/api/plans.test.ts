import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, otherShop } from './client'

// POST /api/plans/surfacing and GET /api/plans/[id] against the real server and MariaDB.
// G-code word meanings: NIST RS274/NGC interpreter, NISTIR 6556 §3.5.7 and §3.6 (G20 inch units,
// G21 millimetre units, M5 spindle stop, M30 program end).

const MM_PLAN = {
  units: 'mm', area: { x: 600, y: 400 }, cutter: { diameter: 25.4, flutes: 2 }, stepoverPct: 50,
  totalDepth: 1, depthPerPass: 0.5, feed: 2500, plunge: 500, rpm: 16000,
  direction: 'x', pattern: 'zigzag', safeZ: 5, spinUpSeconds: 5,
}
const INCH_PLAN = {
  units: 'in', area: { x: 20, y: 20 }, cutter: { diameter: 1, flutes: 2 }, stepoverPct: 60,
  totalDepth: 0.04, depthPerPass: 0.02, feed: 100, plunge: 20, rpm: 16000,
  direction: 'y', pattern: 'one-way', safeZ: 0.2,
}

/** The program's blocks without the tape marks (%) and the parenthesised comments. */
const blocks = (gcode: string) => gcode.split('\n').map(l => l.trim()).filter(l => l && l !== '%' && !l.startsWith('('))

let bench: { id: number, travelXMm: number, travelYMm: number }
let runId: string
let other: Awaited<ReturnType<typeof otherShop>>
const planCount = async () => (await db().query<any[]>('select count(*) as n from surfacing_plans'))[0][0].n as number

beforeAll(async () => {
  const operator = await as('operator')
  const machines = (await call('GET', '/api/machines', { cookie: operator })).body as any[]
  bench = machines.find(m => m.name === 'Bench Router')
  // A run of the demo shop's resurfacing procedure, started the way a tablet does.
  const procedures = (await call('GET', '/api/procedures', { cookie: operator })).body as any[]
  const resurfacing = procedures.find(p => p.current.steps.some((s: any) => s.kind === 'planner'))
  const me = (await call('GET', '/api/me', { cookie: operator })).body.user
  runId = uuidv7()
  const started = await call('POST', '/api/sync', { cookie: operator, body: { deviceId: 'plans-test', events: [{
    id: uuidv7(), runId, type: 'run.started', at: new Date().toISOString(), actorId: me.id, deviceId: 'plans-test',
    procedureVersionId: resurfacing.current.id, machineId: bench.id, mode: 'guided',
  }] } })
  if (started.body.accepted?.length !== 1) throw new Error(started.text)
  other = await otherShop()
})
afterAll(async () => { await db().end() })

describe('POST /api/plans/surfacing', () => {
  it('plans, stores and answers a metric program that starts with G21 and ends with M30', async () => {
    const res = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: MM_PLAN })
    expect(res.status, res.text).toBe(201)
    const program = blocks(res.body.gcode)
    expect(program[0]).toBe('G21')
    expect(program.at(-2)).toBe('M5')
    expect(program.at(-1)).toBe('M30')
    expect(res.body.gcode.trimEnd().endsWith('%')).toBe(true)
    // Lines along X spaced across Y = 400 mm at no more than 12.7 mm (50 % of 25.4 mm):
    // ceil(400 / 12.7) = 32 gaps, 33 lines (hand calculation).
    expect(res.body.plan).toMatchObject({ units: 'mm', lineCount: 33, passCount: 2 })
    // Removed volume = 600 × 400 × 1 mm³ (hand calculation).
    expect(res.body.plan.removedVolume).toBeCloseTo(240_000, 6)
    // Chip load = feed / (flutes × rpm) = 2500 / (2 × 16000) mm (machining handbook formula).
    expect(res.body.plan.chipLoad).toBeCloseTo(0.078125, 9)
    const [[row]] = await db().query<any[]>('select shop_id, machine_id, run_id, input from surfacing_plans where id = ?', [res.body.planId])
    expect(row.machine_id).toBeNull()
    expect(row.run_id).toBeNull()
    const input = typeof row.input === 'string' ? JSON.parse(row.input) : row.input
    expect(input.area).toEqual({ x: 600, y: 400 })
  })

  it('uses the chosen machine and keeps the plan with the run; every role may plan', async () => {
    for (const role of ['owner', 'trainer', 'operator', 'trainee'] as const) {
      const res = await call('POST', '/api/plans/surfacing', { cookie: await as(role), body: { ...INCH_PLAN, machineId: bench.id, runId } })
      expect(res.status, `${role}: ${res.text}`).toBe(201)
      const program = blocks(res.body.gcode)
      expect(program[0]).toBe('G20')
      expect(program.at(-1)).toBe('M30')
      const [[row]] = await db().query<any[]>('select machine_id, run_id from surfacing_plans where id = ?', [res.body.planId])
      expect(row).toEqual({ machine_id: bench.id, run_id: runId })
    }
  })

  it('answers a stored plan with the same program, and only within its shop', async () => {
    const made = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...INCH_PLAN, machineId: bench.id, runId } })
    const got = await call('GET', `/api/plans/${made.body.planId}`, { cookie: await as('trainee') })
    expect(got.status, got.text).toBe(200)
    expect(got.body.gcode).toBe(made.body.gcode)
    expect(got.body).toMatchObject({ id: made.body.planId, machineId: bench.id, runId, summary: made.body.plan })
    const theirs = await call('GET', `/api/plans/${made.body.planId}`, { cookie: other.cookie })
    expect(theirs.status).toBe(404)
    expect(theirs.text).not.toContain('G20')
    expect((await call('GET', '/api/plans/not-a-number', { cookie: await as('owner') })).status).toBe(404)
  })

  it('names every invalid field and stores nothing', async () => {
    const before = await planCount()
    const res = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: {
      ...MM_PLAN, cutter: { diameter: 0, flutes: 2 }, stepoverPct: 150, feed: 0,
    } })
    expect(res.status).toBe(400)
    const paths = res.body.data.issues.map((i: any) => i.path)
    expect(paths).toEqual(expect.arrayContaining(['cutter.diameter', 'stepoverPct', 'feed']))
    const stepover = res.body.data.issues.find((i: any) => i.path === 'stepoverPct')
    expect(stepover.message).toMatch(/Stepover cannot be more than 100 %/)
    expect(res.text).not.toMatch(/at .*\.(mjs|js|ts):\d+|ZodError/)
    expect(await planCount()).toBe(before)
  })

  it('refuses a plan larger than the machine, naming the axis and the amount', async () => {
    const before = await planCount()
    // 700 mm of X on a 620 mm travel: the cutter centre needs 700 mm, 80 mm too much.
    const res = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...MM_PLAN, area: { x: 700, y: 400 }, machineId: bench.id } })
    expect(res.status).toBe(400)
    expect(res.body.data.issues).toEqual([{ path: 'travel.x', message: expect.stringMatching(/^X needs 700\.00 mm of travel, 80\.00 mm more than the machine travel of 620\.00 mm/) }])
    // 650 mm of Y on the same 620 mm travel names Y instead.
    const deep = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...MM_PLAN, area: { x: 600, y: 650 }, overhang: 0, machineId: bench.id } })
    expect(deep.status).toBe(400)
    expect(deep.body.data.issues.map((i: any) => i.path)).toEqual(['travel.y'])
    expect(await planCount()).toBe(before)
  })

  it('answers 404 for another shop\'s machine or run, and for an unknown run', async () => {
    const before = await planCount()
    for (const extra of [{ machineId: other.machineId }, { runId: other.runId }, { runId: uuidv7() }]) {
      const res = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...MM_PLAN, ...extra } })
      expect(res.status, JSON.stringify(extra)).toBe(404)
      expect(res.text).not.toContain('Other Router')
    }
    expect(await planCount()).toBe(before)
  })

  it('needs a session', async () => {
    expect((await call('POST', '/api/plans/surfacing', { body: MM_PLAN })).status).toBe(401)
  })
})

const MACHINE = {
  travelXMm: 800, travelYMm: 800, travelZMm: 100, units: 'mm', spindleKind: 'air-spindle', hasLengthSensor: true,
  spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
}
const issuesOf = (res: { body: any }) => res.body.data.issues as { path: string, message: string }[]

describe('surfacing program order, passes, milling, dwell and cutters', () => {
  it('lifts to safe Z and moves over the start point before the spindle starts', async () => {
    const res = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: MM_PLAN })
    const program = blocks(res.body.gcode)
    const m3 = program.findIndex(l => /^S\d+ M3$/.test(l))
    // G0 Z5 and G0 X0 Y0 after the modes, then M3 and the spin-up dwell, then the plunge.
    expect(program.slice(m3 - 2, m3 + 3)).toEqual(['G0 Z5.000', 'G0 X0.000 Y0.000', 'S16000 M3', 'G4 P5', 'G1 Z-0.500 F500'])
    expect(program.slice(0, m3 - 2).every(l => !/[XYZ]/.test(l))).toBe(true)
  })

  it('answers 400 on finishingPass.depth for a finishing pass deeper than a pass, or one that leaves too thin a roughing cut', async () => {
    const before = await planCount()
    const deeper = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...MM_PLAN, totalDepth: 1, depthPerPass: 0.2, finishingPass: { depth: 0.5 } } })
    expect(deeper.status).toBe(400)
    expect(issuesOf(deeper)).toEqual([{ path: 'finishingPass.depth', message: expect.stringMatching(/deeper than the depth per pass of 0\.20 mm/) }])
    const thin = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...MM_PLAN, totalDepth: 0.5, depthPerPass: 0.5, finishingPass: { depth: 0.4999 } } })
    expect(thin.status).toBe(400)
    expect(issuesOf(thin)).toEqual([{ path: 'finishingPass.depth', message: expect.stringMatching(/leaves only 0\.0001 mm for roughing, too thin to cut/) }])
    expect(thin.text).not.toContain('Z0.000')
    expect(await planCount()).toBe(before)
  })

  it('cuts one-way climb or conventional as asked, and refuses a milling choice for zigzag', async () => {
    const cookie = await as('operator')
    // Lines along X: climb runs towards -X (stock at +Y is then right of travel), conventional towards +X.
    for (const [milling, firstCut] of [['climb', 'G1 X0.000 F2500'], ['conventional', 'G1 X600.000 F2500']] as const) {
      const res = await call('POST', '/api/plans/surfacing', { cookie, body: { ...MM_PLAN, pattern: 'one-way', milling } })
      expect(res.status, res.text).toBe(201)
      expect(res.body.plan.milling).toBe(milling)
      expect(res.body.gcode).toContain(`(Milling ${milling} on every line`)
      const program = blocks(res.body.gcode)
      expect(program[program.findIndex(l => l.startsWith('G1 Z')) + 1]).toBe(firstCut)
    }
    const zigzag = await call('POST', '/api/plans/surfacing', { cookie, body: { ...MM_PLAN, milling: 'climb' } })
    expect(zigzag.status).toBe(400)
    expect(issuesOf(zigzag).map(i => i.path)).toEqual(['milling'])
  })

  it('writes G4 P in seconds or in milliseconds by the machine\'s setting, and the machine keeps it', async () => {
    const owner = await as('owner')
    const made = await call('POST', '/api/machines', { cookie: owner, body: { ...MACHINE, name: `Dwell Router ${Date.now()}`, dwellUnit: 'milliseconds' } })
    expect(made.status, made.text).toBe(201)
    expect(made.body.dwellUnit).toBe('milliseconds')
    const plan = () => call('POST', '/api/plans/surfacing', { cookie: owner, body: { ...MM_PLAN, area: { x: 300, y: 300 }, machineId: made.body.id } })
    const ms = await plan()
    expect(blocks(ms.body.gcode)).toContain('G4 P5000')
    expect(ms.body.gcode).toContain('written as G4 P in milliseconds')
    const patched = await call('PATCH', `/api/machines/${made.body.id}`, { cookie: owner, body: { dwellUnit: 'seconds' } })
    expect(patched.body.dwellUnit).toBe('seconds')
    const s = await plan()
    expect(blocks(s.body.gcode)).toContain('G4 P5')
    expect(blocks(s.body.gcode)).not.toContain('G4 P5000')
    const bad = await call('PATCH', `/api/machines/${made.body.id}`, { cookie: owner, body: { dwellUnit: 'minutes' } })
    expect(bad.status).toBe(400)
    expect(issuesOf(bad).map(i => i.path)).toEqual(['dwellUnit'])
  })

  it('takes the rated speed from the shop\'s cutter: above it is a WARNING in the answer and the program header', async () => {
    const trainer = await as('trainer')
    const tool = await call('POST', '/api/tools', { cookie: trainer, body: { name: `Plan test cutter ${Date.now()}`, kind: 'surfacing', diameterMm: 25.4, flutes: 2, cornerRadiusMm: 0, maxRpm: 12000 } })
    expect(tool.status, tool.text).toBe(201)
    // The body's own maxRpm is overruled by the shop's list.
    const res = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...MM_PLAN, toolId: tool.body.id, cutter: { diameter: 25.4, flutes: 2, maxRpm: 60000 } } })
    expect(res.status, res.text).toBe(201)
    expect(res.body.warnings).toEqual([{ path: 'rpm', signal: 'WARNING', message: expect.stringMatching(/^Spindle speed 16000 rpm is above the cutter's maximum of 12000 rpm/) }])
    expect(res.body.gcode).toMatch(/\n\(WARNING: Spindle speed 16000 rpm is above the cutter's maximum of 12000 rpm/)
    const slow = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...MM_PLAN, rpm: 12000, toolId: tool.body.id } })
    expect(slow.body.warnings).toEqual([])
    expect(slow.body.gcode).not.toContain('WARNING')
    const [theirs] = await db().query<any>('insert into tools (shop_id, name, kind, diameter_mm, flutes, max_rpm) values (?, ?, ?, ?, ?, ?)', [other.shopId, 'Other cutter', 'surfacing', 25.4, 2, 18000])
    const foreign = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: { ...MM_PLAN, toolId: theirs.insertId } })
    expect(foreign.status).toBe(404)
    expect(foreign.text).not.toContain('Other cutter')
  })

  it('writes a plan stored before the rename (warmupSeconds) again with its spin-up dwell', async () => {
    const made = await call('POST', '/api/plans/surfacing', { cookie: await as('operator'), body: MM_PLAN })
    const { spinUpSeconds, ...old } = MM_PLAN
    await db().query('update surfacing_plans set input = ? where id = ?', [JSON.stringify({ ...old, warmupSeconds: spinUpSeconds }), made.body.planId])
    const got = await call('GET', `/api/plans/${made.body.planId}`, { cookie: await as('operator') })
    expect(got.status, got.text).toBe(200)
    expect(blocks(got.body.gcode)).toContain('G4 P5')
  })
})
