// Input of the surfacing planner (also the body of POST /api/plans/surfacing), in the
// request's own units. Every rule gives a message that names the field and the problem.
import { z } from 'zod'
import { fromMm, formatLength, type LengthUnit } from './units'
import { UNITS } from '../rules/enums'

/**
 * Deepest cut per pass as a fraction of the cutter diameter. Common practice, no published
 * source: a full-width cut in MDF or wood deeper than half the cutter's diameter overloads a
 * router cutter and its collet; surfacing passes are normally far shallower (0.25-0.5 mm).
 */
export const MAX_DEPTH_PER_PASS_FRACTION = 0.5

/**
 * Sanity limits in millimetres: values outside them are typing mistakes, not router work.
 * The lower limits are common practice, no published source: an area under 1 mm or a cutter
 * under 0.5 mm is not a facing job, and a safe Z under 0.5 mm does not clear a board.
 */
export const PLANNER_LIMITS_MM = {
  area: 10_000,
  minArea: 1,
  cutterDiameter: 150,
  minCutterDiameter: 0.5,
  overhang: 1_000,
  totalDepth: 100,
  safeZ: 200,
  minSafeZ: 0.5,
  feed: 100_000,
  minFeed: 1,
} as const
/**
 * The thinnest cut a pass may take, in mm. Common practice, no published source: a paper-feeler
 * Z zero is itself uncertain by a few hundredths of a millimetre, so a thinner step is not a
 * cut, and at the program's 0.001 mm resolution it could print as Z0.000 (a full pass in air).
 */
export const MIN_CUT_MM = 0.01
export const MIN_RPM = 1_000
export const MAX_RPM = 60_000
/** A spin-up dwell is seconds, not the minutes-long warm-up of the start-up procedure. */
export const MAX_SPIN_UP_SECONDS = 120
export const MIN_STEPOVER_PCT = 1
export const MAX_LINES_PER_PASS = 20_000
export const MAX_PASSES = 500
export const MAX_TOTAL_LINES = 100_000

/** Tolerance for "how many stepovers fit": 0.7 * 25.4 is 17.779999999999998 in binary floating point. */
export function ceilWithTolerance(x: number): number {
  return Math.ceil(x - 1e-9 * Math.max(1, Math.abs(x)))
}

const number = (label: string) => z.number({ error: `${label} must be a number.` })
const positive = (label: string) => number(label).positive({ error: `${label} must be more than 0.` })

