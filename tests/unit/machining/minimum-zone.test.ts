// Minimum-zone flatness (ISO 1101 default association; ISO 12781-1 minimum-zone reference
// plane) checked three ways: hand-worked values, an independent exhaustive solve written here,
// and the least-squares figure, which is one feasible plane and so never below the minimum zone.
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { minimumZoneFlatness, type ZonePoint } from '../../../shared/machining/minimum-zone'
import { analyzeBoard } from '../../../shared/machining/board'

const gridPoints = (grid: number[][], sx = 1, sy = 1): ZonePoint[] => grid.flatMap((row, r) => row.map((z, c) => ({ x: c * sx, y: r * sy, z })))

/** Solves a 4 × 4 linear system by Gaussian elimination with partial pivoting; null when singular. */
function solve4(a: number[][], b: number[]): number[] | null {
  const m = a.map((row, i) => [...row, b[i]!])
  for (let k = 0; k < 4; k++) {
    let p = k
    for (let i = k + 1; i < 4; i++) if (Math.abs(m[i]![k]!) > Math.abs(m[p]![k]!)) p = i
    if (Math.abs(m[p]![k]!) < 1e-12) return null
    ;[m[k], m[p]] = [m[p]!, m[k]!]
    for (let i = k + 1; i < 4; i++) {
      const f = m[i]![k]! / m[k]![k]!
      for (let j = k; j < 5; j++) m[i]![j]! -= f * m[k]![j]!
    }
  }
  const x = [0, 0, 0, 0]
  for (let i = 3; i >= 0; i--) {
    let s = m[i]![4]!
    for (let j = i + 1; j < 4; j++) s -= m[i]![j]! * x[j]!
    x[i] = s / m[i]![i]!
  }
  return x
}

/**
 * Independent exact solve: a linear programme's optimum lies at a vertex, where 4 of the
 * constraints z_i - plane(x_i, y_i) = ±t hold with equality. Try every 4 readings and every
 * sign pattern, solve for the plane and t, and keep the narrowest zone that really holds every
 * reading. Exhaustive, so only for small grids.
 */
function bruteForceZone(points: ZonePoint[]): number {
  let best = Infinity
  const n = points.length
  const range = (h: number, b: number, c: number) => {
    const r = points.map(p => p.z - h - b * p.x - c * p.y)
    return Math.max(...r) - Math.min(...r)
  }
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) for (let k = j + 1; k < n; k++) for (let l = k + 1; l < n; l++) {
    for (let signs = 0; signs < 8; signs++) {
      const s = [1, signs & 1 ? 1 : -1, signs & 2 ? 1 : -1, signs & 4 ? 1 : -1]
      const rows = [i, j, k, l].map((q, m) => [1, points[q]!.x, points[q]!.y, s[m]!])
      const solved = solve4(rows, [i, j, k, l].map(q => points[q]!.z))
      if (solved) best = Math.min(best, range(solved[0]!, solved[1]!, solved[2]!))
    }
  }
  // Three readings in a plane (or fewer distinct ones) fit exactly: t = 0 is then a vertex too.
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) for (let k = j + 1; k < n; k++) {
    const [p, q, r] = [points[i]!, points[j]!, points[k]!]
    const det = (q.x - p.x) * (r.y - p.y) - (r.x - p.x) * (q.y - p.y)
    if (Math.abs(det) < 1e-12) continue
    const b = ((q.z - p.z) * (r.y - p.y) - (r.z - p.z) * (q.y - p.y)) / det
    const c = ((q.x - p.x) * (r.z - p.z) - (r.x - p.x) * (q.z - p.z)) / det
    best = Math.min(best, range(p.z - b * p.x - c * p.y, b, c))
  }
  return best
}

