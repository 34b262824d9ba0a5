// CSV formula injection (OWASP "CSV Injection"): a spreadsheet runs a cell that starts with
// = + - @, tab or carriage return as a formula. OWASP's advice is to prepend a single quote to
// such a cell (the quote is shown as text; csv-stringify then quotes and escapes the cell as
// any other). A plain number such as -0.12 is not a formula and stays a number, so readings
// can still be summed.

const FORMULA_START = /^[=+\-@\t\r]/
const PLAIN_NUMBER = /^[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?$/

export function safeCsvCell(value: string | number | null | undefined): string | number {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return Number.isFinite(value) ? value : String(value)
  if (PLAIN_NUMBER.test(value)) return value
  return FORMULA_START.test(value) ? `'${value}` : value
}
