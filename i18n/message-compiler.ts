import { compile } from '@intlify/core-base'
import type { MessageCompiler, MessageFunction } from 'vue-i18n'

// Jogwise's screen texts use two pieces of vue-i18n's message syntax: `{name}` placeholders and
// `|` between plural forms. This compiler reads just those, so vue-i18n's own (about 5 KB gzip
// on every screen) stays out of the build (nuxt.config.ts bundle.dropMessageCompiler, issue 14).
// tests/unit/i18n/message-compiler.test.ts renders every message of every locale file with both
// and fails on any difference, so a message using more of the syntax is caught before it ships.

type Part = string | { name: string }

// What a message function is called with (@intlify/core-base createMessageContext); the public
// MessageContext type leaves out normalize and interpolate, which vue-i18n's own functions use.
interface Helpers {
  named: (key: string) => unknown
  plural: (forms: unknown[]) => unknown
  normalize: (values: unknown[]) => unknown
  interpolate: (value: unknown) => unknown
}

const PLACEHOLDER = /\{\s*([A-Za-z_]\w*)\s*\}/

function partsOf(text: string): Part[] {
  // split() with a capture group: even items are text, odd items are placeholder names.
  return text.split(PLACEHOLDER).map((p, i) => i % 2 ? { name: p } : p).filter(p => p !== '')
}

const cache = new Map<string, MessageFunction<string>>()

export const compileMessage: MessageCompiler = (source, context) => {
  // The messages files hold text; a message the bundler compiled already (the component tests'
  // dev build) is rendered by vue-i18n itself, which needs no compiler for that.
  if (typeof source !== 'string') return compile(source, context)
  const cached = cache.get(source)
  if (cached) return cached
  // Plural forms lose the spaces around their `|`; a message of one form keeps its own spaces.
  const split = source.split('|')
  const forms = split.length > 1 ? split.map(form => partsOf(form.trim())) : [partsOf(source)]
  const render = (ctx: Helpers, parts: Part[]) =>
    ctx.normalize(parts.map(p => typeof p === 'string' ? p : ctx.interpolate(ctx.named(p.name))))
  const run = forms.length > 1
    ? (ctx: Helpers) => ctx.plural(forms.map(parts => render(ctx, parts)))
    : (ctx: Helpers) => render(ctx, forms[0]!)
  const fn = run as unknown as MessageFunction<string>
  cache.set(source, fn)
  return fn
}
