// Convention under test (Jogwise's own, see shared/machining/surfacing.ts): overhang is how far
// the cutter CENTRE runs past each edge of the area. With overhang 0 the centre covers X 0..L
// and Y 0..W, which is convention A of our hand calculation (n = ceil(W/s) + 1 lines of length L,
// joined by zigzag stepovers; plunges, retracts and rapids are not cutting length).
import { describe, expect, it } from 'vitest'
import { planSurfacing, summarizeSurfacing, type SurfacingPlan } from '../../../shared/machining/surfacing'
import { moveSeconds } from '../../../shared/machining/motion'
import { convertVolume } from '../../../shared/machining/units'
import type { SurfacingInput } from '../../../shared/machining/surfacing-input'
import { surfacingPreview } from '../../../shared/machining/preview'

const base: SurfacingInput = {
  units: 'mm',
  area: { x: 600, y: 400 },
  cutter: { diameter: 25.4, flutes: 2 },
  stepoverPct: 70,
  totalDepth: 0.5,
  depthPerPass: 0.5,
  feed: 3000,
  plunge: 500,
  rpm: 12000,
  direction: 'x',
  pattern: 'zigzag',
  safeZ: 5,
}

function plan(over: Partial<SurfacingInput> = {}, options = {}): SurfacingPlan {
  const r = planSurfacing({ ...base, ...over }, options)
  if (!r.ok) throw new Error(JSON.stringify(r.issues))
  return r.plan
}

// Acceleration so large the ramps vanish: time = length / feed, as the hand-calculated plan assumes.
const NO_RAMPS = { accelMmS2: 1e15 }

describe('worked plan, convention A (hand calculation)', () => {
  const p = plan({}, NO_RAMPS)
  it.each([
    ['lines', p.lineCount, 24],
    ['actual spacing 400/23 mm', p.stepover.actual, 17.3913043],
    ['cutting path 24·600 + 400 mm', p.lengths.cutting, 14800],
    ['cutting time @3000 mm/min in minutes', p.time.cutting / 60, 4.9333333],
    ['removed volume 600·400·0.5 mm³', p.removedVolume, 120000],
    ['chip load 3000/(2·12000) mm (1.5)', p.chipLoad, 0.125],
    ['surface speed at 12000 rpm, D 25.4 m/min (hand calculation, π·D·n/1000)', p.surfaceSpeed, 957.5574],
  ])('%s', (_label, actual, expected) => {
    expect(actual).toBeCloseTo(expected, 4)
  })

  it('never exceeds the requested stepover', () => {
    expect(p.stepover.actual).toBeLessThanOrEqual(p.stepover.requested)
    // One line fewer would need a spacing above the request.
    expect(400 / (p.lineCount - 2)).toBeGreaterThan(p.stepover.requested)
  })

  it('is the same along Y with the axes swapped', () => {
    const q = plan({ area: { x: 400, y: 600 }, direction: 'y' }, NO_RAMPS)
    expect(q.lineCount).toBe(24)
    expect(q.lengths.cutting).toBeCloseTo(14800, 6)
    expect(q.rasterAxis).toBe('y')
  })
})

describe('worked plan, inch variant (hand calculation)', () => {
  const p = plan({
    units: 'in', area: { x: 24, y: 16 }, cutter: { diameter: 1, flutes: 2 }, totalDepth: 0.02,
    depthPerPass: 0.02, feed: 120, plunge: 20, safeZ: 0.2,
  }, NO_RAMPS)
  it.each([
    ['lines', p.lineCount, 24],
    ['spacing in', p.stepover.actual, 0.695652],
    ['cutting path in', p.lengths.cutting, 592],
    ['minutes @120 in/min', p.time.cutting / 60, 4.933333],
    ['volume in³', p.removedVolume, 7.68],
    ['volume cm³', convertVolume(p.removedVolume, 'in', 'mm') / 1000, 125.85],
  ])('%s', (_label, actual, expected) => {
    expect(actual).toBeCloseTo(expected, 2)
  })
  it('reports surface speed in SFM (V = π·D·N/12: 12000 rpm on a 1 in cutter is 1000π SFM)', () => {
    expect(p.surfaceSpeedUnit).toBe('SFM')
    expect(p.surfaceSpeed).toBeCloseTo(1000 * Math.PI, 6)
  })
})

