// Top-view model of a surfacing plan for the Planner's SVG. Work coordinates, Y pointing
// away from the operator (the drawing flips Y for the screen).
import type { Bounds, SurfacingPlan } from './surfacing'
import { formatLength, type LengthUnit } from './units'

export interface PreviewPoint { x: number, y: number }

export interface SurfacingPreview {
  units: LengthUnit
  /** The area being faced: work zero is its front-left corner. */
  area: { x: number, y: number, width: number, height: number }
  /** Everything the cutter's full width sweeps: use it (plus a margin) as the viewBox. */
  bounds: Bounds
  cutterDiameter: number
  /** Raster lines of one pass, in cutting order; each sweeps a band `sweptWidth` wide. */
  lines: { index: number, from: PreviewPoint, to: PreviewPoint, sweptWidth: number }[]
  /** Zigzag stepovers between lines (they cut too); empty for one-way. */
  links: { from: PreviewPoint, to: PreviewPoint }[]
  stepover: number
  direction: 'x' | 'y'
  pattern: 'zigzag' | 'one-way'
  /** Dimension labels for the area's two sides. */
  dimensions: { axis: 'x' | 'y', length: number, text: string }[]
}

export function surfacingPreview(plan: SurfacingPlan): SurfacingPreview {
  const { area, cutter, pattern } = plan.input
  const point = (along: number, across: number): PreviewPoint =>
    plan.rasterAxis === 'x' ? { x: along, y: across } : { x: across, y: along }
  const { from, to } = plan.lineSpan
  // One-way lines all run the way the first plunge shows (climb or conventional, see surfacing.ts).
  const plunge = plan.moves.find(m => m.kind === 'plunge')
  const plungeAlong = plunge ? (plan.rasterAxis === 'x' ? plunge.x : plunge.y) : from
  const oneWayReversed = pattern === 'one-way' && Math.abs(plungeAlong - to) < Math.abs(plungeAlong - from)
  const lines = plan.linePositions.map((across, index) => {
    const reversed = pattern === 'zigzag' ? index % 2 === 1 : oneWayReversed
    return {
      index,
      from: point(reversed ? to : from, across),
      to: point(reversed ? from : to, across),
      sweptWidth: cutter.diameter,
    }
  })
  const links = pattern === 'zigzag'
    ? lines.slice(1).map((line, i) => ({ from: lines[i]!.to, to: line.from }))
    : []
  return {
    units: plan.units,
    area: { x: 0, y: 0, width: area.x, height: area.y },
    bounds: { ...plan.sweptBounds },
    cutterDiameter: cutter.diameter,
    lines,
    links,
    stepover: plan.stepover.actual,
    direction: plan.rasterAxis,
    pattern,
    dimensions: [
      { axis: 'x', length: area.x, text: formatLength(area.x, plan.units) },
      { axis: 'y', length: area.y, text: formatLength(area.y, plan.units) },
    ],
  }
}
