// Surfacing planner: raster layout, passes, moves, lengths, time, volume, chip load.
//
// Layout convention (Jogwise's own):
// - Work zero is the front-left corner of the area on its top surface; the area spans
//   X 0..area.x, Y 0..area.y and the last pass cuts at Z = -totalDepth.
// - `overhang` is how far the cutter CENTRE travels past every edge of the area (default 0:
//   the centre reaches each edge, so half the cutter hangs past it and no lip is left).
//   The cutter's swept width therefore reaches overhang + D/2 past each edge.
// - Raster lines run along `direction` from -overhang to size + overhang. Their centres are
//   spread evenly across the other axis from -overhang to size + overhang, with the fewest
//   lines whose spacing does not exceed the requested stepover. Neighbouring lines are at most
//   one diameter apart, so every point of the area is within the cutter radius of a cut.
// - Zigzag joins lines with cutting stepovers and turns each later pass back over the board
//   from where the last one ended; one-way retracts to safe Z and returns for every line.
// - Climb or conventional (one-way): with M3 the spindle turns clockwise seen from above, so a
//   line is climb-milled when the uncut stock lies to the right of the direction of travel
//   (climb or down milling: each tooth enters the stock at full chip thickness and leaves it at
//   none, its edge moving with the work's motion relative to the cutter; the definition of
//   down milling in Machinery's Handbook, milling practice, from memory).
//   Lines are cut in ascending order across, so the stock is on the + side of each line:
//   along X that is left of +X travel (conventional), along Y right of +Y travel (climb).
import { toIssues, type Checked, type FieldIssue } from './issues'
import { moveSeconds, DEFAULT_ACCEL_MM_S2, DEFAULT_RAPID_MM_MIN } from './motion'
import { ceilWithTolerance, SurfacingInputSchema, type SurfacingRequest } from './surfacing-input'
import { checkTravel, type MachineEnvelope, type TravelReport } from './travel'
import { chipLoadFromFeed, surfaceSpeedFromRpm } from './feeds'
import { DWELL_UNITS, type DwellUnit } from '../rules/enums'
import { surfaceSpeedUnitFor, toMm, type LengthUnit, type SurfaceSpeedUnit } from './units'

export type MoveKind = 'retract' | 'rapid' | 'plunge' | 'cut' | 'step'

/** One straight move to (x, y, z), work coordinates in the plan's units. */
export interface SurfacingMove {
  kind: MoveKind
  x: number
  y: number
  z: number
  /** Index into plan.passes. */
  pass: number
}

export interface SurfacingPass {
  /** Depth this pass removes. */
  depth: number
  /** Z level it cuts at (negative, below the top surface). */
  z: number
  finishing: boolean
}

export type Milling = 'climb' | 'conventional'
/** How this machine's control reads the P word of G4 (NISTIR 6556 says seconds). */
export { DWELL_UNITS, type DwellUnit }
/**
 * Default for one-way when none is chosen. Common practice, no published source: on belt- and
 * rack-driven routers with backlash, climb milling can pull the cutter forward into the work.
 */
export const DEFAULT_MILLING: Milling = 'conventional'

export interface PlanWarning { path: string, signal: 'WARNING' | 'CAUTION', message: string }

export interface SurfacingOptions {
  /** How the machine's control reads G4 P (default seconds, as NISTIR 6556). */
  dwellUnit?: DwellUnit
  /** Machine acceleration, mm/s² (default 500). */
  accelMmS2?: number
  /** Rapid traverse rate, mm/min (default 5000). */
  rapidMmMin?: number
  /** When given, the plan fails with `travel.*` issues if any move leaves the machine's travel. */
  machine?: MachineEnvelope
}

export interface SurfacingPlan {
  input: SurfacingRequest
  units: LengthUnit
  cutterRadius: number
  /** Resolved overhang of the cutter centre past each edge. */
  overhang: number
  /** Axis the raster lines run along, and the axis they step across. */
  rasterAxis: 'x' | 'y'
  stepAxis: 'x' | 'y'
  stepover: { requested: number, actual: number, actualPct: number }
  lineCount: number
  /** Centre of each raster line on the step axis, ascending. */
  linePositions: number[]
  /** Where every raster line starts and ends on the raster axis. */
  lineSpan: { from: number, to: number }
  passes: SurfacingPass[]
  /** One-way cuts every line the same way; zigzag alternates from line to line. */
  milling: Milling | 'alternating'
  moves: SurfacingMove[]
  /** Rectangle the cutter centre visits, and the one its full width sweeps. */
  centreBounds: Bounds
  sweptBounds: Bounds
  /** Path lengths in plan units: cutting = raster lines + zigzag stepovers; rapid includes retracts. */
  lengths: { cutting: number, plunge: number, rapid: number, total: number }
  /** Seconds; movement under the trapezoidal profile, plus the spin-up dwell after M3. */
  time: { cutting: number, plunge: number, rapid: number, dwell: number, total: number }
  /** Material removed from the area itself (the overhang cuts air), in units³. */
  removedVolume: number
  /** Feed per tooth, plan units. */
  chipLoad: number
  surfaceSpeed: number
  surfaceSpeedUnit: SurfaceSpeedUnit
  settings: { accelMmS2: number, rapidMmMin: number, dwellUnit: DwellUnit }
  /** Hazards found in the input that do not stop the plan (e.g. spindle above the cutter's maximum). */
  warnings: PlanWarning[]
  /** Present when options.machine was given. */
  travel?: TravelReport
}

