// Small dense linear algebra for plane fits. Least squares goes through Householder QR, never
// the normal equations (forming X^T X squares the condition number and loses half the digits
// on ill-conditioned data such as NIST's Longley and Wampler sets).

export interface LeastSquaresResult {
  coefficients: number[]
  /** observation - fitted value, in input order. */
  residuals: number[]
  residualSumOfSquares: number
  /** n - p */
  degreesOfFreedom: number
  /** sqrt(RSS / (n - p)); NaN when n = p. */
  residualStandardDeviation: number
  /** Standard deviation of each coefficient: s * sqrt(diag((R^T R)^-1)); NaN when n = p. */
  standardErrors: number[]
  /** 1 - RSS / sum((y - mean y)^2), the usual R^2 for a model with an intercept column. */
  rSquared: number
}

/**
 * Ordinary least squares: the coefficients b minimising ||design * b - observations||.
 * `design` is n rows of p values (put a column of 1s in it for an intercept).
 * Throws RangeError on a ragged or non-finite design, or when its columns are linearly dependent.
 */
export function leastSquares(design: number[][], observations: number[]): LeastSquaresResult {
  const n = design.length
  const p = n > 0 ? design[0]!.length : 0
  if (n === 0 || p === 0) throw new RangeError('The design matrix is empty.')
  if (observations.length !== n) throw new RangeError(`There are ${n} design rows but ${observations.length} observations.`)
  if (n < p) throw new RangeError(`At least ${p} observations are needed to fit ${p} coefficients (got ${n}).`)
  // Column-major copy: Householder reflections work down columns.
  const cols: Float64Array[] = []
  for (let j = 0; j < p; j++) cols.push(new Float64Array(n))
  design.forEach((row, i) => {
    if (row.length !== p) throw new RangeError(`Design row ${i + 1} has ${row.length} values, expected ${p}.`)
    row.forEach((v, j) => {
      if (!Number.isFinite(v)) throw new RangeError(`Design value at row ${i + 1}, column ${j + 1} is not finite.`)
      cols[j]![i] = v
    })
  })
  const qtb = Float64Array.from(observations)
  if (!qtb.every(Number.isFinite)) throw new RangeError('Every observation must be a finite number.')

  const columnNorms = cols.map(c => Math.hypot(...c))
  const rDiag = new Float64Array(p)
  for (let k = 0; k < p; k++) {
    const a = cols[k]!
    let scale = 0
    for (let i = k; i < n; i++) scale = Math.max(scale, Math.abs(a[i]!))
    let norm = 0
    if (scale > 0) {
      let ss = 0
      for (let i = k; i < n; i++) ss += (a[i]! / scale) ** 2
      norm = scale * Math.sqrt(ss)
    }
    if (norm <= 1e-13 * (columnNorms[k]! || 1) * Math.max(n, 10)) {
      throw new RangeError(`Column ${k + 1} of the design depends on the others; the fit has no unique answer.`)
    }
    // Reflect a[k..] onto -sign(a_k) * norm * e_k; the sign choice avoids cancellation.
    const alpha = a[k]! > 0 ? -norm : norm
    const v = a.slice(k, n)
    v[0] = v[0]! - alpha
    let vv = 0
    for (let i = 0; i < v.length; i++) vv += v[i]! * v[i]!
    const applyTo = (c: Float64Array) => {
      let dot = 0
      for (let i = 0; i < v.length; i++) dot += v[i]! * c[k + i]!
      const f = (2 * dot) / vv
      for (let i = 0; i < v.length; i++) c[k + i] = c[k + i]! - f * v[i]!
    }
    for (let j = k + 1; j < p; j++) applyTo(cols[j]!)
    applyTo(qtb)
    rDiag[k] = alpha
  }
  // R is upper triangular: R[i][j] = cols[j][i] for i < j, rDiag on the diagonal.
  const r = (i: number, j: number) => (i === j ? rDiag[i]! : cols[j]![i]!)
  const coefficients = new Array<number>(p).fill(0)
  for (let i = p - 1; i >= 0; i--) {
    let s = qtb[i]!
    for (let j = i + 1; j < p; j++) s -= r(i, j) * coefficients[j]!
    coefficients[i] = s / r(i, i)
  }
  const residuals = observations.map((y, i) => {
    let fit = 0
    for (let j = 0; j < p; j++) fit += design[i]![j]! * coefficients[j]!
    return y - fit
  })
  const rss = residuals.reduce((s, e) => s + e * e, 0)
  const df = n - p
  const sd = df > 0 ? Math.sqrt(rss / df) : Number.NaN
  // diag((R^T R)^-1) = squared row norms of R^-1.
  const rInv: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0))
  for (let j = 0; j < p; j++) {
    rInv[j]![j] = 1 / r(j, j)
    for (let i = j - 1; i >= 0; i--) {
      let s = 0
      for (let k = i + 1; k <= j; k++) s += r(i, k) * rInv[k]![j]!
      rInv[i]![j] = -s / r(i, i)
    }
  }
  const standardErrors = rInv.map(row => sd * Math.hypot(...row))
  const mean = observations.reduce((s, y) => s + y, 0) / n
  const sst = observations.reduce((s, y) => s + (y - mean) ** 2, 0)
  return {
    coefficients,
    residuals,
    residualSumOfSquares: rss,
    degreesOfFreedom: df,
    residualStandardDeviation: sd,
    standardErrors,
    rSquared: sst > 0 ? 1 - rss / sst : Number.NaN,
  }
}

