// Speeds and feeds: spindle speed from surface speed and back, feed from chip load and back,
// material removal rate. Formulas as in the machining handbooks (inch: N = 12V/(pi D);
// metric: n = 1000 Vc/(pi D); feed = chip load x flutes x rpm; MRR = width x depth x feed).
import { z } from 'zod'
import { toIssues, type Checked } from './issues'
import { surfaceSpeedUnitFor, type LengthUnit, type SurfaceSpeedUnit } from './units'
import { UNITS } from '../rules/enums'

function requirePositive(name: string, value: number) {
  if (!Number.isFinite(value) || value <= 0) {
    throw new RangeError(`${name} must be a finite number greater than zero (got ${value})`)
  }
}

/** Length units per surface-speed unit: 1000 mm in a metre, 12 in in a foot. */
function perSurfaceUnit(unit: LengthUnit): number {
  return unit === 'mm' ? 1000 : 12
}

/**
 * Spindle speed in rpm. Metric: surface speed in m/min, diameter in mm.
 * Inch: surface speed in ft/min (SFM), diameter in inches.
 */
export function rpmFromSurfaceSpeed(surfaceSpeed: number, diameter: number, unit: LengthUnit): number {
  requirePositive('Surface speed', surfaceSpeed)
  requirePositive('Diameter', diameter)
  return (perSurfaceUnit(unit) * surfaceSpeed) / (Math.PI * diameter)
}

/** Surface speed (m/min for mm, SFM for in) of a cutter of this diameter at this rpm. */
export function surfaceSpeedFromRpm(rpm: number, diameter: number, unit: LengthUnit): number {
  requirePositive('Spindle speed', rpm)
  requirePositive('Diameter', diameter)
  return (Math.PI * diameter * rpm) / perSurfaceUnit(unit)
}

/** Feed (length per minute) = chip load per tooth x flutes x rpm; unit follows the chip load. */
export function feedFromChipLoad(chipLoad: number, flutes: number, rpm: number): number {
  requirePositive('Chip load', chipLoad)
  requirePositive('Flutes', flutes)
  requirePositive('Spindle speed', rpm)
  return chipLoad * flutes * rpm
}

/** Chip load (feed per tooth) = feed / (flutes x rpm). */
export function chipLoadFromFeed(feed: number, flutes: number, rpm: number): number {
  requirePositive('Feed', feed)
  requirePositive('Flutes', flutes)
  requirePositive('Spindle speed', rpm)
  return feed / (flutes * rpm)
}

/** Material removal rate in length^3 per minute (mm^3/min or in^3/min). */
export function materialRemovalRate(widthOfCut: number, depthOfCut: number, feed: number): number {
  requirePositive('Width of cut', widthOfCut)
  requirePositive('Depth of cut', depthOfCut)
  requirePositive('Feed', feed)
  return widthOfCut * depthOfCut * feed
}

/** Sensible limits of the Feeds screen, in mm, mm/min and rpm (10 rpm still admits slow milling-cutter examples). */
export const FEEDS_LIMITS_MM = {
  minDiameter: 0.1, maxDiameter: 150, minRpm: 10, maxRpm: 60_000, minChipLoad: 0.0005, maxChipLoad: 5,
  minFeed: 1, maxFeed: 100_000, minCut: 0.001, maxDepth: 100,
} as const

const positive = (label: string) => z
  .number({ error: `${label} must be a number.` })
  .refine(Number.isFinite, { error: `${label} must be a finite number.` })
  .refine(v => v > 0, { error: `${label} must be greater than zero.` })

