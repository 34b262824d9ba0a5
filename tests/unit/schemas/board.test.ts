import { describe, expect, it } from 'vitest'
import { ReadingBodySchema, readingToMm, summarizeHistory } from '../../../shared/schemas/board'
import { toIssues } from '../../../shared/schemas/issues'

const valid = { kind: 'height', units: 'mm', grid: [[0, 0.1], [0.2, 0.3]], spacing: { x: 100, y: 100 } }
const issuesOf = (body: unknown) => {
  const r = ReadingBodySchema.safeParse(body)
  return r.success ? [] : toIssues(r.error)
}

describe('ReadingBodySchema', () => {
  it('names a ragged row and a bad cell together with another bad field', () => {
    expect(issuesOf({ ...valid, grid: [[1, 2, 3], [1, 2], ['x', 1, 2]], spacing: { x: 100 } })).toEqual([
      { path: 'grid.1', message: 'Row 2 has 2 readings but row 1 has 3; every row needs the same number.' },
      { path: 'grid.2.0', message: 'Reading in row 3, column 1 is not a number.' },
      { path: 'spacing.y', message: 'Spacing Y must be a number.' },
    ])
  })

  it('gives the limits in the units of the submission', () => {
    expect(issuesOf({ ...valid, kind: 'thickness', units: 'in', grid: [[0.75, 9], [0.7, 0.7]] }))
      .toEqual([{ path: 'grid.0.1', message: 'Reading in row 1, column 2 is out of range: keep thicknesses up to 7.87 in.' }])
  })

  it('refuses a clock far in the future', () => {
    expect(issuesOf({ ...valid, takenAt: '2099-01-01T00:00:00Z' })[0]?.path).toBe('takenAt')
  })
})

describe('readingToMm', () => {
  // 1 in = 25.4 mm exactly (NBS Circular 572 addendum, 1960): 0.004 in = 0.1016 mm.
  it('converts inch readings exactly', () => {
    const parsed = ReadingBodySchema.parse({ ...valid, units: 'in', grid: [[0.004, 0.25], [1, 0.75]], spacing: { x: 4, y: 1 }, facedDepth: 0.01 })
    const mm = readingToMm(parsed)
    expect(mm.grid[0]![0]).toBeCloseTo(0.1016, 12)
    expect(mm.grid[0]![1]).toBeCloseTo(6.35, 12)
    expect(mm.grid[1]![1]).toBeCloseTo(19.05, 12)
    expect(mm.spacingXMm).toBeCloseTo(101.6, 12)
    expect(mm.facedDepthMm).toBeCloseTo(0.254, 12)
  })
})

describe('summarizeHistory', () => {
  const machine = { spoilboardNominalMm: 19, spoilboardMinMm: 12 }
  const at = (day: number) => new Date(Date.UTC(2025, 0, day))
  const flat = [[0, 0], [0, 0]]
  it('anchors heights on the last measured mean less the depth faced since, newest first', () => {
    const out = summarizeHistory(machine, [
      { id: 3, kind: 'height', grid: flat, spacingXMm: 100, spacingYMm: 100, facedDepthMm: 0.5, takenAt: at(3) },
      { id: 1, kind: 'height', grid: flat, spacingXMm: 100, spacingYMm: 100, facedDepthMm: null, takenAt: at(1) },
      { id: 2, kind: 'thickness', grid: [[18, 18.2], [18.2, 18]], spacingXMm: 100, spacingYMm: 100, facedDepthMm: null, takenAt: at(2) },
    ])
    expect(out.map(r => r.id)).toEqual([3, 2, 1])
    expect(out[2]!.summary).toMatchObject({ thicknessMeanMm: 19, thicknessEstimated: true })
    expect(out[1]!.summary).toMatchObject({ thicknessEstimated: false })
    expect(out[1]!.summary!.thicknessMeanMm).toBeCloseTo(18.1, 12)
    expect(out[0]!.summary!.thicknessMeanMm).toBeCloseTo(17.6, 12)
    // A flat board still counts facings down, at the smallest facing depth (0.25 mm, common
    // practice, no published source): floor((17.6 − 12) / 0.25) = 22.
    expect(out[0]!.summary!.facingsLeft).toBe(22)
  })
})
