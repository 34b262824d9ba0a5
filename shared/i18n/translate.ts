// Errors from zod and from the server are written in English where they are made (schemas,
// routes); they are turned into the reader's language only where they leave the server or show
// on a screen. Each locale file's `errors` section holds the same keys; an English entry is a
// template with {name} placeholders, and a message that matches it is rewritten with the other
// language's entry and the same values. Messages nobody translated stay as they are.

export type MessageTree = { [key: string]: string | MessageTree }

interface Template { key: string, re: RegExp, names: string[] }

const compiled = new WeakMap<MessageTree, Template[]>()

/** `{ a: { b: 'x' } }` → `{ 'a.b': 'x' }` (strings only). */
export function flatten(tree: MessageTree, prefix = '', out: Record<string, string> = {}) {
  for (const [k, v] of Object.entries(tree)) {
    const key = prefix ? `${prefix}.${k}` : k
    if (typeof v === 'string') out[key] = v
    else if (v && typeof v === 'object') flatten(v, key, out)
  }
  return out
}

function escapeRe(text: string) {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
}

function templatesOf(english: MessageTree): Template[] {
  let list = compiled.get(english)
  if (list) return list
  list = Object.entries(flatten(english)).map(([key, text]) => {
    const names: string[] = []
    const source = text.split(/\{(\w+)\}/).map((part, i) => {
      if (i % 2 === 0) return escapeRe(part)
      names.push(part)
      // {rest}: an optional tail (" Not counted: …"); every other value has some text.
      return part === 'rest' ? '([\\s\\S]*?)' : '([\\s\\S]+?)'
    }).join('')
    return { key, re: new RegExp(`^${source}$`), names }
  })
  // Templates with more fixed text first, so "Sign in first." never loses to "{message}".
  list.sort((a, b) => b.re.source.length - a.re.source.length)
  compiled.set(english, list)
  return list
}

function lookup(tree: MessageTree, key: string): string | undefined {
  let node: string | MessageTree | undefined = tree
  for (const part of key.split('.')) {
    if (!node || typeof node === 'string') return undefined
    node = node[part]
  }
  return typeof node === 'string' ? node : undefined
}

/** The key and values of the English template `text` matches, if any. */
export function matchTemplate(text: string, english: MessageTree): { key: string, values: Record<string, string> } | undefined {
  for (const t of templatesOf(english)) {
    const m = t.re.exec(text)
    if (m) return { key: t.key, values: Object.fromEntries(t.names.map((n, i) => [n, m[i + 1] ?? ''])) }
  }
  return undefined
}

/**
 * `text` (English, as a route or schema wrote it) in the language whose `errors` section is
 * `target`. A value that is itself a known message (a reason inside a reason) is translated too.
 */
export function translateText(text: string, english: MessageTree, target: MessageTree, depth = 0): string {
  if (english === target || !text) return text
  const found = matchTemplate(text, english)
  if (found) {
    const template = lookup(target, found.key)
    if (template === undefined) return text
    return template.replace(/\{(\w+)\}/g, (_, name: string) => {
      const value = found.values[name] ?? ''
      return depth < 4 ? translateText(value, english, target, depth + 1) : value
    })
  }
  // "cutter.diameter: message" (the first issue repeated in an error's message)
  const field = /^([\w.[\]-]+): ([\s\S]+)$/.exec(text)
  if (field && depth < 4) return `${field[1]}: ${translateText(field[2]!, english, target, depth + 1)}`
  return text
}

export interface FieldIssue { path: string, message: string }

/** Issues with their messages in the target language; paths never change. */
export function translateIssues(issues: FieldIssue[], english: MessageTree, target: MessageTree): FieldIssue[] {
  return issues.map(i => ({ ...i, message: translateText(i.message, english, target) }))
}

/** The best supported language for an Accept-Language header ('es-MX,es;q=0.9,en;q=0.8'). */
export function pickLanguage(header: string | undefined | null, supported: readonly string[], fallback = 'en'): string {
  if (!header) return fallback
  const wanted = header.split(',').map((part) => {
    const [tag, ...params] = part.trim().split(';')
    const q = params.map(p => p.trim()).find(p => p.startsWith('q='))
    return { tag: (tag ?? '').toLowerCase(), q: q ? Number(q.slice(2)) || 0 : 1 }
  }).filter(w => w.tag && w.q > 0).sort((a, b) => b.q - a.q)
  for (const w of wanted) {
    const base = w.tag.split('-')[0]!
    const hit = supported.find(s => s.toLowerCase() === w.tag) ?? supported.find(s => s.toLowerCase() === base)
    if (hit) return hit
  }
  return fallback
}

/** The cookie in which a tablet remembers its language (the screens write it, the server reads it). */
export const LANGUAGE_COOKIE = 'jogwise-lang'

/**
 * The language to speak to whoever made a request or opened a screen: their profile's choice,
 * else the tablet's (the language cookie), else the browser's Accept-Language, else English.
 * One rule for the server's answers and the screens, so both speak the same language.
 */
export function chooseLanguage(supported: readonly string[], from: { chosen?: string | null, cookie?: string | null, acceptLanguage?: string | null }): string {
  if (from.chosen && supported.includes(from.chosen)) return from.chosen
  if (from.cookie && supported.includes(from.cookie)) return from.cookie
  return pickLanguage(from.acceptLanguage, supported)
}