export const SurfacingInputSchema = z.object({
  units: z.enum(UNITS, { error: 'Units must be \'mm\' or \'in\'.' }),
  area: z.object({
    x: positive('Area X'),
    y: positive('Area Y'),
  }, { error: 'Give the area as its X and Y sizes.' }).strict(),
  cutter: z.object({
    diameter: positive('Cutter diameter'),
    flutes: number('Flutes')
      .int({ error: 'Flutes must be a whole number.' })
      .min(1, { error: 'A cutter has at least 1 flute.' })
      .max(16, { error: 'More than 16 flutes is not a router cutter.' }),
    // From the shop's cutter list: a spindle speed above it is a WARNING on the plan.
    name: z.string({ error: 'Cutter name must be text.' }).trim().max(80, { error: 'Keep the cutter name under 80 characters.' }).optional(),
    maxRpm: number('Cutter maximum speed').int({ error: 'Cutter maximum speed must be a whole number of rpm.' })
      .min(MIN_RPM, { error: `Cutter maximum speed must be at least ${MIN_RPM} rpm.` })
      .max(MAX_RPM, { error: `Cutter maximum speed cannot be more than ${MAX_RPM} rpm.` }).optional(),
  }, { error: 'Give the cutter\'s diameter and number of flutes.' }).strict(),
  toolId: number('Cutter id').int({ error: 'Cutter id must be a whole number.' })
    .positive({ error: 'Cutter id must be more than 0.' }).optional(),
  stepoverPct: positive('Stepover')
    .min(MIN_STEPOVER_PCT, { error: `Stepover must be at least ${MIN_STEPOVER_PCT} % of the cutter diameter.` })
    .max(100, { error: 'Stepover cannot be more than 100 % of the cutter diameter, or strips between lines stay uncut.' }),
  overhang: number('Overhang')
    .min(0, { error: 'Overhang cannot be negative: the cutter centre must reach every edge of the area.' })
    .optional(),
  totalDepth: positive('Total depth'),
  depthPerPass: positive('Depth per pass'),
  finishingPass: z.object({
    depth: positive('Finishing depth'),
  }, { error: 'Give the finishing pass as its depth.' }).strict().optional(),
  feed: positive('Feed'),
  plunge: positive('Plunge rate'),
  rpm: positive('Spindle speed')
    .min(MIN_RPM, { error: `Spindle speed must be at least ${MIN_RPM} rpm.` })
    .max(MAX_RPM, { error: `Spindle speed cannot be more than ${MAX_RPM} rpm.` }),
  direction: z.enum(['x', 'y'], { error: 'Direction must be \'x\' (lines along X) or \'y\' (lines along Y).' }),
  pattern: z.enum(['zigzag', 'one-way'], { error: 'Pattern must be \'zigzag\' or \'one-way\'.' }),
  // One-way only: zigzag alternates climb and conventional by its nature.
  milling: z.enum(['climb', 'conventional'], { error: 'Milling must be \'climb\' or \'conventional\'.' }).optional(),
  safeZ: positive('Safe Z'),
  // Seconds the spindle gets to reach speed after M3 (G4 P), not the start-up warm-up.
  spinUpSeconds: number('Spin-up dwell')
    .min(0, { error: 'Spin-up dwell cannot be negative.' })
    .max(MAX_SPIN_UP_SECONDS, { error: `Spin-up dwell cannot be more than ${MAX_SPIN_UP_SECONDS} s; the spindle warm-up belongs to the start-up procedure.` })
    .optional(),
  machineId: number('Machine id').int({ error: 'Machine id must be a whole number.' })
    .positive({ error: 'Machine id must be more than 0.' }).optional(),
  runId: z.string({ error: 'Run id must be text.' })
    .min(1, { error: 'Run id cannot be empty.' })
    .max(36, { error: 'Run id is at most 36 characters.' }).optional(),
// A misspelt field (e.g. "stepover" for "stepoverPct") is refused, not silently ignored.
}).strict().superRefine((v, ctx) => {
  const u: LengthUnit = v.units
  const limit = (mm: number) => fromMm(mm, u)
  const show = (value: number) => formatLength(value, u)
  // Thin cuts need more decimals than sizes: 0.005 mm is not "0.01 mm".
  const showFine = (value: number) => formatLength(value, u, u === 'mm' ? 3 : 4)
  const add = (path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message })
  const L = PLANNER_LIMITS_MM
  // Field checks above do not stop this refinement; only judge values that passed them.
  const fine = (n: number | undefined) => n !== undefined && Number.isFinite(n) && n > 0

  const below = (value: number, mm: number) => fine(value) && value < limit(mm) * (1 - 1e-12)
  for (const axis of ['x', 'y'] as const) {
    if (v.area[axis] > limit(L.area) * (1 + 1e-12)) add(['area', axis], `Area ${axis.toUpperCase()} of ${show(v.area[axis])} is larger than any router bed (at most ${show(limit(L.area))}).`)
    else if (below(v.area[axis], L.minArea)) add(['area', axis], `Area ${axis.toUpperCase()} of ${show(v.area[axis])} is too small to face (at least ${show(limit(L.minArea))}).`)
  }
  if (v.cutter.diameter > limit(L.cutterDiameter)) add(['cutter', 'diameter'], `Cutter diameter of ${show(v.cutter.diameter)} is larger than any router surfacing cutter (at most ${show(limit(L.cutterDiameter))}).`)
  else if (below(v.cutter.diameter, L.minCutterDiameter)) add(['cutter', 'diameter'], `Cutter diameter of ${show(v.cutter.diameter)} is too small for facing (at least ${show(limit(L.minCutterDiameter))}).`)
  if (v.overhang !== undefined && v.overhang > limit(L.overhang)) add(['overhang'], `Overhang of ${show(v.overhang)} is more than ${show(limit(L.overhang))}.`)
  if (v.totalDepth > limit(L.totalDepth)) add(['totalDepth'], `Total depth of ${show(v.totalDepth)} is more than ${show(limit(L.totalDepth))}.`)
  else if (below(v.totalDepth, MIN_CUT_MM)) add(['totalDepth'], `Total depth of ${showFine(v.totalDepth)} is too thin to cut (at least ${showFine(limit(MIN_CUT_MM))}).`)
  if (below(v.depthPerPass, MIN_CUT_MM)) add(['depthPerPass'], `Depth per pass of ${showFine(v.depthPerPass)} is too thin to cut (at least ${showFine(limit(MIN_CUT_MM))}).`)
  if (v.finishingPass && below(v.finishingPass.depth, MIN_CUT_MM)) add(['finishingPass', 'depth'], `Finishing depth of ${showFine(v.finishingPass.depth)} is too thin to cut (at least ${showFine(limit(MIN_CUT_MM))}).`)
  if (v.safeZ > limit(L.safeZ)) add(['safeZ'], `Safe Z of ${show(v.safeZ)} is more than ${show(limit(L.safeZ))} above the surface.`)
  else if (below(v.safeZ, L.minSafeZ)) add(['safeZ'], `Safe Z of ${show(v.safeZ)} does not clear the board (at least ${show(limit(L.minSafeZ))} above the surface).`)
  if (v.milling !== undefined && v.pattern === 'zigzag') {
    add(['milling'], 'Zigzag alternates climb and conventional from line to line; choose one-way to cut every line the same way.')
  }
  for (const key of ['feed', 'plunge'] as const) {
    const label = key === 'feed' ? 'Feed' : 'Plunge rate'
    if (!fine(v[key])) continue
    if (v[key] > limit(L.feed)) add([key], `${label} of ${v[key]} ${u}/min is faster than any router moves (at most ${Math.round(limit(L.feed))} ${u}/min).`)
    if (v[key] < limit(L.minFeed)) add([key], `${label} of ${v[key]} ${u}/min is too slow to be real (at least ${limit(L.minFeed)} ${u}/min).`)
  }

  if (!fine(v.cutter.diameter)) return
  const maxDepth = v.cutter.diameter * MAX_DEPTH_PER_PASS_FRACTION
  if (fine(v.depthPerPass) && v.depthPerPass > maxDepth * (1 + 1e-12)) {
    add(['depthPerPass'], `Depth per pass of ${show(v.depthPerPass)} is more than half the cutter diameter (${show(maxDepth)}), too deep for one pass.`)
  }
  if (v.finishingPass && fine(v.finishingPass.depth) && fine(v.totalDepth)) {
    const remainder = v.totalDepth - v.finishingPass.depth
    if (v.finishingPass.depth >= v.totalDepth) {
      add(['finishingPass', 'depth'], `Finishing depth of ${show(v.finishingPass.depth)} must be less than the total depth of ${show(v.totalDepth)}.`)
    }
    else if (fine(v.depthPerPass) && v.finishingPass.depth > v.depthPerPass * (1 + 1e-12)) {
      add(['finishingPass', 'depth'], `Finishing depth of ${show(v.finishingPass.depth)} is deeper than the depth per pass of ${show(v.depthPerPass)}; a finishing pass is the lightest cut.`)
    }
    else if (v.finishingPass.depth > maxDepth * (1 + 1e-12)) {
      add(['finishingPass', 'depth'], `Finishing depth of ${show(v.finishingPass.depth)} is more than half the cutter diameter (${show(maxDepth)}).`)
    }
    else if (remainder < limit(MIN_CUT_MM) * (1 - 1e-9)) {
      // Refused rather than merged: the person chose a finishing pass, so they say which depth wins.
      add(['finishingPass', 'depth'], `Finishing depth of ${formatLength(v.finishingPass.depth, u, u === 'mm' ? 4 : 5)} leaves only ${formatLength(remainder, u, u === 'mm' ? 4 : 5)} for roughing, too thin to cut (at least ${showFine(limit(MIN_CUT_MM))}); turn the finishing pass off or make it at most ${showFine(v.totalDepth - limit(MIN_CUT_MM))}.`)
    }
  }

  if (!fine(v.stepoverPct) || v.stepoverPct > 100 || !fine(v.area.x) || !fine(v.area.y) || (v.overhang ?? 0) < 0) return
  if (!fine(v.totalDepth) || !fine(v.depthPerPass) || (v.finishingPass && !(v.finishingPass.depth < v.totalDepth))) return
  const stepover = v.cutter.diameter * v.stepoverPct / 100
  const overhang = v.overhang ?? 0
  const crossSpan = (v.direction === 'x' ? v.area.y : v.area.x) + 2 * overhang
  const lines = ceilWithTolerance(crossSpan / stepover) + 1
  const roughing = v.totalDepth - (v.finishingPass?.depth ?? 0)
  const passes = roughing > 0 ? ceilWithTolerance(roughing / v.depthPerPass) + (v.finishingPass ? 1 : 0) : 1
  if (lines > MAX_LINES_PER_PASS) {
    add(['stepoverPct'], `This stepover needs ${lines} raster lines per pass (at most ${MAX_LINES_PER_PASS}); raise the stepover or use a larger cutter.`)
  }
  else if (passes > MAX_PASSES) {
    add(['depthPerPass'], `This depth per pass needs ${passes} passes (at most ${MAX_PASSES}); cut deeper per pass or less in total.`)
  }
  else if (lines * passes > MAX_TOTAL_LINES) {
    add(['depthPerPass'], `The plan would cut ${lines * passes} raster lines in all (at most ${MAX_TOTAL_LINES}); use fewer passes or a larger stepover.`)
  }
})

/** A stored plan's input in today's field names: `warmupSeconds` was renamed `spinUpSeconds`. */
export function upgradeStoredInput(input: unknown): unknown {
  if (!input || typeof input !== 'object' || !('warmupSeconds' in input)) return input
  const { warmupSeconds, ...rest } = input as Record<string, unknown>
  return 'spinUpSeconds' in rest ? rest : { ...rest, spinUpSeconds: warmupSeconds }
}

export type SurfacingInput = z.input<typeof SurfacingInputSchema>
export type SurfacingRequest = z.output<typeof SurfacingInputSchema>
