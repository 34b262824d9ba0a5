import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { planSurfacing, type SurfacingPlan } from '../../../shared/machining/surfacing'
import { surfacingGcode } from '../../../shared/machining/gcode'
import { checkTravel } from '../../../shared/machining/travel'
import type { SurfacingInput } from '../../../shared/machining/surfacing-input'
import { readProgram, rs274Problems, type Segment } from './program-check'

// Random but realistic plans, drawn in mm and converted for inch plans.
const inputs = fc.record({
  units: fc.constantFrom('mm' as const, 'in' as const),
  x: fc.double({ min: 20, max: 400, noNaN: true }),
  y: fc.double({ min: 20, max: 400, noNaN: true }),
  diameter: fc.double({ min: 3, max: 32, noNaN: true }),
  flutes: fc.integer({ min: 1, max: 4 }),
  stepoverPct: fc.double({ min: 25, max: 100, noNaN: true }),
  overhang: fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: undefined }),
  totalDepth: fc.double({ min: 0.05, max: 1.5, noNaN: true }),
  passes: fc.double({ min: 1, max: 3.5, noNaN: true }),
  finishing: fc.option(fc.double({ min: 0.05, max: 0.5, noNaN: true }), { nil: undefined }),
  feed: fc.double({ min: 300, max: 8000, noNaN: true }),
  plunge: fc.double({ min: 50, max: 1000, noNaN: true }),
  rpm: fc.integer({ min: 6000, max: 24000 }),
  direction: fc.constantFrom('x' as const, 'y' as const),
  pattern: fc.constantFrom('zigzag' as const, 'one-way' as const),
  safeZ: fc.double({ min: 1, max: 25, noNaN: true }),
  warmupSeconds: fc.option(fc.integer({ min: 0, max: 20 }), { nil: undefined }),
}).map((r): SurfacingInput => {
  const k = r.units === 'mm' ? 1 : 1 / 25.4
  const finishing = r.finishing === undefined ? undefined : { depth: r.finishing * r.totalDepth * k }
  const roughing = r.totalDepth - (finishing ? r.finishing! * r.totalDepth : 0)
  return {
    units: r.units,
    area: { x: r.x * k, y: r.y * k },
    cutter: { diameter: r.diameter * k, flutes: r.flutes },
    stepoverPct: r.stepoverPct,
    overhang: r.overhang === undefined ? undefined : r.overhang * r.diameter * k,
    totalDepth: r.totalDepth * k,
    depthPerPass: Math.min(roughing / r.passes, r.diameter / 2) * k,
    finishingPass: finishing,
    feed: r.feed * k,
    plunge: r.plunge * k,
    rpm: r.rpm,
    direction: r.direction,
    pattern: r.pattern,
    safeZ: r.safeZ * k,
    warmupSeconds: r.warmupSeconds,
  }
})

// Property runs read back hundreds of programs; give them room on a busy machine.
const PROPERTY_TIMEOUT = 60_000

function planOf(input: SurfacingInput): SurfacingPlan {
  const r = planSurfacing(input)
  if (!r.ok) throw new Error(JSON.stringify(r.issues))
  return r.plan
}

const mm = (plan: SurfacingPlan, v: number) => (plan.units === 'mm' ? v : v * 25.4)
// Coordinates are written to 0.001 mm or 0.0001 in; allow one written unit of rounding.
const resolutionMm = (plan: SurfacingPlan) => (plan.units === 'mm' ? 0.001 : 0.00254) + 1e-9

function distanceToSegment(px: number, py: number, s: Segment): number {
  const dx = s.to.x - s.from.x
  const dy = s.to.y - s.from.y
  const len2 = dx * dx + dy * dy
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((px - s.from.x) * dx + (py - s.from.y) * dy) / len2))
  return Math.hypot(px - (s.from.x + t * dx), py - (s.from.y + t * dy))
}

