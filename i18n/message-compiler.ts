import type { MessageCompiler, MessageContext, MessageFunction } from 'vue-i18n'

// Jogwise's screen texts use two pieces of vue-i18n's message syntax: `{name}` placeholders and
// `|` between plural forms. This compiler reads just those, so vue-i18n's own (about 5 KB gzip
// on every screen) stays out of the build (nuxt.config.ts bundle.dropMessageCompiler, issue 14).
// tests/unit/i18n/message-compiler.test.ts renders every message of every locale file with both
// and fails on any difference, so a message using more of the syntax is caught before it ships.

type Part = string | { name: string }

const PLACEHOLDER = /\{\s*([A-Za-z_]\w*)\s*\}/

function partsOf(text: string): Part[] {
  // split() with a capture group: even items are text, odd items are placeholder names.
  return text.split(PLACEHOLDER).map((p, i) => i % 2 ? { name: p } : p).filter(p => p !== '')
}

const cache = new Map<string, MessageFunction<string>>()

export const compileMessage: MessageCompiler = (source) => {
  // Messages come from the locale files as text; anything else is shown as it is.
  if (typeof source !== 'string') return () => source as unknown as string
  const cached = cache.get(source)
  if (cached) return cached
  // Plural forms lose the spaces around their `|`; a message of one form keeps its own spaces.
  const split = source.split('|')
  const forms = split.length > 1 ? split.map(form => partsOf(form.trim())) : [partsOf(source)]
  const render = (ctx: MessageContext<string>, parts: Part[]) =>
    ctx.normalize(parts.map(p => typeof p === 'string' ? p : ctx.interpolate(ctx.named(p.name))))
  const fn: MessageFunction<string> = forms.length > 1
    ? ctx => ctx.plural(forms.map(parts => render(ctx, parts)))
    : ctx => render(ctx, forms[0]!)
  cache.set(source, fn)
  return fn
}
