import { describe, expect, it } from 'vitest'
import { planSurfacing, type SurfacingPlan } from '../../../shared/machining/surfacing'
import { checkTravel } from '../../../shared/machining/travel'
import type { SurfacingInput } from '../../../shared/machining/surfacing-input'

// A 610 x 610 mm (24 x 24 in) bed facing a 610 x 400 area with a 25.4 mm cutter and the
// centre running 12.7 mm past each edge. Expected overruns are COMPUTED by hand:
// X moves from -12.7 to 622.7 mm, so 635.4 mm of X travel is needed.
const input: SurfacingInput = {
  units: 'mm', area: { x: 610, y: 400 }, cutter: { diameter: 25.4, flutes: 2 }, stepoverPct: 70,
  overhang: 12.7, totalDepth: 0.5, depthPerPass: 0.5, feed: 3000, plunge: 500, rpm: 18000,
  direction: 'x', pattern: 'zigzag', safeZ: 5,
}
const planOf = (over: Partial<SurfacingInput> = {}): SurfacingPlan => {
  const r = planSurfacing({ ...input, ...over })
  if (!r.ok) throw new Error(JSON.stringify(r.issues))
  return r.plan
}
const machine = { travelXMm: 610, travelYMm: 610, travelZMm: 100 }

describe('checkTravel', () => {
  it('names the axis and the overrun past the far end', () => {
    const r = checkTravel(planOf(), { ...machine, workZeroMm: { x: 12.7, y: 20, z: -50 } })
    expect(r.ok).toBe(false)
    expect(r.issues).toEqual([
      { path: 'travel.x', axis: 'x', excess: expect.closeTo(25.4, 9), message: 'X goes 25.40 mm past the machine travel of 610.00 mm.' },
    ])
  })

  it('names an overrun past the home end, and Z above the top or below the bottom', () => {
    const r = checkTravel(planOf({ area: { x: 500, y: 400 } }), { ...machine, workZeroMm: { x: 5, y: 5, z: -3 } })
    expect(r.issues.map(i => i.message)).toEqual([
      'X goes 7.70 mm past the home end of its travel (below machine X 0).',
      'Y goes 7.70 mm past the home end of its travel (below machine Y 0).',
      'Z goes 2.00 mm above the top of its travel; lower the safe Z or set work zero lower.',
    ])
    const deep = checkTravel(planOf({ area: { x: 500, y: 400 } }), { ...machine, workZeroMm: { x: 20, y: 20, z: -99.7 } })
    expect(deep.issues.map(i => i.message)).toEqual(['Z goes 0.20 mm below the bottom of its travel of 100.00 mm.'])
  })

  it('checks only the size of the motion when work zero is not known', () => {
    const r = checkTravel(planOf(), machine)
    expect(r.issues.map(i => i.message)).toEqual(['X needs 635.40 mm of travel, 25.40 mm more than the machine travel of 610.00 mm.'])
    expect(checkTravel(planOf({ area: { x: 500, y: 400 } }), machine).ok).toBe(true)
  })

  it('reports inch plans in inches', () => {
    const plan = planOf({ units: 'in', area: { x: 24, y: 12 }, cutter: { diameter: 1, flutes: 2 }, overhang: 0.5, totalDepth: 0.02, depthPerPass: 0.02, feed: 120, plunge: 20, safeZ: 0.2 })
    // X spans -0.5..24.5 in = 635 mm on a 610 mm axis: 25 mm = 0.9843 in too long.
    const r = checkTravel(plan, machine)
    expect(r.issues[0]!.message).toBe('X needs 25.0000 in of travel, 0.9843 in more than the machine travel of 24.0157 in.')
    expect(r.issues[0]!.excess).toBeCloseTo(25 / 25.4, 9)
  })

  it('makes planSurfacing fail with the travel issues when a machine is given', () => {
    const r = planSurfacing(input, { machine: { ...machine, workZeroMm: { x: 12.7, y: 20, z: -50 } } })
    expect(r).toEqual({ ok: false, issues: [{ path: 'travel.x', message: 'X goes 25.40 mm past the machine travel of 610.00 mm.' }] })
    const fits = planSurfacing({ ...input, area: { x: 580, y: 400 } }, { machine: { ...machine, workZeroMm: { x: 15, y: 20, z: -50 } } })
    expect(fits.ok).toBe(true)
    if (fits.ok) expect(fits.plan.travel?.ok).toBe(true)
  })
})