describe('surfacing programs read back by an independent G-code toolpath library', () => {
  it('cover every sampled point of the area within the cutter radius at the final depth', () => {
    fc.assert(fc.property(inputs, fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 20, maxLength: 60 }), (input, randomPoints) => {
      const plan = planOf(input)
      const { segments } = readProgram(surfacingGcode(plan))
      const finalZ = mm(plan, -plan.input.totalDepth)
      const tol = resolutionMm(plan)
      const finalCuts = segments.filter(s => s.motion === 'G1' && Math.abs(s.from.z - finalZ) <= tol && Math.abs(s.to.z - finalZ) <= tol)
      expect(finalCuts.length).toBeGreaterThan(0)
      const w = mm(plan, plan.input.area.x)
      const h = mm(plan, plan.input.area.y)
      const radius = mm(plan, plan.cutterRadius)
      // A 13 x 13 grid (corners and edges included) plus random points.
      const grid = Array.from({ length: 169 }, (_, k) => [(k % 13) / 12, Math.floor(k / 13) / 12] as [number, number])
      for (const [u, v] of [...grid, ...randomPoints]) {
        const px = u * w
        const py = v * h
        let best = Infinity
        for (const s of finalCuts) {
          best = Math.min(best, distanceToSegment(px, py, s))
          if (best <= radius) break
        }
        expect(best, `point (${px}, ${py}) of ${JSON.stringify(input)}`).toBeLessThanOrEqual(radius + tol)
      }
    }), { numRuns: 60 })
  }, PROPERTY_TIMEOUT)

  it('make every rapid XY move at or above safe Z, plunge at the plunge rate and cut at the feed', () => {
    fc.assert(fc.property(inputs, (input) => {
      const plan = planOf(input)
      const { segments } = readProgram(surfacingGcode(plan))
      const safe = mm(plan, plan.input.safeZ)
      const tol = resolutionMm(plan)
      for (const s of segments) {
        const movesXY = Math.hypot(s.to.x - s.from.x, s.to.y - s.from.y) > 0
        if (s.motion === 'G0' && movesXY) {
          expect(s.from.z).toBeGreaterThanOrEqual(safe - tol)
          expect(s.to.z).toBeGreaterThanOrEqual(safe - tol)
        }
        if (s.motion === 'G1') {
          const plunging = !movesXY && s.to.z < s.from.z
          // F in program units (mm/min or in/min), written to 0.1 mm/min or 0.01 in/min.
          const expected = plunging ? plan.input.plunge : plan.input.feed
          expect(Math.abs(s.feed - expected)).toBeLessThanOrEqual(plan.units === 'mm' ? 0.05 : 0.005)
          expect(s.to.z).toBeLessThanOrEqual(0 + tol)
        }
      }
    }), { numRuns: 80 })
  }, PROPERTY_TIMEOUT)

  it('follow the RS274/NGC line rules and end with the spindle off (NISTIR 6556, REFERENCES §2.C)', () => {
    fc.assert(fc.property(inputs, (input) => {
      const plan = planOf(input)
      const text = surfacingGcode(plan)
      expect(rs274Problems(text)).toEqual([])
      const { modal } = readProgram(text)
      expect(modal.spindle).toBe('M5')
      expect(modal.program).toBe('M30')
      expect(modal.units).toBe(plan.units === 'mm' ? 'G21' : 'G20')
      const coded = text.trim().split('\n').filter(l => l !== '%' && !l.startsWith('('))
      expect(coded.slice(-2)).toEqual(['M5', 'M30'])
    }), { numRuns: 80 })
  }, PROPERTY_TIMEOUT)

  it('stay inside the machine travel exactly when checkTravel says so, and it names the overrun', () => {
    const seen = { inside: 0, outside: 0 }
    fc.assert(fc.property(
      inputs,
      // Room left before and after the motion on each axis, in mm; negative means too little.
      // Half-millimetre offsets keep every case clear of the last written decimal.
      fc.array(fc.integer({ min: -6, max: 39 }).map(k => k + 0.5), { minLength: 6, maxLength: 6 }),
      (input, room) => {
        const plan = planOf(input)
        const { segments } = readProgram(surfacingGcode(plan))
        const tol = resolutionMm(plan)
        const pts = segments.flatMap(s => [s.from, s.to]).slice(1) // the first point is the library's assumed start
        const lo = { x: Math.min(...pts.map(p => p.x)), y: Math.min(...pts.map(p => p.y)), z: Math.min(...pts.map(p => p.z)) }
        const hi = { x: Math.max(...pts.map(p => p.x)), y: Math.max(...pts.map(p => p.y)), z: Math.max(...pts.map(p => p.z)) }
        const [bx, ax, by, ay, top, bottom] = room as [number, number, number, number, number, number]
        const travel = {
          travelXMm: bx + (hi.x - lo.x) + ax,
          travelYMm: by + (hi.y - lo.y) + ay,
          travelZMm: top + (hi.z - lo.z) + bottom,
        }
        // Machine X/Y run 0..travel from home; Z runs from 0 at the top down to -travel.
        const workZeroMm = { x: bx - lo.x, y: by - lo.y, z: -top - hi.z }
        // Overrun on each side of each axis (positive = past the end), measured on the read-back program.
        const sides = { x: [-bx, -ax], y: [-by, -ay], z: [-top, -bottom] }
        expect(Object.values(sides).flat().every(o => Math.abs(o) > 2 * tol)).toBe(true)
        const report = checkTravel(plan, { ...travel, workZeroMm })
        expect(report.ok).toBe(Object.values(sides).flat().every(o => o < 0))
        seen[report.ok ? 'inside' : 'outside']++
        for (const axis of ['x', 'y', 'z'] as const) {
          const expected = sides[axis].filter(o => o > 0).sort((p, q) => p - q)
          const found = report.issues.filter(i => i.axis === axis).map(i => mm(plan, i.excess)).sort((p, q) => p - q)
          expect(found).toHaveLength(expected.length)
          found.forEach((excess, k) => expect(Math.abs(excess - expected[k]!)).toBeLessThanOrEqual(tol))
        }
        for (const issue of report.issues) {
          expect(issue.path).toBe(`travel.${issue.axis}`)
          expect(issue.message).toMatch(new RegExp(`^${issue.axis.toUpperCase()} goes `))
        }
      },
    ), { numRuns: 80 })
    // Both outcomes must actually occur for the check to mean anything.
    expect(seen.inside).toBeGreaterThan(5)
    expect(seen.outside).toBeGreaterThan(5)
  }, PROPERTY_TIMEOUT)
})

