import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { fitPlaneOrthogonal, fitPlaneVertical, leastSquares } from '../../../shared/machining/linalg'
import { norris } from './fixtures/nist-norris'
import { longley } from './fixtures/nist-longley'
import { wampler1 } from './fixtures/nist-wampler1'

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref)

// The shortcut the solver must not take: solve (X^T X) b = X^T y by Gaussian elimination.
function normalEquations(design: number[][], y: number[]): number[] {
  const p = design[0]!.length
  const a = Array.from({ length: p }, (_, i) => [
    ...Array.from({ length: p }, (_, j) => design.reduce((s, row) => s + row[i]! * row[j]!, 0)),
    design.reduce((s, row, k) => s + row[i]! * y[k]!, 0),
  ])
  for (let k = 0; k < p; k++) {
    let pivot = k
    for (let i = k + 1; i < p; i++) if (Math.abs(a[i]![k]!) > Math.abs(a[pivot]![k]!)) pivot = i
    ;[a[k], a[pivot]] = [a[pivot]!, a[k]!]
    for (let i = k + 1; i < p; i++) {
      const f = a[i]![k]! / a[k]![k]!
      for (let j = k; j <= p; j++) a[i]![j]! -= f * a[k]![j]!
    }
  }
  const b = new Array<number>(p).fill(0)
  for (let i = p - 1; i >= 0; i--) {
    let s = a[i]![p]!
    for (let j = i + 1; j < p; j++) s -= a[i]![j]! * b[j]!
    b[i] = s / a[i]![i]!
  }
  return b
}

describe('least squares against NIST StRD certified values', () => {
  // NIST StRD Norris.dat, certified values: lower difficulty, 2 parameters.
  const norrisFit = leastSquares(norris.data.map(([, x]) => [1, x]), norris.data.map(([y]) => y))
  it('has the 36 Norris observations', () => {
    expect(norris.data).toHaveLength(36)
  })
  it.each([0, 1])('Norris B%i matches the certified estimate to 1e-12 relative', (i) => {
    expect(relErr(norrisFit.coefficients[i]!, norris.certified.coefficients[i]!)).toBeLessThan(1e-12)
  })
  it.each([0, 1])('Norris standard deviation of B%i matches to 1e-10 relative', (i) => {
    expect(relErr(norrisFit.standardErrors[i]!, norris.certified.standardErrors[i]!)).toBeLessThan(1e-10)
  })
  it('Norris residual SD, RSS and R² match the certified values', () => {
    expect(relErr(norrisFit.residualStandardDeviation, norris.certified.residualStandardDeviation)).toBeLessThan(1e-10)
    expect(relErr(norrisFit.residualSumOfSquares, norris.certified.residualSumOfSquares)).toBeLessThan(1e-10)
    expect(relErr(norrisFit.rSquared, norris.certified.rSquared)).toBeLessThan(1e-12)
    expect(norrisFit.degreesOfFreedom).toBe(34)
  })

  // NIST StRD Longley.dat, certified values: ill-conditioned, 7 parameters.
  // Computed independently: QR/SVD least squares reach 11-12 digits on Longley; we ask for 1e-9 relative.
  const design = longley.data.map(row => [1, ...row.slice(1)])
  const ys = longley.data.map(row => row[0]!)
  const longleyFit = leastSquares(design, ys)
  it('has the 16 Longley observations', () => {
    expect(longley.data).toHaveLength(16)
  })
  it.each([0, 1, 2, 3, 4, 5, 6])('Longley B%i matches the certified estimate to 1e-9 relative', (i) => {
    expect(relErr(longleyFit.coefficients[i]!, longley.certified.coefficients[i]!)).toBeLessThan(1e-9)
  })
  it.each([0, 1, 2, 3, 4, 5, 6])('Longley standard deviation of B%i matches to 1e-9 relative', (i) => {
    expect(relErr(longleyFit.standardErrors[i]!, longley.certified.standardErrors[i]!)).toBeLessThan(1e-9)
  })
  it('Longley residual SD and R² match the certified values', () => {
    expect(relErr(longleyFit.residualStandardDeviation, longley.certified.residualStandardDeviation)).toBeLessThan(1e-9)
    expect(relErr(longleyFit.rSquared, longley.certified.rSquared)).toBeLessThan(1e-12)
  })
  // NIST StRD Wampler1.dat, certified values: exact quintic, every B = 1.
  const wDesign = wampler1.data.map(([, x]) => [1, x, x ** 2, x ** 3, x ** 4, x ** 5])
  const wFit = leastSquares(wDesign, wampler1.data.map(([y]) => y))
  it('generates the same 21 rows as the published Wampler1 data', () => {
    expect(wampler1.data.map(([y]) => y)).toEqual(wampler1.publishedY)
  })
  it.each([0, 1, 2, 3, 4, 5])('Wampler1 B%i is 1 to within 1e-8', (i) => {
    expect(Math.abs(wFit.coefficients[i]! - wampler1.certified.coefficients[i]!)).toBeLessThan(1e-8)
  })
  it('Wampler1 residual SD is 0 and R² is 1 (to rounding)', () => {
    expect(wFit.residualStandardDeviation).toBeLessThan(1e-8)
    expect(Math.abs(wFit.rSquared - 1)).toBeLessThan(1e-15)
  })

  // Computed independently: forming X^T X in double precision fails Longley/Wampler; these checks
  // show the tolerances above are tight enough to tell the two methods apart.
  it('the normal-equations shortcut misses the certified values at the same tolerances', () => {
    const l = normalEquations(design, ys)
    expect(Math.max(...l.map((b, i) => relErr(b, longley.certified.coefficients[i]!)))).toBeGreaterThan(1e-9)
    const w = normalEquations(wDesign, wampler1.data.map(([y]) => y))
    expect(Math.max(...w.map(b => Math.abs(b - 1)))).toBeGreaterThan(1e-8)
  })
})

