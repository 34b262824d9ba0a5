// Spoilboard readings: the body a person submits (in their units) and how a stored reading
// (always millimetres) is analysed in the context of the machine's history.
import { z } from 'zod'
import { analyzeBoard, BOARD_GRID_MAX, BOARD_GRID_MIN, type BoardAnalysis } from '../machining/board'
import { formatNumber, fromMm, MM_PER_INCH, type LengthUnit } from '../machining/units'
import { BOARD_READING_KINDS, UNITS } from '../rules/enums'
import { isBelievableTime, unbelievableTime } from '../rules/clock'

export { BOARD_GRID_MAX, BOARD_GRID_MIN }

/** Limits in mm: a height is a probe or feeler reading, a thickness an MDF board (as machine.ts). */
const LIMITS_MM = { height: 500, thickness: 200, spacing: 5000, facedDepth: 25 } as const
/**
 * Smallest spacing and faced depth, in mm. Common practice, no published source: readings closer
 * than 1 mm are one spot, and a facing thinner than 0.01 mm is within the Z zero's own error.
 */
const MIN_MM = { spacing: 1, facedDepth: 0.01 } as const
/** The smallest depth a facing takes when the board is already flat (common practice, no published source). */
export const MIN_FACING_MM = 0.25

const number = (label: string) => z.number({ error: `${label} must be a number.` })
  .refine(Number.isFinite, { error: `${label} must be a number.` })
const positive = (label: string) => number(label).refine(v => v > 0, { error: `${label} must be more than 0.` })

const fields = {
  kind: z.enum(BOARD_READING_KINDS, { error: 'Kind must be \'height\' (surface heights) or \'thickness\'.' }),
  units: z.enum(UNITS, { error: 'Units must be \'mm\' or \'in\'.' }),
  // Cells are checked one by one, so each bad reading gets its own path and message.
  grid: z.array(z.array(z.unknown(), { error: 'Each row of readings must be a list of numbers.' }), { error: 'Readings must be a list of rows.' })
    .superRefine(checkGridShape),
  spacing: z.object({ x: positive('Spacing X'), y: positive('Spacing Y') }, { error: 'Give the spacing between readings as X and Y distances.' }),
  takenAt: z.iso.datetime({ offset: true, error: 'Time taken must be a date and time such as 2025-03-01T09:30:00Z.' }).nullish(),
  note: z.string({ error: 'A note must be text.' }).trim().max(500, { error: 'Keep the note under 500 characters.' }).nullish(),
  runId: z.uuid({ error: 'Run id must be a run\'s UUID.' }).nullish(),
  facedDepth: positive('Faced depth').nullish(),
}
const machineId = z.number({ error: 'Pick a machine.' }).int({ error: 'Pick a machine.' }).positive({ error: 'Pick a machine.' })

type Fields = z.output<z.ZodObject<typeof fields>>

const shown = (mm: number, units: LengthUnit) => `${formatNumber(fromMm(mm, units), units === 'mm' ? 0 : 2)} ${units}`

// The grid's shape and cells are checked on the field itself, so a ragged or non-numeric grid
// is reported even when another field is wrong too.
function checkGridShape(grid: unknown[][], ctx: z.RefinementCtx) {
  const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message })
  const rows = grid.length
  if (rows < BOARD_GRID_MIN || rows > BOARD_GRID_MAX) return issue([], `Take readings on ${BOARD_GRID_MIN} to ${BOARD_GRID_MAX} rows (got ${rows}).`)
  const cols = grid[0]!.length
  if (cols < BOARD_GRID_MIN || cols > BOARD_GRID_MAX) return issue([0], `Take ${BOARD_GRID_MIN} to ${BOARD_GRID_MAX} readings in each row (row 1 has ${cols}).`)
  grid.forEach((row, r) => {
    if (row.length !== cols) return issue([r], `Row ${r + 1} has ${row.length} readings but row 1 has ${cols}; every row needs the same number.`)
    row.forEach((cell, c) => {
      if (typeof cell !== 'number' || !Number.isFinite(cell)) issue([r, c], `Reading in row ${r + 1}, column ${c + 1} is not a number.`)
    })
  })
}

