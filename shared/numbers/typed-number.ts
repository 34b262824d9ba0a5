// One way to read a number a person typed, for every form of the app (Machines, Planner, Board,
// Feeds, measured checks, due intervals). Tablets set to a language that writes the decimal
// comma offer "," on their number pad, so "610,5" and "610.5" are the same number. Anything
// else that `Number()` would accept but a person did not mean (hex "0x10", "1e3", "Infinity",
// grouping like "1,234.5" or "1 234") is refused, so a typo never becomes a different value.

const PLAIN_DECIMAL = /^[+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)$/

/** The number in `text`, or NaN when it is empty or not a plain decimal number. */
export function parseTypedNumber(text: string | number | null | undefined): number {
  if (typeof text === 'number') return text
  const trimmed = String(text ?? '').trim()
  if (!PLAIN_DECIMAL.test(trimmed)) return Number.NaN
  return Number(trimmed.replace(',', '.'))
}

/** Like parseTypedNumber, but an empty field is `undefined` (an optional value left out). */
export function parseOptionalNumber(text: string | number | null | undefined): number | undefined {
  if (text === null || text === undefined || String(text).trim() === '') return undefined
  return parseTypedNumber(text)
}