export interface Bounds { minX: number, minY: number, maxX: number, maxY: number }

function passLevels(v: SurfacingRequest): SurfacingPass[] {
  const finishing = v.finishingPass?.depth ?? 0
  const roughing = v.totalDepth - finishing
  // Equal roughing passes, none deeper than asked; the finishing pass comes last.
  const count = ceilWithTolerance(roughing / v.depthPerPass)
  const each = roughing / count
  const passes: SurfacingPass[] = []
  for (let k = 1; k <= count; k++) {
    passes.push({ depth: each, z: k === count ? -roughing : -k * each, finishing: false })
  }
  if (finishing > 0) passes.push({ depth: finishing, z: -v.totalDepth, finishing: true })
  return passes
}

function validateOptions(options: SurfacingOptions): FieldIssue[] {
  const issues: FieldIssue[] = []
  const check = (key: 'accelMmS2' | 'rapidMmMin', label: string) => {
    const value = options[key]
    if (value !== undefined && !(Number.isFinite(value) && value > 0)) {
      issues.push({ path: `options.${key}`, message: `${label} must be a number more than 0.` })
    }
  }
  check('accelMmS2', 'Machine acceleration')
  check('rapidMmMin', 'Rapid rate')
  if (options.dwellUnit !== undefined && !DWELL_UNITS.includes(options.dwellUnit)) {
    issues.push({ path: 'options.dwellUnit', message: 'Dwell unit must be \'seconds\' or \'milliseconds\'.' })
  }
  return issues
}