describe('the line-rule checker itself catches broken programs (NISTIR 6556 examples, REFERENCES §2.C)', () => {
  const good = ['%', 'G21', 'G90', 'G17', 'G94', 'S18000 M3', 'G0 Z5', 'G1 Z-0.5 F500', 'G1 X10', 'G0 Z5', 'M5', 'M30', '%'].join('\n')
  it('passes a well-formed program', () => {
    expect(rs274Problems(good)).toEqual([])
  })
  it.each([
    ['G0 G1 X1', 'two G words from one modal group'],
    ['G20 G21', 'two G words from one modal group'],
    ['G90 G91', 'two G words from one modal group'],
    ['G17 G18', 'two G words from one modal group'],
    ['M3 M5', 'two M words from one modal group'],
    ['G1 F1000', 'motion without an axis word'],
    ['G1 X1 X2', 'a word letter repeats'],
  ])('flags "%s"', (line, problem) => {
    const text = good.replace('G1 X10', line)
    expect(rs274Problems(text).join('\n')).toContain(problem)
  })
  it('accepts M5 and M2 on one line (groups 7 and 4)', () => {
    expect(rs274Problems(good.replace('G1 X10', 'G1 X10\nM5 M2')).join('\n')).not.toContain('modal group')
  })
  it('flags a missing spindle stop, a late units word, and a cut before the spindle starts', () => {
    expect(rs274Problems(good.replace('M5\n', ''))).toContainEqual(expect.stringContaining('not M5 then M30'))
    expect(rs274Problems(good.replace('G1 X10', 'G1 X10\nG20'))).toContainEqual(expect.stringContaining('units set after motion'))
    expect(rs274Problems(good.replace('S18000 M3', 'S18000'))).toContainEqual(expect.stringContaining('spindle off'))
  })
})

describe('program text', () => {
  const base: SurfacingInput = {
    units: 'mm', area: { x: 600, y: 400 }, cutter: { diameter: 25.4, flutes: 2 }, stepoverPct: 70,
    totalDepth: 0.5, depthPerPass: 0.5, feed: 3000, plunge: 500, rpm: 18000, direction: 'x',
    pattern: 'zigzag', safeZ: 5,
  }
  const text = surfacingGcode(planOf(base))
  const lines = text.trim().split('\n')

  it('opens with a parenthesised header naming the plan, then sets the modes one group per line', () => {
    const header = lines.slice(1, lines.indexOf('G21'))
    expect(header.every(l => /^\([^()]*\)$/.test(l))).toBe(true)
    expect(header.join(' ')).toContain('Area X 600.000 by Y 400.000')
    expect(header.join(' ')).toContain('24 lines along X, zigzag')
    expect(header.join(' ')).toContain('spindle 18000 rpm')
    expect(lines.slice(lines.indexOf('G21'), lines.indexOf('G21') + 6)).toEqual(['G21', 'G90', 'G17', 'G94', 'G54', 'S18000 M3'])
  })

  it('follows the REFERENCES §2.C skeleton: retract, rapid to the corner, plunge at the plunge rate, cut at the feed', () => {
    const start = lines.indexOf('S18000 M3') + 1
    expect(lines.slice(start, start + 6)).toEqual(['G0 Z5.000', 'G0 X0.000 Y0.000', 'G1 Z-0.500 F500', 'G1 X600.000 F3000', 'G1 Y17.391', 'G1 X0.000'])
    expect(lines.slice(-4)).toEqual(['G0 Z5.000', 'M5', 'M30', '%'])
  })

  it('writes inch programs with G20 and four decimals, and a G4 dwell for the warm-up', () => {
    const inch = surfacingGcode(planOf({ ...base, units: 'in', area: { x: 24, y: 16 }, cutter: { diameter: 1, flutes: 2 }, totalDepth: 0.02, depthPerPass: 0.02, feed: 120, plunge: 20, safeZ: 0.2, warmupSeconds: 90 }))
    expect(inch).toContain('\nG20\n')
    expect(inch).not.toContain('G21')
    expect(inch).toContain('\nG4 P90\n')
    expect(inch).toContain('\nG1 Z-0.0200 F20\n')
    expect(inch).toContain('\nG1 Y0.6957\n')
  })
})
