// Text rules shared by procedure steps and run events. Step text is read at arm's length by
// someone with gloves on, so it is plain text in short sentences; written reasons (an override,
// an out-of-range reading, an abandoned run) go into the record, so they must say something.

/** Longest sentence allowed in a step body, hazard or avoid statement (shop writing rule). */
export const MAX_SENTENCE_WORDS = 30

/** Shortest written reason accepted, in characters after trimming. */
export const MIN_REASON_CHARS = 10

const HTML_TAG = /<\/?[a-z][^>]*>/i
// Control characters other than tab and line breaks never belong in step text.
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/

/** Why `text` is not plain text, or null when it is. */
export function plainTextProblem(text: string): string | null {
  if (HTML_TAG.test(text)) return 'must be plain text without HTML tags'
  if (CONTROL.test(text)) return 'contains control characters'
  return null
}

/** Splits text into sentences at . ! ? followed by a space or the end, and at line breaks. */
export function sentences(text: string): string[] {
  return text
    .split(/(?<=[.!?])\s+|\n+/)
    .map(s => s.trim())
    .filter(s => s.length > 0)
}

const wordCount = (s: string) => s.split(/\s+/).filter(w => /[\p{L}\p{N}]/u.test(w)).length

/** The first sentence longer than `max` words (1-based position and its word count), or null. */
export function longSentence(text: string, max = MAX_SENTENCE_WORDS): { position: number, words: number } | null {
  const list = sentences(text)
  for (let i = 0; i < list.length; i++) {
    const words = wordCount(list[i]!)
    if (words > max) return { position: i + 1, words }
  }
  return null
}

/**
 * Why a written reason is too thin to go on the record, or null when it is acceptable.
 * "ok", "n/a" or a row of x's tell the owner nothing, so a reason needs some length, at least
 * two words and more than a couple of distinct letters.
 */
export function reasonProblem(text: string | null | undefined): string | null {
  const t = (text ?? '').trim()
  if (t.length === 0) return 'is required'
  if (t.length < MIN_REASON_CHARS) return `is too short: write at least ${MIN_REASON_CHARS} characters saying why`
  const words = t.split(/\s+/).filter(w => /\p{L}{2,}/u.test(w))
  if (words.length < 2) return 'must say why in at least two words'
  const letters = new Set(t.toLowerCase().replace(/[^\p{L}]/gu, ''))
  if (letters.size < 4) return 'must say why in words, not filler characters'
  return null
}

/** True when `text` is a reason worth recording (see reasonProblem). */
export const isMeaningfulReason = (text: string | null | undefined) => reasonProblem(text) === null