export interface SingularValueDecomposition {
  /** Descending. */
  singularValues: number[]
  /** Right singular vectors as columns: v[i][k] is component i of vector k. */
  v: number[][]
}

/**
 * Singular values and right singular vectors of an n x p matrix (n >= 1) by one-sided
 * Jacobi rotations, which keep full relative accuracy for the small matrices plane fits need.
 */
export function singularValueDecomposition(matrix: number[][]): SingularValueDecomposition {
  const n = matrix.length
  const p = n > 0 ? matrix[0]!.length : 0
  if (n === 0 || p === 0) throw new RangeError('The matrix is empty.')
  const a = Array.from({ length: p }, (_, j) => Float64Array.from(matrix, row => {
    if (row.length !== p) throw new RangeError('The matrix rows have different lengths.')
    return row[j]!
  }))
  const v = Array.from({ length: p }, (_, j) => Float64Array.from({ length: p }, (_, i) => (i === j ? 1 : 0)))
  for (let sweep = 0; sweep < 60; sweep++) {
    let rotated = false
    for (let i = 0; i < p - 1; i++) {
      for (let j = i + 1; j < p; j++) {
        const ai = a[i]!
        const aj = a[j]!
        let alpha = 0
        let beta = 0
        let gamma = 0
        for (let k = 0; k < n; k++) {
          alpha += ai[k]! * ai[k]!
          beta += aj[k]! * aj[k]!
          gamma += ai[k]! * aj[k]!
        }
        if (gamma === 0 || Math.abs(gamma) <= 1e-15 * Math.sqrt(alpha * beta)) continue
        rotated = true
        const zeta = (beta - alpha) / (2 * gamma)
        const t = Math.sign(zeta || 1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta))
        const c = 1 / Math.sqrt(1 + t * t)
        const s = c * t
        const rotate = (x: Float64Array, y: Float64Array, len: number) => {
          for (let k = 0; k < len; k++) {
            const xk = x[k]!
            const yk = y[k]!
            x[k] = c * xk - s * yk
            y[k] = s * xk + c * yk
          }
        }
        rotate(ai, aj, n)
        rotate(v[i]!, v[j]!, p)
      }
    }
    if (!rotated) break
  }
  const order = a.map((col, j) => ({ j, sigma: Math.hypot(...col) })).sort((x, y) => y.sigma - x.sigma)
  return {
    singularValues: order.map(o => o.sigma),
    v: Array.from({ length: p }, (_, i) => order.map(o => v[o.j]![i]!)),
  }
}

export interface Point3 { x: number, y: number, z: number }

/** Plane z = z0 + slopeX * x + slopeY * y fitted by least squares on vertical distances. */
export interface VerticalPlane { z0: number, slopeX: number, slopeY: number }

export function fitPlaneVertical(points: Point3[]): VerticalPlane & { residuals: number[] } {
  if (points.length < 3) throw new RangeError('A plane needs at least 3 points.')
  const fit = leastSquares(points.map(pt => [1, pt.x, pt.y]), points.map(pt => pt.z))
  const [z0, slopeX, slopeY] = fit.coefficients as [number, number, number]
  return { z0, slopeX, slopeY, residuals: fit.residuals }
}

/**
 * Plane minimising orthogonal distances (total least squares): it passes through the centroid
 * and its normal is the right singular vector of the centred points with the smallest singular
 * value (the method in the NIST algorithm-testing work on least-squares fitting).
 * The normal is returned with z >= 0 (or the first non-zero component positive).
 */
export function fitPlaneOrthogonal(points: Point3[]): { centroid: Point3, normal: Point3, distances: number[] } {
  if (points.length < 3) throw new RangeError('A plane needs at least 3 points.')
  const m = points.length
  const centroid = {
    x: points.reduce((s, pt) => s + pt.x, 0) / m,
    y: points.reduce((s, pt) => s + pt.y, 0) / m,
    z: points.reduce((s, pt) => s + pt.z, 0) / m,
  }
  const centred = points.map(pt => [pt.x - centroid.x, pt.y - centroid.y, pt.z - centroid.z])
  const { v } = singularValueDecomposition(centred)
  let normal = [v[0]![2]!, v[1]![2]!, v[2]![2]!]
  const len = Math.hypot(...normal)
  normal = normal.map(c => c / len)
  const lead = normal[2] !== 0 ? normal[2]! : (normal[0] !== 0 ? normal[0]! : normal[1]!)
  if (lead < 0) normal = normal.map(c => -c)
  const [nx, ny, nz] = normal as [number, number, number]
  return {
    centroid,
    normal: { x: nx, y: ny, z: nz },
    distances: centred.map(([dx, dy, dz]) => dx! * nx + dy! * ny + dz! * nz),
  }
}