// Ranges depend on the kind and the units, so they are checked once every field is valid.
function checkRanges(v: Fields, ctx: z.RefinementCtx) {
  const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message })
  const perMm = v.units === 'in' ? 1 / MM_PER_INCH : 1
  const limit = LIMITS_MM[v.kind] * perMm
  v.grid.forEach((row, r) => row.forEach((cell, c) => {
    const value = cell as number
    const where = `row ${r + 1}, column ${c + 1}`
    if (v.kind === 'thickness' && value <= 0) issue(['grid', r, c], `Thickness in ${where} must be more than 0.`)
    else if (Math.abs(value) > limit) {
      issue(['grid', r, c], `Reading in ${where} is out of range: keep ${v.kind === 'height' ? 'heights within ±' : 'thicknesses up to '}${shown(LIMITS_MM[v.kind], v.units)}.`)
    }
  }))
  for (const axis of ['x', 'y'] as const) {
    if (v.spacing[axis] > LIMITS_MM.spacing * perMm) issue(['spacing', axis], `Spacing ${axis.toUpperCase()} must be at most ${shown(LIMITS_MM.spacing, v.units)}.`)
    else if (v.spacing[axis] < MIN_MM.spacing * perMm * (1 - 1e-12)) issue(['spacing', axis], `Spacing ${axis.toUpperCase()} must be at least ${v.units === 'mm' ? '1 mm' : '0.04 in'}; readings closer than that are one spot.`)
  }
  if (v.facedDepth != null && v.facedDepth > LIMITS_MM.facedDepth * perMm) {
    issue(['facedDepth'], `Faced depth must be at most ${shown(LIMITS_MM.facedDepth, v.units)}; a facing takes a fraction of a millimetre.`)
  }
  else if (v.facedDepth != null && v.facedDepth < MIN_MM.facedDepth * perMm * (1 - 1e-12)) {
    issue(['facedDepth'], `Faced depth must be at least ${v.units === 'mm' ? '0.01 mm' : '0.0004 in'}.`)
  }
  if (v.takenAt) {
    const t = Date.parse(v.takenAt)
    if (!isBelievableTime(t, Date.now())) issue(['takenAt'], unbelievableTime('Time taken', v.takenAt))
  }
}

/** What a person submits from the Board screen: a grid on one machine, in their units. */
export const ReadingSubmissionSchema = z.object({ machineId, ...fields }).strict().superRefine(checkRanges)
export type ReadingSubmission = z.input<typeof ReadingSubmissionSchema>

/** Body of POST /api/machines/:id/readings: the machine comes from the path (a machineId in the body must match it). */
export const ReadingBodySchema = z.object({ machineId: machineId.optional(), ...fields }).strict().superRefine(checkRanges)
export type ReadingBody = z.output<typeof ReadingBodySchema>

/** A reading as stored: lengths in millimetres. */
export interface StoredReading {
  kind: 'height' | 'thickness'
  grid: number[][]
  spacingXMm: number
  spacingYMm: number
  facedDepthMm: number | null
  takenAt: Date | string
}

/** Converts a valid submission to the stored millimetre form (1 in = 25.4 mm exactly). */
export function readingToMm(v: ReadingBody, now = new Date()) {
  const k = v.units === 'in' ? MM_PER_INCH : 1
  return {
    kind: v.kind,
    grid: (v.grid as number[][]).map(row => row.map(cell => cell * k)),
    spacingXMm: v.spacing.x * k,
    spacingYMm: v.spacing.y * k,
    facedDepthMm: v.facedDepth != null ? v.facedDepth * k : null,
    takenAt: v.takenAt ? new Date(v.takenAt) : now,
    note: v.note || null,
    runId: v.runId ?? null,
  }
}

export interface ReadingSummary {
  /** Least squares: peak-to-valley about the least-squares plane. */
  flatnessAboutPlaneMm: number
  /** Minimum zone (ISO 1101, Chebyshev plane): never more than the least-squares figure. */
  flatnessMinimumZoneMm: number
  flatnessAboutXYMm: number
  cleanupDepthMm: number
  /** Mean thickness now: measured for thickness readings, estimated for heights. */
  thicknessMeanMm: number | null
  thicknessMinMm: number | null
  thicknessEstimated: boolean
  thicknessAfterMm: number | null
  facingDepthMm: number | null
  facingsLeft: number | null
  belowMinimum: boolean | null
}

