// Spoilboard health from a grid of readings: best-fit plane, flatness, clean-up depth,
// thickness left and facings left before the board must be replaced.
//
// Grid convention (same as stored readings): rows run front to back (row 0 at Y = 0), columns
// left to right (column 0 at X = 0). A surfacing pass cuts a plane parallel to the machine's XY
// motion, not to the best-fit plane, so the depth that touches every point is
// max - min of the readings, which includes any tilt of the board against the gantry.
import { z } from 'zod'
import { toIssues, type Checked, type FieldIssue } from './issues'
import { fitPlaneOrthogonal, fitPlaneVertical, type VerticalPlane } from './linalg'
import { minimumZoneFlatness } from './minimum-zone'
import type { LengthUnit } from './units'
import { BOARD_READING_KINDS, UNITS } from '../rules/enums'

export const BOARD_GRID_MIN = 2
export const BOARD_GRID_MAX = 20

const number = (label: string) => z.number({ error: `${label} must be a number.` })
const positive = (label: string) => number(label).positive({ error: `${label} must be more than 0.` })

export const BoardInputSchema = z.object({
  units: z.enum(UNITS, { error: 'Units must be \'mm\' or \'in\'.' }).optional(),
  kind: z.enum(BOARD_READING_KINDS, { error: 'Kind must be \'height\' (surface heights) or \'thickness\'.' }),
  // Cells are checked one by one below, so each bad reading gets its own message.
  grid: z.array(z.array(z.unknown(), { error: 'Each row of readings must be a list of numbers.' }), { error: 'Readings must be a list of rows.' }),
  spacing: z.object({ x: positive('Spacing X'), y: positive('Spacing Y') }, { error: 'Give the spacing as X and Y distances.' }).optional(),
  xs: z.array(number('X position'), { error: 'X positions must be a list of numbers.' }).optional(),
  ys: z.array(number('Y position'), { error: 'Y positions must be a list of numbers.' }).optional(),
  nominalThickness: positive('Board thickness').optional(),
  minThickness: positive('Minimum thickness'),
  /** Depth taken off by each future facing; defaults to this board's clean-up depth. */
  facingAllowance: positive('Depth per facing').optional(),
  /** Extra depth added to the clean-up cut. */
  margin: number('Margin').min(0, { error: 'Margin cannot be negative.' }).optional(),
})

export type BoardInput = z.input<typeof BoardInputSchema>

function gridIssues(v: z.output<typeof BoardInputSchema>): FieldIssue[] {
  const issues: FieldIssue[] = []
  const rows = v.grid.length
  if (rows < BOARD_GRID_MIN || rows > BOARD_GRID_MAX) {
    issues.push({ path: 'grid', message: `Take readings on ${BOARD_GRID_MIN} to ${BOARD_GRID_MAX} rows (got ${rows}).` })
    return issues
  }
  const cols = v.grid[0]!.length
  if (cols < BOARD_GRID_MIN || cols > BOARD_GRID_MAX) {
    issues.push({ path: 'grid.0', message: `Take ${BOARD_GRID_MIN} to ${BOARD_GRID_MAX} readings in each row (row 1 has ${cols}).` })
    return issues
  }
  v.grid.forEach((row, r) => {
    if (row.length !== cols) {
      issues.push({ path: `grid.${r}`, message: `Row ${r + 1} has ${row.length} readings but row 1 has ${cols}; every row needs the same number.` })
      return
    }
    row.forEach((cell, c) => {
      if (typeof cell !== 'number' || !Number.isFinite(cell)) {
        issues.push({ path: `grid.${r}.${c}`, message: `Reading in row ${r + 1}, column ${c + 1} is not a number.` })
      }
      else if (v.kind === 'thickness' && cell <= 0) {
        issues.push({ path: `grid.${r}.${c}`, message: `Thickness in row ${r + 1}, column ${c + 1} must be more than 0.` })
      }
    })
  })
  const positions = (key: 'xs' | 'ys', count: number, what: string) => {
    const list = v[key]
    if (!list) return
    if (list.length !== count) {
      issues.push({ path: key, message: `Give ${count} ${what} positions, one per ${what === 'X' ? 'column' : 'row'} (got ${list.length}).` })
      return
    }
    for (let i = 1; i < list.length; i++) {
      if (!(list[i]! > list[i - 1]!)) {
        issues.push({ path: `${key}.${i}`, message: `${what} positions must increase: ${list[i]} does not come after ${list[i - 1]}.` })
        return
      }
    }
  }
  positions('xs', cols, 'X')
  positions('ys', rows, 'Y')
  if (!v.spacing && !(v.xs && v.ys)) {
    issues.push({ path: 'spacing', message: 'Give the spacing between readings, or the X and Y position of every row and column.' })
  }
  return issues
}

export interface GridCell { row: number, col: number, value: number }