describe('least-squares input errors', () => {
  it.each([
    [[], [], 'The design matrix is empty.'],
    [[[1, 2], [1]], [1, 2], 'Design row 2 has 1 values, expected 2.'],
    [[[1, 2]], [1], 'At least 2 observations are needed to fit 2 coefficients (got 1).'],
    [[[1, 2], [1, 3]], [1], 'There are 2 design rows but 1 observations.'],
    [[[1, 2], [1, Number.NaN]], [1, 2], 'Design value at row 2, column 2 is not finite.'],
    [[[1, 2], [1, 2], [1, 2]], [1, 2, 3], 'Column 2 of the design depends on the others; the fit has no unique answer.'],
  ])('rejects %j', (design, y, message) => {
    expect(() => leastSquares(design as number[][], y as number[])).toThrow(message)
  })
})

describe('plane fits', () => {
  // scikit-spatial Plane.best_fit docstring example (recomputed independently): points
  // (0,0,0), (1,0,0), (0,1,0), (0,0,1) -> centroid (0.25, 0.25, 0.25), normal (1,1,1)/sqrt(3).
  it('reproduces the scikit-spatial best-fit plane example', () => {
    const fit = fitPlaneOrthogonal([
      { x: 0, y: 0, z: 0 }, { x: 1, y: 0, z: 0 }, { x: 0, y: 1, z: 0 }, { x: 0, y: 0, z: 1 },
    ])
    expect(fit.centroid.x).toBeCloseTo(0.25, 14)
    expect(fit.centroid.y).toBeCloseTo(0.25, 14)
    expect(fit.centroid.z).toBeCloseTo(0.25, 14)
    for (const c of [fit.normal.x, fit.normal.y, fit.normal.z]) expect(c).toBeCloseTo(1 / Math.sqrt(3), 12)
  })

  // Geometry: points exactly on a plane are fitted exactly (both fits), and the orthogonal
  // normal is (-b, -c, 1)/sqrt(1 + b² + c²) for z = a + b x + c y.
  it('recovers random exact planes on random grids', () => {
    fc.assert(fc.property(
      fc.double({ min: -50, max: 50, noNaN: true }),
      fc.double({ min: -0.05, max: 0.05, noNaN: true }),
      fc.double({ min: -0.05, max: 0.05, noNaN: true }),
      fc.integer({ min: 2, max: 9 }),
      fc.integer({ min: 2, max: 9 }),
      fc.double({ min: 10, max: 400, noNaN: true }),
      (a, b, c, nx, ny, step) => {
        const pts = Array.from({ length: nx * ny }, (_, k) => {
          const x = (k % nx) * step
          const y = Math.floor(k / nx) * step
          return { x, y, z: a + b * x + c * y }
        })
        const v = fitPlaneVertical(pts)
        expect(v.z0).toBeCloseTo(a, 9)
        expect(v.slopeX).toBeCloseTo(b, 11)
        expect(v.slopeY).toBeCloseTo(c, 11)
        const o = fitPlaneOrthogonal(pts)
        const len = Math.hypot(b, c, 1)
        expect(o.normal.x).toBeCloseTo(-b / len, 9)
        expect(o.normal.y).toBeCloseTo(-c / len, 9)
        expect(o.normal.z).toBeCloseTo(1 / len, 9)
      },
    ), { numRuns: 100 })
  })
})
