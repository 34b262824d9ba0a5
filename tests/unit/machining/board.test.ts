// Grid convention: rows run front to back (row 0 at Y = 0), columns left to right.
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { analyzeBoard, type BoardAnalysis, type BoardInput } from '../../../shared/machining/board'

function analysis(input: BoardInput): BoardAnalysis {
  const r = analyzeBoard(input)
  if (!r.ok) throw new Error(JSON.stringify(r.issues))
  return r.analysis
}

// Test vector F1, computed independently (SVD least squares; a linear program for the minimum zone): exact
// saddle z = 0.10 + 0.001x − 0.0005y + 0.05(x−100)(y−100)/10⁴ on x, y ∈ {0, 100, 200} mm.
describe('F1 saddle on a 3 × 3 grid (hand calculation)', () => {
  const f1 = analysis({
    kind: 'height',
    grid: [
      [0.15, 0.20, 0.25],
      [0.05, 0.15, 0.25],
      [-0.05, 0.10, 0.25],
    ],
    spacing: { x: 100, y: 100 },
    minThickness: 15,
  })
  it('fits the plane z = 0.10 + 0.001x − 0.0005y exactly', () => {
    expect(f1.plane.z0).toBeCloseTo(0.10, 12)
    expect(f1.plane.slopeX).toBeCloseTo(0.001, 14)
    expect(f1.plane.slopeY).toBeCloseTo(-0.0005, 14)
  })
  it.each([
    [0, 0, 0.05], [0, 1, 0], [0, 2, -0.05],
    [1, 0, 0], [1, 1, 0], [1, 2, 0],
    [2, 0, -0.05], [2, 1, 0], [2, 2, 0.05],
  ])('residual at row %i, column %i is %d', (r, c, e) => {
    expect(f1.residuals[r]![c]).toBeCloseTo(e, 12)
  })
  it('LSQ peak-to-valley is 0.100 (equal to the minimum zone here)', () => {
    expect(f1.flatness.aboutPlane).toBeCloseTo(0.1, 12)
  })
  it('orthogonal peak-to-valley is 0.0999999 (to 1e-7)', () => {
    expect(Math.abs(f1.flatness.aboutPlaneOrthogonal - 0.0999999)).toBeLessThan(1e-7)
    expect(f1.flatness.aboutPlaneOrthogonal).toBeLessThan(f1.flatness.aboutPlane)
  })
  it('clean-up depth is z_max − z_min = 0.300 mm, larger than the flatness because of the tilt', () => {
    expect(f1.flatness.aboutMachineXY).toBeCloseTo(0.3, 12)
    expect(f1.cleanupDepth).toBeCloseTo(0.3, 12)
    expect(f1.highest).toMatchObject({ value: 0.25 })
    expect(f1.lowest).toEqual({ row: 2, col: 0, value: -0.05 })
  })
  it('gives the same answers from explicit X and Y positions', () => {
    const same = analysis({ kind: 'height', grid: [[0.15, 0.20, 0.25], [0.05, 0.15, 0.25], [-0.05, 0.10, 0.25]], xs: [0, 100, 200], ys: [0, 100, 200], minThickness: 15 })
    expect(same.flatness.aboutPlane).toBeCloseTo(0.1, 12)
    expect(same.plane.slopeX).toBeCloseTo(0.001, 14)
  })
})

describe('geometry of exact planes', () => {
  // A tilted but perfectly flat board: flat about its plane, and its machine-XY range is the
  // plane's rise across the grid, |b|·Lx + |c|·Ly (rectangle corners; elementary geometry).
  it('reports zero flatness about the plane and the full tilt against the machine', () => {
    fc.assert(fc.property(
      fc.integer({ min: 2, max: 20 }),
      fc.integer({ min: 2, max: 20 }),
      fc.double({ min: 10, max: 300, noNaN: true }),
      fc.double({ min: 10, max: 300, noNaN: true }),
      fc.double({ min: -1e-3, max: 1e-3, noNaN: true }),
      fc.double({ min: -1e-3, max: 1e-3, noNaN: true }),
      fc.double({ min: 15, max: 25, noNaN: true }),
      (rows, cols, sx, sy, b, c, a) => {
        const grid = Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, k) => a + b * k * sx + c * r * sy))
        const v = analysis({ kind: 'thickness', grid, spacing: { x: sx, y: sy }, minThickness: 10 })
        expect(v.flatness.aboutPlane).toBeLessThan(1e-9)
        expect(v.flatness.aboutMachineXY).toBeCloseTo(Math.abs(b) * (cols - 1) * sx + Math.abs(c) * (rows - 1) * sy, 9)
        expect(v.tilt.acrossX).toBeCloseTo(b * (cols - 1) * sx, 9)
        expect(v.tilt.acrossY).toBeCloseTo(c * (rows - 1) * sy, 9)
      },
    ))
  })
})

