// Jogwise's screen and mail texts use two pieces of message syntax: `{name}` placeholders and
// `|` between plural forms ("one | many", or "none | one | many"). This renders just those, the
// way vue-i18n's documented syntax reads them, for the screens (composables/i18n.ts) and the
// server (server/utils/language.ts). tests/unit/i18n/render.test.ts renders every message of every
// locale file with this and with vue-i18n's own compiler and fails on any difference.

export type Part = string | { name: string }
export type MessageValues = Record<string, unknown>

const PLACEHOLDER = /\{\s*([A-Za-z_]\w*)\s*\}/

function partsOf(text: string): Part[] {
  // split() with a capture group: even items are text, odd items are placeholder names.
  return text.split(PLACEHOLDER).map((p, i) => i % 2 ? { name: p } : p).filter(p => p !== '')
}

/** Parsed once per message text: a screen re-renders the same few hundred texts. */
const parsed = new Map<string, Part[][]>()

function formsOf(message: string): Part[][] {
  let forms = parsed.get(message)
  if (!forms) {
    // Plural forms lose the spaces around their `|`; a message of one form keeps its own spaces.
    const split = message.split('|')
    forms = split.length > 1 ? split.map(form => partsOf(form.trim())) : [partsOf(message)]
    parsed.set(message, forms)
  }
  return forms
}

/**
 * Which of `forms` plural forms reads for `count`: vue-i18n's default rule (two forms: one and
 * many, 0 counting as many; three: none, one, many).
 */
export function pluralIndex(forms: number, count: number): number {
  const n = Math.abs(count)
  if (forms === 2) return n === 1 ? 0 : 1
  return forms > 2 ? Math.min(n, 2) : 0
}

/** A placeholder's value as text: nothing for a missing one, JSON for a list or a plain object (as vue-i18n). */
function shown(value: unknown): string {
  if (value == null) return ''
  if (Array.isArray(value) || (typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype)) return JSON.stringify(value, null, 2)
  return String(value)
}

/**
 * `message` with its placeholders filled from `values`; with `count`, the plural form for it,
 * and `{n}` and `{count}` read the count unless `values` names them.
 */
export function renderMessage(message: string, values: MessageValues = {}, count?: number): string {
  const forms = formsOf(message)
  const named = count === undefined ? values : { n: count, count, ...values }
  const parts = forms.length > 1 ? forms[pluralIndex(forms.length, count ?? 1)] ?? forms[0]! : forms[0]!
  let out = ''
  for (const p of parts) out += typeof p === 'string' ? p : shown(named[p.name])
  return out
}

/** A one-form message as text and placeholders, for a screen that puts an element in a placeholder. */
export function messageParts(message: string): Part[] {
  return formsOf(message)[0]!
}