describe('floating-point pitfall of the worked plan (IEEE 754 double, hand calculation)', () => {
  it('0.7 × 25.4 is not 17.78 in binary floating point, so a naive ceil over-counts', () => {
    expect(0.7 * 25.4).not.toBe(17.78)
    expect(Math.ceil(355.6 / (0.7 * 25.4))).toBe(21)
  })
  // Exactly, s = 889/50 mm and W/s is a whole number: W/s gaps, W/s + 1 lines.
  it.each([
    [177.8, 10],
    [355.6, 20],
    [533.4, 30],
    [711.2, 40],
  ])('W = %d mm needs %d gaps of exactly 17.78 mm', (w, gaps) => {
    const p = plan({ area: { x: 600, y: w } })
    expect(p.lineCount).toBe(gaps + 1)
    expect(p.stepover.actual).toBeCloseTo(17.78, 9)
    expect(p.stepover.actual).toBeLessThanOrEqual(p.stepover.requested * (1 + 1e-9))
  })
  it('splits 0.9 mm into 3 passes of 0.3 mm, not 4 (0.9/0.3 = 3.0000000000000004)', () => {
    const p = plan({ totalDepth: 1, depthPerPass: 0.3, finishingPass: { depth: 0.1 } })
    expect(p.passes.map(x => x.depth)).toEqual([expect.closeTo(0.3, 12), expect.closeTo(0.3, 12), expect.closeTo(0.3, 12), 0.1])
  })
})

describe('passes', () => {
  it.each([
    // Equal roughing passes no deeper than asked, finishing pass last (Jogwise rule).
    [{ totalDepth: 1, depthPerPass: 0.3 }, [0.25, 0.25, 0.25, 0.25], [-0.25, -0.5, -0.75, -1]],
    [{ totalDepth: 0.5, depthPerPass: 0.5 }, [0.5], [-0.5]],
    [{ totalDepth: 0.6, depthPerPass: 0.25, finishingPass: { depth: 0.1 } }, [0.25, 0.25, 0.1], [-0.25, -0.5, -0.6]],
    [{ totalDepth: 0.6, depthPerPass: 0.5, finishingPass: { depth: 0.05 } }, [0.275, 0.275, 0.05], [-0.275, -0.55, -0.6]],
  ] as [Partial<SurfacingInput>, number[], number[]][])('%j', (over, depths, levels) => {
    const p = plan(over)
    p.passes.forEach((pass, i) => {
      expect(pass.depth).toBeCloseTo(depths[i]!, 12)
      expect(pass.z).toBeCloseTo(levels[i]!, 12)
      expect(pass.depth).toBeLessThanOrEqual(p.input.depthPerPass + 1e-12)
    })
    expect(p.passes).toHaveLength(depths.length)
    expect(p.passes.at(-1)!.z).toBe(-p.input.totalDepth)
    expect(p.passes.at(-1)!.finishing).toBe(over.finishingPass !== undefined)
  })
})

describe('layout and coverage geometry', () => {
  it('runs the cutter centre `overhang` past every edge and sweeps a further radius', () => {
    const p = plan({ overhang: 5 })
    expect(p.centreBounds).toEqual({ minX: -5, minY: -5, maxX: 605, maxY: 405 })
    expect(p.sweptBounds).toEqual({ minX: -17.7, minY: -17.7, maxX: 617.7, maxY: 417.7 })
    expect(p.linePositions[0]).toBe(-5)
    expect(p.linePositions.at(-1)).toBe(405)
  })

  // Common practice, no published source: at the same stepover fraction a 25.4 mm surfacing
  // cutter needs about a quarter of the raster lines of a 6.35 mm end mill on the same board.
  it.each([40, 50, 70])('a 25.4 mm cutter needs about 1/4 of the lines of a 6.35 mm one at %i %% stepover', (pct) => {
    const board = { area: { x: 2440, y: 1220 }, stepoverPct: pct, depthPerPass: 0.5 }
    const big = plan({ ...board, cutter: { diameter: 25.4, flutes: 2 } })
    const small = plan({ ...board, cutter: { diameter: 6.35, flutes: 2 } })
    const ratio = big.lineCount / small.lineCount
    expect(ratio).toBeGreaterThan(0.22)
    expect(ratio).toBeLessThan(0.28)
  })

  it('one-way cuts every line in the same direction and returns at safe Z', () => {
    const p = plan({ pattern: 'one-way' })
    const cuts = p.moves.filter(m => m.kind === 'cut')
    expect(cuts).toHaveLength(24)
    expect(cuts.every(m => m.x === 600)).toBe(true)
    expect(p.moves.filter(m => m.kind === 'step')).toHaveLength(0)
    expect(p.lengths.cutting).toBeCloseTo(24 * 600, 9)
    for (const m of p.moves.filter(m => m.kind === 'rapid')) expect(m.z).toBe(5)
  })

  it('zigzag starts each later pass where the last one ended, without a rapid', () => {
    const p = plan({ totalDepth: 1, depthPerPass: 0.5 })
    expect(p.moves.filter(m => m.kind === 'rapid')).toHaveLength(1)
    expect(p.moves.filter(m => m.kind === 'plunge')).toHaveLength(2)
  })
})

