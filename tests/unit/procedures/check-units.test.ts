// Checks written in mm shown in an inch machine's units and back (1 in = 25.4 mm exactly, by
// the international yard and pound agreement of 1959).
import { describe, expect, it } from 'vitest'
import { checkInUnits } from '../../../shared/procedures/check-units'

describe('checkInUnits', () => {
  it('shows a 12 to 19.5 mm board check in inches on an inch machine, and records millimetres', () => {
    const c = checkInUnits({ unit: 'mm', min: 12, max: 19.5 }, 'in')
    expect(c.unit).toBe('in')
    expect(c.min).toBeCloseTo(12 / 25.4, 12) // 0.472441 in
    expect(c.max).toBeCloseTo(19.5 / 25.4, 12) // 0.767717 in
    expect(c.toStep(0.75)).toBeCloseTo(19.05, 12)
  })

  it('leaves a check alone in the machine\'s own units, for other units, or with no machine', () => {
    for (const [step, units] of [[{ unit: 'mm', min: 1, max: 2 }, 'mm'], [{ unit: 's', min: 0, max: 10 }, 'in'], [{ unit: 'mm', min: 1 }, undefined]] as const) {
      const c = checkInUnits(step, units)
      expect(c).toMatchObject({ unit: step.unit, min: step.min })
      expect(c.toStep(3)).toBe(3)
    }
  })

  it('shows an inch check in millimetres on a metric machine', () => {
    const c = checkInUnits({ unit: 'in', max: 0.75 }, 'mm')
    expect(c).toMatchObject({ unit: 'mm', min: undefined })
    expect(c.max).toBeCloseTo(19.05, 12)
    expect(c.toStep(25.4)).toBeCloseTo(1, 12)
  })
})