export interface BoardAnalysis {
  units: LengthUnit
  kind: 'height' | 'thickness'
  rows: number
  cols: number
  xs: number[]
  ys: number[]
  /** Least-squares plane on vertical residuals: reading ≈ z0 + slopeX·x + slopeY·y. */
  plane: VerticalPlane
  /** How much the plane rises across the grid's full X and Y extent. */
  tilt: { acrossX: number, acrossY: number }
  /** reading − plane, per cell (for the heat map). */
  residuals: number[][]
  flatness: {
    /** Peak-to-valley of vertical residuals about the least-squares plane (not minimum zone). */
    aboutPlane: number
    /** Minimum-zone flatness (ISO 1101 default, Chebyshev plane; see minimum-zone.ts); never more than aboutPlane. */
    minimumZone: number
    /** Peak-to-valley of perpendicular distances about the orthogonal least-squares plane. */
    aboutPlaneOrthogonal: number
    /** max − min of the readings: flatness against the machine's XY motion. */
    aboutMachineXY: number
  }
  highest: GridCell
  lowest: GridCell
  /** Depth of the pass that touches every point: max − min + margin. */
  cleanupDepth: number
  margin: number
  /** What the clean-up removes at each cell: reading − min + margin. */
  removedByCleanup: number[][]
  /** Thickness now (thinnest, mean, thickest); null for heights without a nominal thickness. */
  thicknessNow: { min: number, mean: number, max: number } | null
  /** Uniform thickness after the clean-up, assuming the table under the board is flat. */
  thicknessAfter: number | null
  /** Depth per future facing used for the count. */
  facingDepth: number | null
  /** Whole facings left before the minimum thickness; null when it cannot be told. */
  facingsLeft: number | null
  /** True when the clean-up itself would leave the board under the minimum thickness. */
  belowMinimum: boolean | null
}

export function analyzeBoard(input: unknown): Checked<'analysis', BoardAnalysis> {
  const parsed = BoardInputSchema.safeParse(input)
  if (!parsed.success) return { ok: false, issues: toIssues(parsed.error) }
  const v = parsed.data
  const issues = gridIssues(v)
  if (issues.length) return { ok: false, issues }

  const grid = v.grid as number[][]
  const rows = grid.length
  const cols = grid[0]!.length
  const xs = v.xs && v.ys ? v.xs : Array.from({ length: cols }, (_, c) => c * v.spacing!.x)
  const ys = v.xs && v.ys ? v.ys : Array.from({ length: rows }, (_, r) => r * v.spacing!.y)
  const points = grid.flatMap((row, r) => row.map((z, c) => ({ x: xs[c]!, y: ys[r]!, z })))

  // A grid whose positions collapse (spacing 1e-200) has no plane: say so on the field.
  let fits
  try {
    fits = { vertical: fitPlaneVertical(points), orthogonal: fitPlaneOrthogonal(points), minimumZone: minimumZoneFlatness(points) }
  }
  catch (error) {
    if (!(error instanceof RangeError)) throw error
    return { ok: false, issues: [{ path: v.spacing ? 'spacing' : 'xs', message: `No plane fits these readings: ${error.message}` }] }
  }
  const { residuals: flatResiduals, ...plane } = fits.vertical
  const orthogonal = fits.orthogonal
  const residuals = grid.map((row, r) => row.map((_, c) => flatResiduals[r * cols + c]!))
  const range = (list: number[]) => Math.max(...list) - Math.min(...list)

  let highest: GridCell = { row: 0, col: 0, value: grid[0]![0]! }
  let lowest: GridCell = { ...highest }
  grid.forEach((row, r) => row.forEach((value, c) => {
    if (value > highest.value) highest = { row: r, col: c, value }
    if (value < lowest.value) lowest = { row: r, col: c, value }
  }))
  const margin = v.margin ?? 0
  const cleanupDepth = highest.value - lowest.value + margin
  const values = grid.flat()
  const mean = values.reduce((s, z) => s + z, 0) / values.length

  let thicknessNow: BoardAnalysis['thicknessNow'] = null
  let thicknessAfter: number | null = null
  if (v.kind === 'thickness') {
    thicknessNow = { min: lowest.value, mean, max: highest.value }
    thicknessAfter = lowest.value - margin
  }
  else if (v.nominalThickness !== undefined) {
    // Heights only give shape; the nominal (mean) thickness anchors them.
    thicknessNow = { min: v.nominalThickness - (mean - lowest.value), mean: v.nominalThickness, max: v.nominalThickness + (highest.value - mean) }
    thicknessAfter = thicknessNow.min - margin
  }
  const facingDepth = v.facingAllowance ?? (cleanupDepth > 0 ? cleanupDepth : null)
  let facingsLeft: number | null = null
  let belowMinimum: boolean | null = null
  if (thicknessAfter !== null) {
    belowMinimum = thicknessAfter < v.minThickness
    if (facingDepth !== null) {
      facingsLeft = belowMinimum ? 0 : Math.floor((thicknessAfter - v.minThickness) / facingDepth + 1e-9)
    }
  }

  return {
    ok: true,
    analysis: {
      units: v.units ?? 'mm',
      kind: v.kind,
      rows,
      cols,
      xs,
      ys,
      plane,
      tilt: { acrossX: plane.slopeX * (xs[cols - 1]! - xs[0]!), acrossY: plane.slopeY * (ys[rows - 1]! - ys[0]!) },
      residuals,
      flatness: {
        aboutPlane: range(flatResiduals),
        minimumZone: fits.minimumZone,
        aboutPlaneOrthogonal: range(orthogonal.distances),
        aboutMachineXY: highest.value - lowest.value,
      },
      highest,
      lowest,
      cleanupDepth,
      margin,
      removedByCleanup: grid.map(row => row.map(z => z - lowest.value + margin)),
      thicknessNow,
      thicknessAfter,
      facingDepth,
      facingsLeft,
      belowMinimum,
    },
  }
}