/** Validates the input and plans the facing; see the layout convention at the top of this file. */
export function planSurfacing(input: unknown, options: SurfacingOptions = {}): Checked<'plan', SurfacingPlan> {
  const parsed = SurfacingInputSchema.safeParse(input)
  if (!parsed.success) return { ok: false, issues: toIssues(parsed.error) }
  const optionIssues = validateOptions(options)
  if (optionIssues.length) return { ok: false, issues: optionIssues }
  const v = parsed.data
  const accelMmS2 = options.accelMmS2 ?? DEFAULT_ACCEL_MM_S2
  const rapidMmMin = options.rapidMmMin ?? DEFAULT_RAPID_MM_MIN

  const radius = v.cutter.diameter / 2
  const overhang = v.overhang ?? 0
  const rasterAxis = v.direction
  const stepAxis = rasterAxis === 'x' ? 'y' : 'x'
  const requested = v.cutter.diameter * v.stepoverPct / 100
  const crossSpan = v.area[stepAxis] + 2 * overhang
  const lineCount = ceilWithTolerance(crossSpan / requested) + 1
  const actual = crossSpan / (lineCount - 1)
  const linePositions = Array.from({ length: lineCount }, (_, i) =>
    i === lineCount - 1 ? v.area[stepAxis] + overhang : i * actual - overhang)
  const lineSpan = { from: 0 - overhang, to: v.area[rasterAxis] + overhang }
  const passes = passLevels(v)
  const milling = v.pattern === 'zigzag' ? 'alternating' : (v.milling ?? DEFAULT_MILLING)

  const moves: SurfacingMove[] = []
  const at = { along: 0, across: 0, z: 0 }
  const push = (kind: MoveKind, along: number, across: number, z: number, pass: number) => {
    at.along = along
    at.across = across
    at.z = z
    moves.push(rasterAxis === 'x'
      ? { kind, x: along, y: across, z, pass }
      : { kind, x: across, y: along, z, pass })
  }
  // Estimates assume the cutter starts where Z was zeroed, at work zero.
  push('retract', 0, 0, v.safeZ, 0)
  if (v.pattern === 'zigzag') {
    push('rapid', lineSpan.from, linePositions[0]!, v.safeZ, 0)
    passes.forEach((pass, p) => {
      push('plunge', at.along, at.across, pass.z, p)
      const order = p % 2 === 0 ? linePositions : [...linePositions].reverse()
      order.forEach((across, i) => {
        if (i > 0) push('step', at.along, across, pass.z, p)
        push('cut', at.along === lineSpan.from ? lineSpan.to : lineSpan.from, across, pass.z, p)
      })
    })
  }
  else {
    // See the climb rule at the top: cutting towards +along is climb only along Y.
    const forward = (milling === 'climb') === (rasterAxis === 'y')
    const [start, end] = forward ? [lineSpan.from, lineSpan.to] : [lineSpan.to, lineSpan.from]
    passes.forEach((pass, p) => {
      for (const across of linePositions) {
        if (at.z < v.safeZ) push('retract', at.along, at.across, v.safeZ, p)
        push('rapid', start, across, v.safeZ, p)
        push('plunge', start, across, pass.z, p)
        push('cut', end, across, pass.z, p)
      }
    })
  }
  push('retract', at.along, at.across, v.safeZ, passes.length - 1)

  const lengths = { cutting: 0, plunge: 0, rapid: 0, total: 0 }
  const time = { cutting: 0, plunge: 0, rapid: 0, dwell: v.spinUpSeconds ?? 0, total: 0 }
  const feedMm = toMm(v.feed, v.units)
  const plungeMm = toMm(v.plunge, v.units)
  let prev = { x: 0, y: 0, z: 0 }
  for (const m of moves) {
    const length = Math.hypot(m.x - prev.x, m.y - prev.y, m.z - prev.z)
    const lengthMm = toMm(length, v.units)
    if (m.kind === 'cut' || m.kind === 'step') {
      lengths.cutting += length
      time.cutting += moveSeconds(lengthMm, feedMm, accelMmS2)
    }
    else if (m.kind === 'plunge') {
      lengths.plunge += length
      time.plunge += moveSeconds(lengthMm, plungeMm, accelMmS2)
    }
    else {
      lengths.rapid += length
      time.rapid += moveSeconds(lengthMm, rapidMmMin, accelMmS2)
    }
    prev = m
  }
  lengths.total = lengths.cutting + lengths.plunge + lengths.rapid
  time.total = time.cutting + time.plunge + time.rapid + time.dwell

  const centreAlong = { min: lineSpan.from, max: lineSpan.to }
  const centreAcross = { min: 0 - overhang, max: v.area[stepAxis] + overhang }
  const centreBounds: Bounds = rasterAxis === 'x'
    ? { minX: centreAlong.min, maxX: centreAlong.max, minY: centreAcross.min, maxY: centreAcross.max }
    : { minX: centreAcross.min, maxX: centreAcross.max, minY: centreAlong.min, maxY: centreAlong.max }
  const sweptBounds: Bounds = {
    minX: centreBounds.minX - radius,
    minY: centreBounds.minY - radius,
    maxX: centreBounds.maxX + radius,
    maxY: centreBounds.maxY + radius,
  }

  const plan: SurfacingPlan = {
    input: v,
    units: v.units,
    cutterRadius: radius,
    overhang,
    rasterAxis,
    stepAxis,
    stepover: { requested, actual, actualPct: (actual / v.cutter.diameter) * 100 },
    lineCount,
    linePositions,
    lineSpan,
    passes,
    milling,
    moves,
    centreBounds,
    sweptBounds,
    lengths,
    time,
    removedVolume: v.area.x * v.area.y * v.totalDepth,
    chipLoad: chipLoadFromFeed(v.feed, v.cutter.flutes, v.rpm),
    surfaceSpeed: surfaceSpeedFromRpm(v.rpm, v.cutter.diameter, v.units),
    surfaceSpeedUnit: surfaceSpeedUnitFor(v.units),
    settings: { accelMmS2, rapidMmMin, dwellUnit: options.dwellUnit ?? 'seconds' },
    warnings: [],
  }
  if (v.cutter.maxRpm !== undefined && v.rpm > v.cutter.maxRpm) {
    const name = v.cutter.name ? ` (${v.cutter.name})` : ''
    plan.warnings.push({ path: 'rpm', signal: 'WARNING', message: `Spindle speed ${Math.round(v.rpm)} rpm is above the cutter's maximum of ${v.cutter.maxRpm} rpm${name}. A cutter run past its rated speed can break apart or throw its inserts.` })
  }
  if (options.machine) {
    const travel = checkTravel(plan, options.machine)
    if (!travel.ok) return { ok: false, issues: travel.issues.map(({ path, message }) => ({ path, message })) }
    plan.travel = travel
  }
  return { ok: true, plan }
}

/** Flat figures for storing with a run or showing in a summary card. */
export function summarizeSurfacing(plan: SurfacingPlan) {
  return {
    units: plan.units,
    lineCount: plan.lineCount,
    passCount: plan.passes.length,
    passDepths: plan.passes.map(p => p.depth),
    stepover: plan.stepover.actual,
    stepoverPct: plan.stepover.actualPct,
    cuttingLength: plan.lengths.cutting,
    rapidLength: plan.lengths.rapid,
    plungeLength: plan.lengths.plunge,
    totalSeconds: plan.time.total,
    removedVolume: plan.removedVolume,
    chipLoad: plan.chipLoad,
    surfaceSpeed: plan.surfaceSpeed,
    surfaceSpeedUnit: plan.surfaceSpeedUnit,
    totalDepth: plan.input.totalDepth,
    milling: plan.milling,
    warnings: plan.warnings.map(w => `${w.signal}: ${w.message}`),
  }
}
export type SurfacingSummary = ReturnType<typeof summarizeSurfacing>
