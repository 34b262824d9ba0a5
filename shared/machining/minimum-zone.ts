// Minimum-zone flatness: the smallest distance between two parallel planes that enclose every
// reading (ISO 1101's default association for flatness; the minimum-zone reference plane of
// ISO 12781-1). Readings are heights on a vertical axis, so the zone is measured along Z:
//
//   minimise t  subject to  -t <= z_i - (h + b·x_i + c·y_i) <= t   for every reading i
//
// the Chebyshev (minimax) plane fit, a linear programme; the zone is 2t. The simplex method of
// the yalps package solves it exactly (at a vertex). It solves the dual programme, which has 4
// equality rows instead of 2n inequality rows and is several times faster on a 20 × 20 grid:
//
//   maximise  Σ w_i·(α_i − β_i)   subject to  Σ (α_i − β_i)·(1, x_i, y_i) = 0,  Σ (α_i + β_i) = 1,
//             α, β >= 0
//
// and by linear-programming duality its optimum equals the primal's t. Perpendicular and
// vertical zones differ by the factor 1/sqrt(1 + b² + c²): under 1e-6 for a board tilted less
// than 1 mm per metre, far below any reading's resolution.
import { solve } from 'yalps'

export interface ZonePoint { x: number, y: number, z: number }

/** Width of the minimum zone along Z. Throws RangeError on fewer than 3 points or a non-finite value. */
export function minimumZoneFlatness(points: ZonePoint[]): number {
  if (points.length < 3) throw new RangeError('A plane needs at least 3 readings.')
  if (!points.every(p => Number.isFinite(p.x) && Number.isFinite(p.y) && Number.isFinite(p.z))) {
    throw new RangeError('Every reading and position must be a finite number.')
  }
  // Centre and scale positions, and centre heights, so the simplex works on numbers near 1
  // whatever the board size (a 2.5 m board in mm would otherwise mix 1e3 and 1e-3).
  const n = points.length
  const mx = points.reduce((s, p) => s + p.x, 0) / n
  const my = points.reduce((s, p) => s + p.y, 0) / n
  const mz = points.reduce((s, p) => s + p.z, 0) / n
  const span = Math.max(...points.map(p => Math.max(Math.abs(p.x - mx), Math.abs(p.y - my))))
  if (!(span > 0) || !Number.isFinite(span)) throw new RangeError('The readings do not span an area.')
  const variables: [string, Record<string, number>][] = []
  points.forEach((p, i) => {
    const u = (p.x - mx) / span
    const v = (p.y - my) / span
    const w = p.z - mz
    variables.push([`a${i}`, { objective: w, sum: 1, sumX: u, sumY: v, total: 1 }])
    variables.push([`b${i}`, { objective: -w, sum: -1, sumX: -u, sumY: -v, total: 1 }])
  })
  const solution = solve({
    direction: 'maximize',
    objective: 'objective',
    constraints: { sum: { equal: 0 }, sumX: { equal: 0 }, sumY: { equal: 0 }, total: { equal: 1 } },
    variables,
  }, { precision: 1e-12 })
  if (solution.status !== 'optimal' || !Number.isFinite(solution.result)) {
    throw new RangeError(`The minimum-zone fit did not solve (${solution.status}).`)
  }
  // A zone is never negative; the solver's last bits may be.
  return Math.max(0, 2 * solution.result)
}
