// Does a plan stay inside the machine's travel? Machine settings are kept in millimetres.
//
// Machine coordinates (Jogwise convention): after homing, X and Y run from 0 to their travel;
// Z is 0 at the top of its travel and negative downwards, to -travelZ. Work zero (the area's
// front-left top corner) sits at `workZeroMm` in those coordinates.
import type { FieldIssue } from './issues'
import { formatLength, fromMm, toMm, type LengthUnit } from './units'

export interface MachineEnvelope {
  travelXMm: number
  travelYMm: number
  travelZMm: number
  /** Work zero in machine coordinates. Without it only the size of the motion is checked. */
  workZeroMm?: { x: number, y: number, z: number }
}

type Axis = 'x' | 'y' | 'z'

export interface TravelIssue extends FieldIssue {
  axis: Axis
  /** How far past the limit, in the plan's units. */
  excess: number
}

export interface TravelReport {
  ok: boolean
  issues: TravelIssue[]
  /** Smallest and largest work coordinate any move reaches, plan units. */
  extent: { min: Record<Axis, number>, max: Record<Axis, number> }
}

/** What checkTravel needs from a plan: the units and the end point of every straight move. */
export interface TravelPlan {
  units: LengthUnit
  moves: { x: number, y: number, z: number }[]
}

// Differences smaller than this are floating-point noise, not a real overrun.
const EPS_MM = 1e-9

export function checkTravel(plan: TravelPlan, machine: MachineEnvelope): TravelReport {
  const u = plan.units
  const min = { x: Infinity, y: Infinity, z: Infinity }
  const max = { x: -Infinity, y: -Infinity, z: -Infinity }
  for (const m of plan.moves) {
    for (const axis of ['x', 'y', 'z'] as const) {
      min[axis] = Math.min(min[axis], m[axis])
      max[axis] = Math.max(max[axis], m[axis])
    }
  }
  const travel: Record<Axis, number> = { x: machine.travelXMm, y: machine.travelYMm, z: machine.travelZMm }
  const show = (mm: number) => formatLength(fromMm(mm, u), u)
  const issues: TravelIssue[] = []
  const report = (axis: Axis, excessMm: number, message: string) =>
    issues.push({ path: `travel.${axis}`, axis, excess: fromMm(excessMm, u), message })

  for (const axis of ['x', 'y', 'z'] as const) {
    const A = axis.toUpperCase()
    const lowMm = toMm(min[axis], u)
    const highMm = toMm(max[axis], u)
    const t = travel[axis]
    if (!machine.workZeroMm) {
      const span = highMm - lowMm
      if (span > t + EPS_MM) {
        report(axis, span - t, `${A} needs ${show(span)} of travel, ${show(span - t)} more than the machine travel of ${show(t)}.`)
      }
      continue
    }
    const zero = machine.workZeroMm[axis]
    // Machine range of this axis: X/Y 0..travel, Z -travel..0.
    const [lo, hi] = axis === 'z' ? [-t, 0] : [0, t]
    const low = zero + lowMm
    const high = zero + highMm
    if (high > hi + EPS_MM) {
      report(axis, high - hi, axis === 'z'
        ? `Z goes ${show(high - hi)} above the top of its travel; lower the safe Z or set work zero lower.`
        : `${A} goes ${show(high - hi)} past the machine travel of ${show(t)}.`)
    }
    if (low < lo - EPS_MM) {
      report(axis, lo - low, axis === 'z'
        ? `Z goes ${show(lo - low)} below the bottom of its travel of ${show(t)}.`
        : `${A} goes ${show(lo - low)} past the home end of its travel (below machine ${A} 0).`)
    }
  }
  return { ok: issues.length === 0, issues, extent: { min, max } }
}
