// Input of the surfacing planner (also the body of POST /api/plans/surfacing), in the
// request's own units. Every rule gives a message that names the field and the problem.
import { z } from 'zod'
import { fromMm, formatLength, type LengthUnit } from './units'

/**
 * Deepest cut per pass as a fraction of the cutter diameter. Common practice, no published
 * source: a full-width cut in MDF or wood deeper than half the cutter's diameter overloads a
 * router cutter and its collet; surfacing passes are normally far shallower (0.25-0.5 mm).
 */
export const MAX_DEPTH_PER_PASS_FRACTION = 0.5

/** Sanity limits in millimetres: larger values are typing mistakes, not router work. */
export const PLANNER_LIMITS_MM = {
  area: 10_000,
  cutterDiameter: 150,
  overhang: 1_000,
  totalDepth: 100,
  safeZ: 200,
  feed: 100_000,
  minFeed: 1,
} as const
export const MAX_RPM = 60_000
export const MAX_WARMUP_SECONDS = 3_600
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
  units: z.enum(['mm', 'in'], { error: 'Units must be \'mm\' or \'in\'.' }),
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
  }, { error: 'Give the cutter\'s diameter and number of flutes.' }).strict(),
  stepoverPct: positive('Stepover')
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
    .min(1, { error: 'Spindle speed must be at least 1 rpm.' })
    .max(MAX_RPM, { error: `Spindle speed cannot be more than ${MAX_RPM} rpm.` }),
  direction: z.enum(['x', 'y'], { error: 'Direction must be \'x\' (lines along X) or \'y\' (lines along Y).' }),
  pattern: z.enum(['zigzag', 'one-way'], { error: 'Pattern must be \'zigzag\' or \'one-way\'.' }),
  safeZ: positive('Safe Z'),
  warmupSeconds: number('Warm-up time')
    .min(0, { error: 'Warm-up time cannot be negative.' })
    .max(MAX_WARMUP_SECONDS, { error: `Warm-up time cannot be more than ${MAX_WARMUP_SECONDS} s.` })
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
  const add = (path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message })
  const L = PLANNER_LIMITS_MM
  // Field checks above do not stop this refinement; only judge values that passed them.
  const fine = (n: number | undefined) => n !== undefined && Number.isFinite(n) && n > 0

  for (const axis of ['x', 'y'] as const) {
    if (v.area[axis] > limit(L.area) * (1 + 1e-12)) add(['area', axis], `Area ${axis.toUpperCase()} of ${show(v.area[axis])} is larger than any router bed (at most ${show(limit(L.area))}).`)
  }
  if (v.cutter.diameter > limit(L.cutterDiameter)) add(['cutter', 'diameter'], `Cutter diameter of ${show(v.cutter.diameter)} is larger than any router surfacing cutter (at most ${show(limit(L.cutterDiameter))}).`)
  if (v.overhang !== undefined && v.overhang > limit(L.overhang)) add(['overhang'], `Overhang of ${show(v.overhang)} is more than ${show(limit(L.overhang))}.`)
  if (v.totalDepth > limit(L.totalDepth)) add(['totalDepth'], `Total depth of ${show(v.totalDepth)} is more than ${show(limit(L.totalDepth))}.`)
  if (v.safeZ > limit(L.safeZ)) add(['safeZ'], `Safe Z of ${show(v.safeZ)} is more than ${show(limit(L.safeZ))} above the surface.`)
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
    if (v.finishingPass.depth >= v.totalDepth) {
      add(['finishingPass', 'depth'], `Finishing depth of ${show(v.finishingPass.depth)} must be less than the total depth of ${show(v.totalDepth)}.`)
    }
    else if (v.finishingPass.depth > maxDepth * (1 + 1e-12)) {
      add(['finishingPass', 'depth'], `Finishing depth of ${show(v.finishingPass.depth)} is more than half the cutter diameter (${show(maxDepth)}).`)
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

export type SurfacingInput = z.input<typeof SurfacingInputSchema>
export type SurfacingRequest = z.output<typeof SurfacingInputSchema>
