// Climb or conventional, judged line by line on the program read back by the independent
// G-code toolpath library, without the planner's own code. Definitions used:
// - M3 turns the spindle clockwise seen from above (NIST RS274/NGC, NISTIR 6556, M3 "start the
//   spindle turning clockwise").
// - Climb (down) milling: each tooth enters the stock at full chip thickness and leaves it at
//   none; with a clockwise cutter that is the case when the uncut stock lies to the right of the
//   direction of travel (definition of down milling in Machinery's Handbook, from memory).
// - The uncut stock of a raster line lies on the side the raster has not reached yet: towards
//   the next line at that level, or, for the last line, away from the line before it.
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { planSurfacing } from '../../../shared/machining/surfacing'
import { surfacingGcode } from '../../../shared/machining/gcode'
import type { SurfacingInput } from '../../../shared/machining/surfacing-input'
import { surfacingPreview } from '../../../shared/machining/preview'
import { readProgram, type Segment } from './program-check'

type Judged = 'climb' | 'conventional'

/** Each raster line of the program, in cutting order, with its milling judged; grouped by Z. */
function judgeLines(program: string): Judged[][] {
  const cuts = readProgram(program).segments.filter(s => s.motion === 'G1' && s.from.z === s.to.z && Math.hypot(s.to.x - s.from.x, s.to.y - s.from.y) > 0)
  const length = (s: Segment) => Math.hypot(s.to.x - s.from.x, s.to.y - s.from.y)
  const longest = Math.max(...cuts.map(length))
  // Raster lines are the long cuts; zigzag stepovers are at most one cutter diameter.
  const lines = cuts.filter(s => length(s) > 0.9 * longest)
  const alongX = Math.abs(lines[0]!.to.x - lines[0]!.from.x) > Math.abs(lines[0]!.to.y - lines[0]!.from.y)
  const across = (s: Segment) => alongX ? s.from.y : s.from.x
  const byLevel = new Map<number, Segment[]>()
  for (const s of lines) byLevel.set(s.to.z, [...(byLevel.get(s.to.z) ?? []), s])
  return [...byLevel.values()].map(level => level.map((s, k) => {
    const next = level[k + 1]
    const stockSign = next ? Math.sign(across(next) - across(s)) : Math.sign(across(s) - across(level[k - 1]!))
    const stock = alongX ? { x: 0, y: stockSign } : { x: stockSign, y: 0 }
    const d = { x: s.to.x - s.from.x, y: s.to.y - s.from.y }
    const right = { x: d.y, y: -d.x }
    return stock.x * right.x + stock.y * right.y > 0 ? 'climb' : 'conventional'
  }))
}

const base: SurfacingInput = {
  units: 'mm', area: { x: 300, y: 200 }, cutter: { diameter: 25.4, flutes: 2 }, stepoverPct: 60,
  totalDepth: 0.6, depthPerPass: 0.3, feed: 3000, plunge: 500, rpm: 16000, direction: 'x',
  pattern: 'one-way', safeZ: 5,
}
function program(over: Partial<SurfacingInput>) {
  const r = planSurfacing({ ...base, ...over })
  if (!r.ok) throw new Error(JSON.stringify(r.issues))
  return { plan: r.plan, text: surfacingGcode(r.plan) }
}

describe('one-way programs cut every line the way asked', () => {
  it('hand check: along X, climb cuts towards -X with the stock at +Y (right of -X travel)', () => {
    const { text } = program({ milling: 'climb' })
    // First raster line of the first pass: plunge at X300 (the far end), cut to X0.
    expect(text).toMatch(/G0 X300\.000 Y0\.000\nS16000 M3\n(G4 P\d+\n)?G1 Z-0\.300 F500\nG1 X0\.000 F3000\n/)
  })

  it.each([
    ['x', 'mm', 'climb'], ['x', 'mm', 'conventional'], ['y', 'mm', 'climb'], ['y', 'mm', 'conventional'],
    ['x', 'in', 'climb'], ['y', 'in', 'conventional'],
  ] as const)('along %s in %s: %s on every line of every pass', (direction, units, milling) => {
    const k = units === 'mm' ? 1 : 1 / 25.4
    const { plan, text } = program({ direction, units, milling, area: { x: 300 * k, y: 200 * k }, cutter: { diameter: 25.4 * k, flutes: 2 }, totalDepth: 0.6 * k, depthPerPass: 0.3 * k, feed: 3000 * k, plunge: 500 * k, safeZ: 5 * k })
    const judged = judgeLines(text)
    expect(judged).toHaveLength(2)
    for (const level of judged) {
      expect(level).toHaveLength(plan.lineCount)
      expect(new Set(level)).toEqual(new Set([milling]))
    }
    expect(plan.milling).toBe(milling)
    expect(text).toContain(`(Milling ${milling} on every line`)
  })

  it('is conventional when none is chosen, along either axis (no longer fixed by the axis)', () => {
    for (const direction of ['x', 'y'] as const) {
      expect(new Set(judgeLines(program({ direction }).text).flat())).toEqual(new Set(['conventional']))
    }
  })

  it('zigzag alternates from line to line, and says so', () => {
    const { plan, text } = program({ pattern: 'zigzag' })
    for (const level of judgeLines(text)) {
      level.forEach((m, i) => { if (i > 0) expect(m).not.toBe(level[i - 1]) })
    }
    expect(plan.milling).toBe('alternating')
    expect(text).toContain('(Milling alternates climb and conventional, zigzag)')
  })

  it('holds for random one-way plans (property)', () => {
    fc.assert(fc.property(
      fc.constantFrom('x' as const, 'y' as const), fc.constantFrom('climb' as const, 'conventional' as const),
      fc.double({ min: 30, max: 500, noNaN: true }), fc.double({ min: 30, max: 500, noNaN: true }),
      fc.double({ min: 6, max: 50, noNaN: true }), fc.double({ min: 20, max: 95, noNaN: true }),
      (direction, milling, x, y, diameter, stepoverPct) => {
        const { text } = program({ direction, milling, area: { x, y }, cutter: { diameter, flutes: 2 }, stepoverPct, totalDepth: 0.5, depthPerPass: 0.5 })
        expect(new Set(judgeLines(text).flat())).toEqual(new Set([milling]))
      },
    ), { numRuns: 60, seed: 12 })
  })

  it('the preview draws one-way lines the way the program cuts them', () => {
    for (const [direction, milling] of [['x', 'climb'], ['x', 'conventional'], ['y', 'climb'], ['y', 'conventional']] as const) {
      const { plan, text } = program({ direction, milling })
      const first = readProgram(text).segments.find(s => s.motion === 'G1' && s.from.z === s.to.z)!
      const line = surfacingPreview(plan).lines[0]!
      expect([line.from.x, line.from.y, line.to.x, line.to.y], `${direction} ${milling}`).toEqual([first.from.x, first.from.y, first.to.x, first.to.y])
    }
  })
})