export interface BoardMachine { spoilboardNominalMm: number, spoilboardMinMm: number }

/**
 * Full analysis of one stored reading. Heights give only the shape; their thickness is anchored
 * on `meanThicknessMm` (see summarizeHistory). Each future facing is taken as the clean-up
 * depth, but never less than MIN_FACING_MM, so a flat board still counts down.
 */
export function analyzeReading(reading: StoredReading, machine: BoardMachine, meanThicknessMm?: number | null): BoardAnalysis | null {
  const checked = checkReading(reading, machine, meanThicknessMm)
  return checked.ok ? checked.analysis : null
}

/** As analyzeReading, but says why a stored reading cannot be analysed instead of throwing. */
export function checkReading(reading: StoredReading, machine: BoardMachine, meanThicknessMm?: number | null): { ok: true, analysis: BoardAnalysis } | { ok: false, reason: string } {
  try {
    return analyzeStored(reading, machine, meanThicknessMm)
  }
  catch (error) {
    // One odd stored row must never break the machine's whole history.
    return { ok: false, reason: `This reading cannot be analysed: ${error instanceof Error ? error.message : String(error)}` }
  }
}

function analyzeStored(reading: StoredReading, machine: BoardMachine, meanThicknessMm?: number | null): { ok: true, analysis: BoardAnalysis } | { ok: false, reason: string } {
  if (!Array.isArray(reading.grid) || !reading.grid.every(Array.isArray)) return { ok: false, reason: 'This reading cannot be analysed: its grid is not a list of rows.' }
  const values = reading.grid.flat()
  const range = Math.max(...values) - Math.min(...values)
  const result = analyzeBoard({
    kind: reading.kind,
    grid: reading.grid,
    spacing: { x: reading.spacingXMm, y: reading.spacingYMm },
    minThickness: machine.spoilboardMinMm,
    facingAllowance: Math.max(range, MIN_FACING_MM),
    ...(reading.kind === 'height' && meanThicknessMm && meanThicknessMm > 0 ? { nominalThickness: meanThicknessMm } : {}),
  })
  return result.ok
    ? { ok: true, analysis: result.analysis }
    : { ok: false, reason: `This reading cannot be analysed: ${result.issues.map(i => i.message).join(' ')}` }
}

function summaryOf(a: BoardAnalysis, estimated: boolean): ReadingSummary {
  return {
    flatnessAboutPlaneMm: a.flatness.aboutPlane,
    flatnessMinimumZoneMm: a.flatness.minimumZone,
    flatnessAboutXYMm: a.flatness.aboutMachineXY,
    cleanupDepthMm: a.cleanupDepth,
    thicknessMeanMm: a.thicknessNow?.mean ?? null,
    thicknessMinMm: a.thicknessNow?.min ?? null,
    thicknessEstimated: estimated && a.thicknessNow !== null,
    thicknessAfterMm: a.thicknessAfter,
    facingDepthMm: a.facingDepth,
    facingsLeft: a.facingsLeft,
    belowMinimum: a.belowMinimum,
  }
}

/**
 * Summaries for a machine's readings, newest first. Thickness readings are measured; a height
 * reading's mean thickness is estimated from the last known mean (the machine's nominal
 * thickness at first) less the depth faced since. The estimate is flagged so screens say so.
 */
export function summarizeHistory<R extends StoredReading & { id: number }>(machine: BoardMachine, readings: R[]) {
  const time = (r: R) => new Date(r.takenAt).getTime()
  const oldestFirst = [...readings].sort((a, b) => time(a) - time(b) || a.id - b.id)
  let anchor: number = machine.spoilboardNominalMm
  const out = oldestFirst.map((reading) => {
    if (reading.facedDepthMm) anchor -= reading.facedDepthMm
    const checked = checkReading(reading, machine, anchor)
    const analysis = checked.ok ? checked.analysis : null
    if (analysis?.kind === 'thickness' && analysis.thicknessNow) anchor = analysis.thicknessNow.mean
    return {
      ...reading,
      meanThicknessMm: reading.kind === 'height' ? anchor : null,
      summary: analysis ? summaryOf(analysis, reading.kind === 'height') : null,
      /** Why the summary is null: the history still answers with every other reading. */
      problem: checked.ok ? null : checked.reason,
    }
  })
  return out.reverse()
}