describe('thickness left and facings left (COMPUTED by hand from the definitions)', () => {
  it('thickness readings: cut to the thinnest point, then count whole facings above the minimum', () => {
    const v = analysis({ kind: 'thickness', grid: [[18.0, 18.2], [17.9, 18.1]], spacing: { x: 1200, y: 600 }, minThickness: 12, facingAllowance: 0.5 })
    expect(v.cleanupDepth).toBeCloseTo(0.3, 12)
    expect(v.thicknessNow).toEqual({ min: 17.9, mean: expect.closeTo(18.05, 12), max: 18.2 })
    expect(v.thicknessAfter).toBeCloseTo(17.9, 12)
    expect(v.facingsLeft).toBe(11) // (17.9 − 12) / 0.5 = 11.8
    expect(v.belowMinimum).toBe(false)
    expect(v.removedByCleanup).toEqual([[expect.closeTo(0.1, 12), expect.closeTo(0.3, 12)], [0, expect.closeTo(0.2, 12)]])
  })
  it('a margin deepens the clean-up and thins what is left', () => {
    const v = analysis({ kind: 'thickness', grid: [[18.0, 18.2], [17.9, 18.1]], spacing: { x: 1200, y: 600 }, minThickness: 12, facingAllowance: 0.5, margin: 0.1 })
    expect(v.cleanupDepth).toBeCloseTo(0.4, 12)
    expect(v.thicknessAfter).toBeCloseTo(17.8, 12)
    expect(v.facingsLeft).toBe(11) // 5.8 / 0.5 = 11.6
  })
  it('exact multiples are not lost to rounding: (13 − 12) / 0.1 = 10 facings', () => {
    const v = analysis({ kind: 'thickness', grid: [[13, 13.2], [13.1, 13.3]], spacing: { x: 1, y: 1 }, minThickness: 12, facingAllowance: 0.1 })
    expect(v.facingsLeft).toBe(10)
  })
  it('height readings need the mean thickness to say what is left', () => {
    const grid = [[0.2, 0.4], [0.0, 0.2]] // mean 0.2, lowest 0.0
    const v = analysis({ kind: 'height', grid, spacing: { x: 1, y: 1 }, nominalThickness: 18, minThickness: 17 })
    expect(v.thicknessNow).toEqual({ min: expect.closeTo(17.8, 12), mean: 18, max: expect.closeTo(18.2, 12) })
    expect(v.thicknessAfter).toBeCloseTo(17.8, 12)
    // Without an allowance every facing is assumed to take this clean-up depth (0.4).
    expect(v.facingDepth).toBeCloseTo(0.4, 12)
    expect(v.facingsLeft).toBe(2) // 0.8 / 0.4
    const unknown = analysis({ kind: 'height', grid, spacing: { x: 1, y: 1 }, minThickness: 17 })
    expect(unknown.thicknessAfter).toBeNull()
    expect(unknown.facingsLeft).toBeNull()
  })
  it('flags a board the clean-up would take under the minimum', () => {
    const v = analysis({ kind: 'thickness', grid: [[12.2, 12.0], [11.9, 12.1]], spacing: { x: 1, y: 1 }, minThickness: 12, facingAllowance: 0.5 })
    expect(v.belowMinimum).toBe(true)
    expect(v.facingsLeft).toBe(0)
  })
})

describe('board input validation', () => {
  const good: BoardInput = { kind: 'thickness', grid: [[18, 18.1], [18.2, 18]], spacing: { x: 100, y: 100 }, minThickness: 12 }
  it.each([
    ['grid', { grid: [[1, 2]] }, 'Take readings on 2 to 20 rows (got 1).'],
    ['grid', { grid: Array.from({ length: 21 }, () => [18, 18]) }, 'Take readings on 2 to 20 rows (got 21).'],
    ['grid.0', { grid: [[18], [18]] }, 'Take 2 to 20 readings in each row (row 1 has 1).'],
    ['grid.1', { grid: [[18, 18, 18], [18, 18]] }, 'Row 2 has 2 readings but row 1 has 3; every row needs the same number.'],
    ['grid.1.0', { grid: [[18, 18], [Number.NaN, 18]] }, 'Reading in row 2, column 1 is not a number.'],
    ['grid.0.1', { grid: [[18, Number.POSITIVE_INFINITY], [18, 18]] }, 'Reading in row 1, column 2 is not a number.'],
    ['grid.0.1', { grid: [[18, '18'], [18, 18]] }, 'Reading in row 1, column 2 is not a number.'],
    ['grid.0.0', { grid: [[0, 18], [18, 18]] }, 'Thickness in row 1, column 1 must be more than 0.'],
    ['grid', { grid: 'flat' }, 'Readings must be a list of rows.'],
    ['grid.1', { grid: [[18, 18], 5] }, 'Each row of readings must be a list of numbers.'],
    ['spacing', { spacing: undefined }, 'Give the spacing between readings, or the X and Y position of every row and column.'],
    ['spacing.x', { spacing: { x: 0, y: 100 } }, 'Spacing X must be more than 0.'],
    ['xs', { spacing: undefined, xs: [0, 100, 200], ys: [0, 100] }, 'Give 2 X positions, one per column (got 3).'],
    ['ys.1', { spacing: undefined, xs: [0, 100], ys: [100, 100] }, 'Y positions must increase: 100 does not come after 100.'],
    ['kind', { kind: 'depth' }, 'Kind must be \'height\' (surface heights) or \'thickness\'.'],
    ['minThickness', { minThickness: 0 }, 'Minimum thickness must be more than 0.'],
    ['facingAllowance', { facingAllowance: -0.5 }, 'Depth per facing must be more than 0.'],
    ['margin', { margin: -0.1 }, 'Margin cannot be negative.'],
  ])('%s: %j', (path, over, message) => {
    const r = analyzeBoard({ ...good, ...over })
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.issues).toContainEqual({ path, message })
  })
  it('accepts 2 × 2 up to 20 × 20', () => {
    expect(analyzeBoard(good).ok).toBe(true)
    expect(analyzeBoard({ ...good, grid: Array.from({ length: 20 }, (_, r) => Array.from({ length: 20 }, (_, c) => 18 + 0.01 * ((r * c) % 7))) }).ok).toBe(true)
  })
})
