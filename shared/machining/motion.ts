// Time for one straight move under a trapezoidal velocity profile: accelerate at a constant
// rate to the commanded speed, cruise, decelerate to rest. Raster moves end at 90 degree
// corners, so each move is taken to start and end at rest (a slight over-estimate on
// controllers with cornering tolerance, never an under-estimate).

export const DEFAULT_ACCEL_MM_S2 = 500
export const DEFAULT_RAPID_MM_MIN = 5000

/**
 * Seconds to travel `length` mm at `rateMmMin` with acceleration `accelMmS2`.
 * Long moves: t = L/v + v/a. Moves too short to reach v (L < v^2/a): t = 2 * sqrt(L/a).
 */
export function moveSeconds(length: number, rateMmMin: number, accelMmS2: number): number {
  if (length <= 0) return 0
  const v = rateMmMin / 60
  if (!Number.isFinite(accelMmS2)) return length / v
  const rampDistance = (v * v) / accelMmS2
  return length >= rampDistance
    ? length / v + v / accelMmS2
    : 2 * Math.sqrt(length / accelMmS2)
}