describe('minimum-zone flatness', () => {
  it('is 0 for readings on a tilted plane (hand check: z = 1 + x + y)', () => {
    expect(minimumZoneFlatness(gridPoints([[1, 2, 3], [2, 3, 4]]))).toBeCloseTo(0, 9)
  })

  it('is 2/3 where least squares gives 0.7: one raised end of a 4-column strip (hand-worked)', () => {
    // Heights 0, 0, 0, 1 at x = 0..3 (two identical rows). For a slope b, the residuals are
    // 0, -b, -2b, 1 - 3b: range = 1 - b for b <= 1/3 and 2b beyond, smallest 2/3 at b = 1/3.
    // Least squares: slope Sxz/Sxx = 1.5/5 = 0.3, residuals 0.2, -0.1, -0.4, 0.3, range 0.7.
    const grid = [[0, 0, 0, 1], [0, 0, 0, 1]]
    expect(minimumZoneFlatness(gridPoints(grid))).toBeCloseTo(2 / 3, 9)
    const board = analyzeBoard({ kind: 'height', grid, spacing: { x: 1, y: 1 }, minThickness: 1 })
    if (!board.ok) throw new Error(JSON.stringify(board.issues))
    expect(board.analysis.flatness.aboutPlane).toBeCloseTo(0.7, 9)
    expect(board.analysis.flatness.minimumZone).toBeCloseTo(2 / 3, 9)
  })

  it('is 0.5 for one raised corner of a square, the same as least squares (hand-worked)', () => {
    // Residuals of any plane keep the twist r00 - r10 - r01 + r11 = 1, so the range is at least 0.5.
    expect(minimumZoneFlatness(gridPoints([[0, 0], [0, 1]]))).toBeCloseTo(0.5, 9)
  })

  it('does not depend on the board size or height, only on the shape (a 1200 mm board in mm)', () => {
    const shape = [[0, 0.04, 0.01], [0.03, 0.1, 0], [0, 0.02, 0.06]]
    const small = minimumZoneFlatness(gridPoints(shape))
    const big = minimumZoneFlatness(gridPoints(shape.map((row, r) => row.map((z, c) => 18 + z + 0.0004 * c * 600 - 0.0002 * r * 600)), 600, 600))
    expect(big).toBeCloseTo(small, 9)
  })

  it('matches the independent exhaustive solve on random small grids (fixed seed)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 2, max: 4 }), fc.integer({ min: 2, max: 4 }),
      fc.double({ min: 10, max: 400, noNaN: true }), fc.double({ min: 10, max: 400, noNaN: true }),
      fc.array(fc.double({ min: -0.5, max: 0.5, noNaN: true }), { minLength: 16, maxLength: 16 }),
      (rows, cols, sx, sy, heights) => {
        const grid = Array.from({ length: rows }, (_, r) => heights.slice(r * cols, r * cols + cols))
        const points = gridPoints(grid, sx, sy)
        expect(minimumZoneFlatness(points)).toBeCloseTo(bruteForceZone(points), 7)
      },
    ), { numRuns: 60, seed: 1101 })
  })

  it('is never more than the least-squares flatness, on random grids up to 20 × 20 (property, fixed seed)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 2, max: 20 }), fc.integer({ min: 2, max: 20 }),
      fc.double({ min: 20, max: 300, noNaN: true }), fc.integer({ min: 1, max: 2 ** 30 }),
      (rows, cols, spacing, seed) => {
        let s = seed
        const next = () => { s = (s * 1103515245 + 12345) % 2 ** 31; return s / 2 ** 31 }
        const grid = Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, c) => 18 + 0.3 * next() + 0.001 * c - 0.0005 * r))
        const board = analyzeBoard({ kind: 'height', grid, spacing: { x: spacing, y: spacing }, minThickness: 1 })
        if (!board.ok) throw new Error(JSON.stringify(board.issues))
        const { aboutPlane, minimumZone, aboutMachineXY } = board.analysis.flatness
        expect(minimumZone).toBeLessThanOrEqual(aboutPlane + 1e-9)
        // The machine's XY plane is a feasible plane too.
        expect(minimumZone).toBeLessThanOrEqual(aboutMachineXY + 1e-9)
        expect(minimumZone).toBeGreaterThanOrEqual(0)
      },
    ), { numRuns: 40, seed: 12781 })
  })

  it('refuses too few or non-finite readings with a RangeError', () => {
    expect(() => minimumZoneFlatness([{ x: 0, y: 0, z: 0 }, { x: 1, y: 0, z: 0 }])).toThrow(RangeError)
    expect(() => minimumZoneFlatness(gridPoints([[0, Number.NaN], [0, 0]]))).toThrow(RangeError)
  })
})
