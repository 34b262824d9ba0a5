// What every input must be before any schema reads it: well-formed text (no lone UTF-16
// surrogate: MariaDB's JSON check refuses one, utf8mb4 columns mangle it, mail cannot carry it)
// and numbers a person could have meant. One walk over the whole value, so a field added to any
// schema later is covered without anyone remembering to.

/** Largest row id (MariaDB INT). */
export const MAX_ID = 2_147_483_647
/**
 * No number at the API is larger than this, whatever the field: beyond it whole numbers lose
 * their exactness, and squares and unit conversions of it stay far from overflowing to
 * Infinity. Fields have their own, tighter ranges; this is the floor under all of them.
 */
export const MAX_INPUT_MAGNITUDE = 1e15
/** No schema nests deeper than a few levels; the walk stops here rather than overflow the stack. */
export const MAX_INPUT_DEPTH = 64

export interface InputProblem { path: (string | number)[], message: string }

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/

export function isWellFormed(text: string) {
  return !LONE_SURROGATE.test(text)
}

/** Every ill-formed string (value or key) and out-of-bounds number in a parsed JSON value. */
export function inputProblems(value: unknown, skip: readonly string[] = [], path: (string | number)[] = [], out: InputProblem[] = []): InputProblem[] {
  if (out.length >= 20) return out
  if (path.length > MAX_INPUT_DEPTH) {
    out.push({ path: path.slice(0, MAX_INPUT_DEPTH), message: `The input is nested more than ${MAX_INPUT_DEPTH} levels deep.` })
    return out
  }
  if (typeof value === 'string') {
    if (!isWellFormed(value)) out.push({ path, message: 'The text has a broken character (a lone UTF-16 surrogate); type it again.' })
  }
  else if (typeof value === 'number') {
    // NaN and Infinity never come out of JSON; each schema names them in its own words.
    if (Math.abs(value) > MAX_INPUT_MAGNITUDE && Number.isFinite(value)) out.push({ path, message: `The number must be between -${MAX_INPUT_MAGNITUDE} and ${MAX_INPUT_MAGNITUDE}.` })
  }
  else if (Array.isArray(value)) {
    value.forEach((v, i) => inputProblems(v, [], [...path, i], out))
  }
  else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      if (path.length === 0 && skip.includes(k)) continue
      if (!isWellFormed(k)) out.push({ path: [...path, k], message: 'The field name has a broken character (a lone UTF-16 surrogate).' })
      else inputProblems(v, [], [...path, k], out)
    }
  }
  return out
}
