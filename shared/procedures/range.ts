// A check's allowed range, apart from the step schemas: the fold reads it on the Run screen,
// which loads without them (issue 14).
interface Range { min?: number, max?: number }

/** Where a reading sits against a check's allowed range (bounds are inclusive). */
export function rangeStatus(step: Range, value: number): 'below' | 'above' | null {
  if (step.min !== undefined && value < step.min) return 'below'
  if (step.max !== undefined && value > step.max) return 'above'
  return null
}

/** The allowed range as the Run screen prints it, or null when any value is allowed. */
export function describeRange(step: Range & { unit: string }): string | null {
  const { min, max, unit } = step
  if (min !== undefined && max !== undefined) return `${min} to ${max} ${unit}`
  if (min !== undefined) return `at least ${min} ${unit}`
  if (max !== undefined) return `at most ${max} ${unit}`
  return null
}
