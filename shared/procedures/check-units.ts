// A check written in millimetres or inches, shown in the machine's own units. The reading is
// typed in the shown unit and turned back into the step's unit before it is recorded, so the
// run's range check (in the step's unit) and the record stay as the procedure wrote them.
import { MM_PER_INCH, type LengthUnit } from '../machining/units'
import type { CheckStep } from './schema'

export interface CheckInUnits {
  unit: string
  min?: number
  max?: number
  /** A value typed in `unit`, in the step's own unit (1 in = 25.4 mm exactly). */
  toStep: (value: number) => number
}

export function checkInUnits(step: Pick<CheckStep, 'unit' | 'min' | 'max'>, units: LengthUnit | undefined): CheckInUnits {
  const isLength = step.unit === 'mm' || step.unit === 'in'
  if (!units || !isLength || step.unit === units) return { unit: step.unit, min: step.min, max: step.max, toStep: v => v }
  const k = step.unit === 'mm' ? 1 / MM_PER_INCH : MM_PER_INCH
  return {
    unit: units,
    min: step.min === undefined ? undefined : step.min * k,
    max: step.max === undefined ? undefined : step.max * k,
    toStep: v => v / k,
  }
}