/** Input of the Feeds screen: give rpm or surface speed, and chip load or feed. */
export const FeedsInputSchema = z.object({
  units: z.enum(UNITS, { error: 'Units must be \'mm\' or \'in\'.' }),
  diameter: positive('Cutter diameter'),
  flutes: z.number({ error: 'Flutes must be a number.' })
    .int({ error: 'Flutes must be a whole number.' })
    .min(1, { error: 'A cutter has at least 1 flute.' })
    .max(100, { error: 'A cutter with more than 100 teeth is not a milling cutter.' }),
  rpm: positive('Spindle speed').optional(),
  surfaceSpeed: positive('Surface speed').optional(),
  chipLoad: positive('Chip load').optional(),
  feed: positive('Feed').optional(),
  widthOfCut: positive('Width of cut').optional(),
  depthOfCut: positive('Depth of cut').optional(),
}).superRefine((input, ctx) => {
  // Bounds in mm (mm/min, m/min), converted for inch input. Common practice, no published
  // source: outside them a value is a typing mistake, not router work.
  const inch = input.units === 'in'
  const len = (mm: number) => inch ? mm / 25.4 : mm
  const u = inch ? 'in' : 'mm'
  const show = (v: number) => String(+v.toPrecision(4))
  const bound = (path: keyof typeof input, label: string, value: number | undefined, min: number, max: number, unit: string) => {
    if (value === undefined || !Number.isFinite(value) || value <= 0) return
    if (value < min * (1 - 1e-12)) ctx.addIssue({ code: 'custom', path: [path], message: `${label} must be at least ${show(min)} ${unit}.` })
    else if (value > max * (1 + 1e-12)) ctx.addIssue({ code: 'custom', path: [path], message: `${label} must be at most ${show(max)} ${unit}.` })
  }
  bound('diameter', 'Cutter diameter', input.diameter, len(FEEDS_LIMITS_MM.minDiameter), len(FEEDS_LIMITS_MM.maxDiameter), u)
  bound('rpm', 'Spindle speed', input.rpm, FEEDS_LIMITS_MM.minRpm, FEEDS_LIMITS_MM.maxRpm, 'rpm')
  bound('surfaceSpeed', 'Surface speed', input.surfaceSpeed, inch ? 1 : 0.3, inch ? 16_000 : 5_000, inch ? 'SFM' : 'm/min')
  bound('chipLoad', 'Chip load', input.chipLoad, len(FEEDS_LIMITS_MM.minChipLoad), len(FEEDS_LIMITS_MM.maxChipLoad), u)
  bound('feed', 'Feed', input.feed, len(FEEDS_LIMITS_MM.minFeed), len(FEEDS_LIMITS_MM.maxFeed), `${u}/min`)
  bound('widthOfCut', 'Width of cut', input.widthOfCut, len(FEEDS_LIMITS_MM.minCut), len(FEEDS_LIMITS_MM.maxDiameter), u)
  bound('depthOfCut', 'Depth of cut', input.depthOfCut, len(FEEDS_LIMITS_MM.minCut), len(FEEDS_LIMITS_MM.maxDepth), u)
  if ((input.rpm === undefined) === (input.surfaceSpeed === undefined)) {
    ctx.addIssue({ code: 'custom', path: ['rpm'], message: 'Give either the spindle speed or the surface speed, not both or neither.' })
  }
  if (input.chipLoad !== undefined && input.feed !== undefined) {
    ctx.addIssue({ code: 'custom', path: ['feed'], message: 'Give either the chip load or the feed, not both.' })
  }
  if ((input.widthOfCut === undefined) !== (input.depthOfCut === undefined)) {
    const missing = input.widthOfCut === undefined ? 'widthOfCut' : 'depthOfCut'
    ctx.addIssue({ code: 'custom', path: [missing], message: 'Removal rate needs both the width and the depth of cut.' })
  }
})

export type FeedsInput = z.input<typeof FeedsInputSchema>

export interface FeedsResult {
  units: LengthUnit
  surfaceSpeedUnit: SurfaceSpeedUnit
  rpm: number
  surfaceSpeed: number
  /** Null when neither chip load nor feed was given. */
  chipLoad: number | null
  feed: number | null
  /** length^3/min; null without width and depth of cut or without a feed. */
  removalRate: number | null
}

/** Validates the Feeds screen input and fills in the other side of each pair. */
export function computeFeeds(input: unknown): Checked<'feeds', FeedsResult> {
  const parsed = FeedsInputSchema.safeParse(input)
  if (!parsed.success) return { ok: false, issues: toIssues(parsed.error) }
  const v = parsed.data
  const rpm = v.rpm ?? rpmFromSurfaceSpeed(v.surfaceSpeed!, v.diameter, v.units)
  const surfaceSpeed = v.surfaceSpeed ?? surfaceSpeedFromRpm(rpm, v.diameter, v.units)
  const feed = v.feed ?? (v.chipLoad !== undefined ? feedFromChipLoad(v.chipLoad, v.flutes, rpm) : null)
  const chipLoad = v.chipLoad ?? (feed !== null ? chipLoadFromFeed(feed, v.flutes, rpm) : null)
  const removalRate = feed !== null && v.widthOfCut !== undefined && v.depthOfCut !== undefined
    ? materialRemovalRate(v.widthOfCut, v.depthOfCut, feed)
    : null
  return {
    ok: true,
    feeds: { units: v.units, surfaceSpeedUnit: surfaceSpeedUnitFor(v.units), rpm, surfaceSpeed, chipLoad, feed, removalRate },
  }
}