describe('time estimate with acceleration (trapezoidal profile)', () => {
  // Constant-acceleration kinematics (s = v t, s = a t²/2), COMPUTED: starting and ending at
  // rest, a long move takes L/v + v/a; a move shorter than v²/a never reaches v and takes 2√(L/a).
  it.each([
    [10, 3000, 500, 10 / 50 + 50 / 500],
    [5, 3000, 500, 0.2],
    [2, 3000, 500, 2 * Math.sqrt(2 / 500)],
    [1000, 5000, 500, 1000 / (5000 / 60) + (5000 / 60) / 500],
    [0, 3000, 500, 0],
  ])('%d mm at %d mm/min with %d mm/s² takes %d s', (length, rate, accel, seconds) => {
    expect(moveSeconds(length, rate, accel)).toBeCloseTo(seconds, 12)
  })

  it('adds v/a for each of the 47 cutting moves of the worked plan (24 lines + 23 stepovers)', () => {
    const fast = plan({}, NO_RAMPS)
    const real = plan({}, { accelMmS2: 500 })
    expect(real.time.cutting - fast.time.cutting).toBeCloseTo(47 * (50 / 500), 6)
  })

  it('makes short moves slower than length/feed and counts the warm-up dwell', () => {
    const p = plan({ area: { x: 20, y: 20 }, cutter: { diameter: 6.35, flutes: 2 }, stepoverPct: 40, depthPerPass: 0.5, spinUpSeconds: 30 })
    // 9 lines of 20 mm (ramps fit: 20/50 + 50/500 s each) and 8 stepovers of 2.5 mm, too short
    // to reach 50 mm/s (2·√(2.5/500) s each); COMPUTED from the two formulas above.
    expect(p.lineCount).toBe(9)
    expect(p.time.cutting).toBeCloseTo(9 * (20 / 50 + 50 / 500) + 8 * 2 * Math.sqrt(2.5 / 500), 9)
    expect(p.time.cutting).toBeGreaterThan(p.lengths.cutting / (3000 / 60) * 1.25)
    expect(p.time.dwell).toBe(30)
    expect(p.time.total).toBeCloseTo(p.time.cutting + p.time.plunge + p.time.rapid + 30, 9)
  })

  it('uses the default 500 mm/s² and 5000 mm/min unless told otherwise', () => {
    expect(plan().settings).toEqual({ accelMmS2: 500, rapidMmMin: 5000, dwellUnit: 'seconds' })
    // One-way returns are 600 mm rapids, long enough for the rate to matter.
    expect(plan({ pattern: 'one-way' }, { rapidMmMin: 10000 }).time.rapid).toBeLessThan(plan({ pattern: 'one-way' }).time.rapid)
  })
})

describe('summary and preview', () => {
  it('summarises the figures a run keeps', () => {
    const p = plan()
    expect(summarizeSurfacing(p)).toMatchObject({ units: 'mm', lineCount: 24, passCount: 1, totalDepth: 0.5 })
  })

  it('gives the preview the area, each line with its swept width, and the stepovers', () => {
    const p = plan()
    const v = surfacingPreview(p)
    expect(v.area).toEqual({ x: 0, y: 0, width: 600, height: 400 })
    expect(v.lines).toHaveLength(24)
    expect(v.lines[0]).toEqual({ index: 0, from: { x: 0, y: 0 }, to: { x: 600, y: 0 }, sweptWidth: 25.4 })
    expect(v.lines[1]!.from).toEqual({ x: 600, y: expect.closeTo(400 / 23, 9) })
    expect(v.links).toHaveLength(23)
    expect(v.bounds).toEqual(p.sweptBounds)
    expect(v.dimensions.map(d => d.text)).toEqual(['600.00 mm', '400.00 mm'])
    // Each link joins the end of one line to the start of the next.
    v.links.forEach((link, i) => {
      expect(link.from).toEqual(v.lines[i]!.to)
      expect(link.to).toEqual(v.lines[i + 1]!.from)
    })
  })
})
