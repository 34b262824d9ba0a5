// Every bad planner input gets its field path and a plain-words reason (Jogwise rule).
import { describe, expect, it } from 'vitest'
import { planSurfacing } from '../../../shared/machining/surfacing'
import type { SurfacingInput } from '../../../shared/machining/surfacing-input'
import { SurfacingInputSchema } from '../../../shared/machining/surfacing-input'

const good: SurfacingInput = {
  units: 'mm', area: { x: 600, y: 400 }, cutter: { diameter: 25.4, flutes: 2 }, stepoverPct: 70,
  totalDepth: 0.5, depthPerPass: 0.25, feed: 3000, plunge: 500, rpm: 18000, direction: 'x',
  pattern: 'zigzag', safeZ: 5,
}

describe('surfacing input validation', () => {
  it('accepts a sensible plan, also through the exported schema', () => {
    expect(planSurfacing(good).ok).toBe(true)
    expect(SurfacingInputSchema.safeParse(good).success).toBe(true)
  })

  it('refuses a field it does not know instead of ignoring it', () => {
    const result = planSurfacing({ ...good, stepover: 40 } as SurfacingInput)
    expect(result.ok).toBe(false)
    if (!result.ok) expect(result.issues.map(i => i.message).join(' ')).toMatch(/stepover/)
    const nested = SurfacingInputSchema.safeParse({ ...good, cutter: { diameter: 25.4, flutes: 2, helix: 30 } })
    expect(nested.success).toBe(false)
  })

  it.each([
    ['units', { units: 'cm' }, 'Units must be \'mm\' or \'in\'.'],
    ['area.x', { area: { x: 0, y: 400 } }, 'Area X must be more than 0.'],
    ['area.y', { area: { x: 600, y: -5 } }, 'Area Y must be more than 0.'],
    ['area.y', { area: { x: 600, y: '400' } }, 'Area Y must be a number.'],
    ['area.x', { area: { x: Number.POSITIVE_INFINITY, y: 400 } }, 'Area X must be a number.'],
    ['area', { area: undefined }, 'Give the area as its X and Y sizes.'],
    ['area.x', { area: { x: 20000, y: 400 } }, 'Area X of 20000.00 mm is larger than any router bed (at most 10000.00 mm).'],
    ['cutter.diameter', { cutter: { diameter: 0, flutes: 2 } }, 'Cutter diameter must be more than 0.'],
    ['cutter.flutes', { cutter: { diameter: 25.4, flutes: 1.5 } }, 'Flutes must be a whole number.'],
    ['cutter.flutes', { cutter: { diameter: 25.4, flutes: 0 } }, 'A cutter has at least 1 flute.'],
    ['stepoverPct', { stepoverPct: 0 }, 'Stepover must be more than 0.'],
    ['stepoverPct', { stepoverPct: -10 }, 'Stepover must be more than 0.'],
    ['stepoverPct', { stepoverPct: 100.5 }, 'Stepover cannot be more than 100 % of the cutter diameter, or strips between lines stay uncut.'],
    ['stepoverPct', { stepoverPct: 1, area: { x: 10000, y: 10000 }, cutter: { diameter: 20, flutes: 2 } }, 'This stepover needs 50001 raster lines per pass (at most 20000); raise the stepover or use a larger cutter.'],
    ['overhang', { overhang: -1 }, 'Overhang cannot be negative: the cutter centre must reach every edge of the area.'],
    ['totalDepth', { totalDepth: 0 }, 'Total depth must be more than 0.'],
    ['depthPerPass', { depthPerPass: 0 }, 'Depth per pass must be more than 0.'],
    // Common practice, no published source: no deeper than half the cutter diameter per pass.
    ['depthPerPass', { totalDepth: 20, depthPerPass: 13 }, 'Depth per pass of 13.00 mm is more than half the cutter diameter (12.70 mm), too deep for one pass.'],
    ['depthPerPass', { totalDepth: 50, depthPerPass: 0.05 }, 'This depth per pass needs 1000 passes (at most 500); cut deeper per pass or less in total.'],
    ['depthPerPass', { totalDepth: 10, depthPerPass: 0.015 }, 'This depth per pass needs 667 passes (at most 500); cut deeper per pass or less in total.'],
    ['finishingPass.depth', { finishingPass: { depth: 0.5 } }, 'Finishing depth of 0.50 mm must be less than the total depth of 0.50 mm.'],
    ['finishingPass.depth', { finishingPass: { depth: 0.8 } }, 'Finishing depth of 0.80 mm must be less than the total depth of 0.50 mm.'],
    ['finishingPass.depth', { finishingPass: { depth: 0 } }, 'Finishing depth must be more than 0.'],
    // A finishing pass is the lightest cut; today's trap: total 1.0, 0.2 per pass, finishing 0.5.
    ['finishingPass.depth', { totalDepth: 1, depthPerPass: 0.2, finishingPass: { depth: 0.5 } }, 'Finishing depth of 0.50 mm is deeper than the depth per pass of 0.20 mm; a finishing pass is the lightest cut.'],
    // MIN_CUT_MM (common practice, no published source): a 0.0001 mm roughing pass would print at Z0.000.
    ['finishingPass.depth', { totalDepth: 0.5, depthPerPass: 0.5, finishingPass: { depth: 0.4999 } }, 'Finishing depth of 0.4999 mm leaves only 0.0001 mm for roughing, too thin to cut (at least 0.010 mm); turn the finishing pass off or make it at most 0.490 mm.'],
    ['milling', { milling: 'climb' }, 'Zigzag alternates climb and conventional from line to line; choose one-way to cut every line the same way.'],
    ['milling', { pattern: 'one-way', milling: 'down' }, 'Milling must be \'climb\' or \'conventional\'.'],
    ['area.x', { area: { x: 0.5, y: 400 } }, 'Area X of 0.50 mm is too small to face (at least 1.00 mm).'],
    ['cutter.diameter', { cutter: { diameter: 0.2, flutes: 1 } }, 'Cutter diameter of 0.20 mm is too small for facing (at least 0.50 mm).'],
    ['cutter.maxRpm', { cutter: { diameter: 25.4, flutes: 2, maxRpm: 100 } }, 'Cutter maximum speed must be at least 1000 rpm.'],
    ['safeZ', { safeZ: 0.2 }, 'Safe Z of 0.20 mm does not clear the board (at least 0.50 mm above the surface).'],
    ['depthPerPass', { depthPerPass: 0.005 }, 'Depth per pass of 0.005 mm is too thin to cut (at least 0.010 mm).'],
    ['totalDepth', { totalDepth: 0.005 }, 'Total depth of 0.005 mm is too thin to cut (at least 0.010 mm).'],
    ['rpm', { rpm: 500 }, 'Spindle speed must be at least 1000 rpm.'],
    ['stepoverPct', { stepoverPct: 0.5 }, 'Stepover must be at least 1 % of the cutter diameter.'],
    ['spinUpSeconds', { spinUpSeconds: 600 }, 'Spin-up dwell cannot be more than 120 s; the spindle warm-up belongs to the start-up procedure.'],
    ['feed', { feed: 0 }, 'Feed must be more than 0.'],
    ['feed', { feed: 0.5 }, 'Feed of 0.5 mm/min is too slow to be real (at least 1 mm/min).'],
    ['plunge', { plunge: -100 }, 'Plunge rate must be more than 0.'],
    ['rpm', { rpm: 0 }, 'Spindle speed must be more than 0.'],
    ['rpm', { rpm: 90000 }, 'Spindle speed cannot be more than 60000 rpm.'],
    ['direction', { direction: 'z' }, 'Direction must be \'x\' (lines along X) or \'y\' (lines along Y).'],
    ['pattern', { pattern: 'spiral' }, 'Pattern must be \'zigzag\' or \'one-way\'.'],
    ['safeZ', { safeZ: 0 }, 'Safe Z must be more than 0.'],
    ['spinUpSeconds', { spinUpSeconds: -1 }, 'Spin-up dwell cannot be negative.'],
    ['machineId', { machineId: 1.5 }, 'Machine id must be a whole number.'],
    ['runId', { runId: '' }, 'Run id cannot be empty.'],
  ])('%s: %j', (path, over, message) => {
    const r = planSurfacing({ ...good, ...over })
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.issues).toContainEqual({ path, message })
  })

  it('names inch limits in inches', () => {
    const r = planSurfacing({ ...good, units: 'in', area: { x: 24, y: 16 }, cutter: { diameter: 1, flutes: 2 }, totalDepth: 1, depthPerPass: 0.75, feed: 100, plunge: 20, safeZ: 0.2 })
    expect(r).toEqual({ ok: false, issues: [{ path: 'depthPerPass', message: 'Depth per pass of 0.7500 in is more than half the cutter diameter (0.5000 in), too deep for one pass.' }] })
  })

  it('reports every field problem at once, and bad machine settings by their option name', () => {
    const r = planSurfacing({ ...good, feed: 0, plunge: 0, safeZ: -1 })
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.issues.map(i => i.path)).toEqual(['feed', 'plunge', 'safeZ'])
    expect(planSurfacing(good, { accelMmS2: 0 })).toEqual({ ok: false, issues: [{ path: 'options.accelMmS2', message: 'Machine acceleration must be a number more than 0.' }] })
  })

  it('answers a non-object with an issue, not an exception', () => {
    expect(planSurfacing(null)).toMatchObject({ ok: false, issues: [{ path: '' }] })
    expect(planSurfacing('plan')).toMatchObject({ ok: false })
  })
})
