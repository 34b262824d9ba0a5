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
  // Finishing depth as a fraction of the depth per pass (a finishing pass is never deeper).
  finishing: fc.option(fc.double({ min: 0.05, max: 1, noNaN: true }), { nil: undefined }),
  feed: fc.double({ min: 300, max: 8000, noNaN: true }),
  plunge: fc.double({ min: 50, max: 1000, noNaN: true }),
  rpm: fc.integer({ min: 6000, max: 24000 }),
  direction: fc.constantFrom('x' as const, 'y' as const),
  pattern: fc.constantFrom('zigzag' as const, 'one-way' as const),
  milling: fc.constantFrom('climb' as const, 'conventional' as const, undefined),
  safeZ: fc.double({ min: 1, max: 25, noNaN: true }),
  spinUpSeconds: fc.option(fc.integer({ min: 0, max: 20 }), { nil: undefined }),
}).map((r): SurfacingInput => {
  const k = r.units === 'mm' ? 1 : 1 / 25.4
  const depthPerPass = Math.min(r.totalDepth / r.passes, r.diameter / 2)
  // Keep clear of the 0.01 mm thinnest cut, on the finishing pass and on what it leaves.
  const finishingMm = r.finishing === undefined ? undefined : Math.max(0.011, r.finishing * depthPerPass)
  const finishing = finishingMm === undefined || finishingMm > depthPerPass || r.totalDepth - finishingMm < 0.011 ? undefined : finishingMm
  return {
    units: r.units,
    area: { x: r.x * k, y: r.y * k },
    cutter: { diameter: r.diameter * k, flutes: r.flutes },
    stepoverPct: r.stepoverPct,
    overhang: r.overhang === undefined ? undefined : r.overhang * r.diameter * k,
    totalDepth: r.totalDepth * k,
    depthPerPass: depthPerPass * k,
    finishingPass: finishing === undefined ? undefined : { depth: finishing * k },
    feed: r.feed * k,
    plunge: r.plunge * k,
    rpm: r.rpm,
    direction: r.direction,
    pattern: r.pattern,
    milling: r.pattern === 'one-way' ? r.milling : undefined,
    safeZ: r.safeZ * k,
    spinUpSeconds: r.spinUpSeconds,
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
  // Every cutting level, not only the last: a plan that skipped lines on a middle pass would
  // leave ridges its final pass then has to take at full depth.
  it('cover every sampled point of the area within the cutter radius at every cutting level, stepping down no more than the depth per pass', () => {
    fc.assert(fc.property(inputs, fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 20, maxLength: 60 }), (input, randomPoints) => {
      const plan = planOf(input)
      const { segments } = readProgram(surfacingGcode(plan))
      const tol = resolutionMm(plan)
      const cuts = segments.filter(s => s.motion === 'G1' && Math.abs(s.from.z - s.to.z) <= tol && Math.hypot(s.to.x - s.from.x, s.to.y - s.from.y) > 0)
      // Levels in the order the program reaches them.
      const levels: number[] = []
      for (const s of cuts) if (!levels.some(z => Math.abs(z - s.to.z) <= tol)) levels.push(s.to.z)
      const v = plan.input
      const total = mm(plan, v.totalDepth)
      const perPass = mm(plan, v.depthPerPass)
      const finishing = v.finishingPass ? mm(plan, v.finishingPass.depth) : 0
      // Passes: equal roughing steps no deeper than asked, then the finishing pass.
      expect(levels).toHaveLength(Math.ceil((total - finishing) / perPass - 1e-9) + (finishing ? 1 : 0))
      levels.forEach((z, i) => {
        const step = (i === 0 ? 0 : levels[i - 1]!) - z
        expect(step, `step ${i + 1} of ${JSON.stringify(input)}`).toBeLessThanOrEqual(perPass + 2 * tol)
        // MIN_CUT_MM = 0.01: no step is thinner than a cut (never a pass printed at Z0.000).
        expect(step).toBeGreaterThanOrEqual(0.01 - 2 * tol)
      })
      expect(Math.abs(levels.at(-1)! + total)).toBeLessThanOrEqual(tol)
      if (finishing) expect(Math.abs(levels.at(-2)! - levels.at(-1)! - finishing)).toBeLessThanOrEqual(2 * tol)
      const w = mm(plan, v.area.x)
      const h = mm(plan, v.area.y)
      const radius = mm(plan, plan.cutterRadius)
      // A 13 x 13 grid (corners and edges included) plus random points.
      const grid = Array.from({ length: 169 }, (_, k) => [(k % 13) / 12, Math.floor(k / 13) / 12] as [number, number])
      for (const level of levels) {
        const atLevel = cuts.filter(s => Math.abs(s.to.z - level) <= tol)
        for (const [u, q] of [...grid, ...randomPoints]) {
          const px = u * w
          const py = q * h
          let best = Infinity
          for (const s of atLevel) {
            best = Math.min(best, distanceToSegment(px, py, s))
            if (best <= radius) break
          }
          expect(best, `point (${px}, ${py}) at Z ${level} of ${JSON.stringify(input)}`).toBeLessThanOrEqual(radius + tol)
        }
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

  it('follow the RS274/NGC line rules and end with the spindle off (NISTIR 6556 §3.1-§3.7, Table 4)', () => {
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

describe('the line-rule checker itself catches broken programs (NISTIR 6556 examples, Table 4)', () => {
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
    expect(lines.slice(lines.indexOf('G21'), lines.indexOf('G21') + 5)).toEqual(['G21', 'G90', 'G17', 'G94', 'G54'])
  })

  it('lifts to safe Z and goes over the start point before the spindle starts, then plunges at the plunge rate and cuts at the feed', () => {
    // After a paper-feeler Z zero the cutter sits just above the board: it must not spin there.
    const start = lines.indexOf('G54') + 1
    expect(lines.slice(start, start + 7)).toEqual(['G0 Z5.000', 'G0 X0.000 Y0.000', 'S18000 M3', 'G1 Z-0.500 F500', 'G1 X600.000 F3000', 'G1 Y17.391', 'G1 X0.000'])
    expect(lines.slice(-4)).toEqual(['G0 Z5.000', 'M5', 'M30', '%'])
  })

  it('starts the spindle only at safe Z above the first plunge, read back by the toolpath library (property)', () => {
    fc.assert(fc.property(inputs, (input) => {
      const plan = planOf(input)
      const text = surfacingGcode(plan)
      const tol = resolutionMm(plan)
      const { segments } = readProgram(text)
      // The moves written before M3 are the lines between G54 and the M3 line.
      const all = text.split('\n')
      const before = all.slice(all.indexOf('G54') + 1, all.findIndex(l => /^S\d+ M3$/.test(l)))
      expect(before.length).toBeGreaterThanOrEqual(2)
      expect(before.every(l => l.startsWith('G0 '))).toBe(true)
      // The first feed move is the plunge, straight down from where M3 left the cutter.
      const firstFeed = segments.find(s => s.motion === 'G1')!
      expect(firstFeed.from.z).toBeGreaterThanOrEqual(mm(plan, plan.input.safeZ) - tol)
      expect(Math.hypot(firstFeed.to.x - firstFeed.from.x, firstFeed.to.y - firstFeed.from.y)).toBe(0)
    }), { numRuns: 40 })
  }, PROPERTY_TIMEOUT)

  it('writes inch programs with G20 and four decimals, and a G4 spin-up dwell in seconds (NISTIR 6556: G4 P is seconds)', () => {
    const inch = surfacingGcode(planOf({ ...base, units: 'in', area: { x: 24, y: 16 }, cutter: { diameter: 1, flutes: 2 }, totalDepth: 0.02, depthPerPass: 0.02, feed: 120, plunge: 20, safeZ: 0.2, spinUpSeconds: 90 }))
    expect(inch).toContain('\nG20\n')
    expect(inch).not.toContain('G21')
    expect(inch).toContain('\nS18000 M3\nG4 P90\n')
    expect(inch).toContain('(Spin-up dwell G4 P in seconds, as NIST RS274/NGC, NISTIR 6556')
    expect(inch).toContain('\nG1 Z-0.0200 F20\n')
    expect(inch).toContain('\nG1 Y0.6957\n')
  })

  it('writes the dwell in milliseconds for a machine whose control reads G4 P that way, and says so', () => {
    const r = planSurfacing({ ...base, spinUpSeconds: 4.5 }, { dwellUnit: 'milliseconds' })
    if (!r.ok) throw new Error(JSON.stringify(r.issues))
    const text = surfacingGcode(r.plan)
    expect(text).toContain('\nS18000 M3\nG4 P4500\n')
    expect(text).toContain('written as G4 P in milliseconds')
    expect(rs274Problems(text)).toEqual([])
    // The same plan for a seconds machine dwells 4.5 s, not 4500 s.
    expect(surfacingGcode(planOf({ ...base, spinUpSeconds: 4.5 }))).toContain('\nG4 P4.5\n')
  })

  it('records a spindle speed above the cutter\'s maximum as a WARNING in the header', () => {
    const text = surfacingGcode(planOf({ ...base, rpm: 20000, cutter: { diameter: 25.4, flutes: 2, name: 'Facing 25', maxRpm: 18000 } }))
    const header = text.split('\n').filter(l => l.startsWith('('))
    expect(header).toContain('(Cutter Facing 25 rated to 18000 rpm)')
    expect(header.some(l => l.startsWith('(WARNING: Spindle speed 20000 rpm is above the cutter\'s maximum of 18000 rpm'))).toBe(true)
    expect(rs274Problems(text)).toEqual([])
    expect(surfacingGcode(planOf({ ...base, rpm: 18000, cutter: { diameter: 25.4, flutes: 2, maxRpm: 18000 } }))).not.toContain('WARNING')
  })
})
