// A check's allowed range as the screen says it, numbers in the screen's language
// ("12 to 19.5 mm", "12 a 19,5 mm"); the unit is the machine's and never translated.
export function useRangeText() {
  const { t } = useI18n()
  const { number } = useFormat()
  const n = (v: number) => number(v, { maximumFractionDigits: 6, useGrouping: false })
  return ({ min, max, unit }: { min?: number, max?: number, unit: string }) => {
    if (min !== undefined && max !== undefined) return t('range.between', { min: n(min), max: n(max), unit })
    if (min !== undefined) return t('range.atLeast', { min: n(min), unit })
    if (max !== undefined) return t('range.atMost', { max: n(max), unit })
    return null
  }
}
