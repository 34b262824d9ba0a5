import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { compile, createMessageContext } from '@intlify/core-base'
import { flatten, type MessageTree } from '../../../shared/i18n/translate'
import { compileMessage } from '../../../i18n/message-compiler'

// The app's small message compiler (i18n/message-compiler.ts) against vue-i18n's own compiler
// (@intlify/core-base `compile`, the one it replaces in the build): every message of every
// locale file, with every placeholder filled and plural counts 0, 1, 2 and 5, renders the same.

const DIR = join(import.meta.dirname, '../../../i18n/locales')
const files = readdirSync(DIR).filter(f => f.endsWith('.json')).sort()

function render(fn: (ctx: any) => unknown, message: string, count: number) {
  const named: Record<string, unknown> = {}
  for (const m of message.matchAll(/\{\s*(\w+)\s*\}/g)) named[m[1]!] = `<${m[1]}>`
  named.n = count
  return fn(createMessageContext({ named, pluralIndex: count, locale: 'en' }))
}

describe('message compiler', () => {
  for (const file of files) {
    it(`renders every message of ${file} as vue-i18n does`, () => {
      const messages = flatten(JSON.parse(readFileSync(join(DIR, file), 'utf8')) as MessageTree)
      const differ: string[] = []
      for (const [key, message] of Object.entries(messages)) {
        const theirs = compile(message, { key, locale: 'en', onError: (e) => { throw e } })
        const ours = compileMessage(message, { key, locale: 'en' })
        for (const count of [0, 1, 2, 5]) {
          const a = render(theirs, message, count)
          const b = render(ours, message, count)
          if (a !== b) differ.push(`${key} (${count}): ${JSON.stringify(b)} ≠ ${JSON.stringify(a)}`)
        }
      }
      expect(differ).toEqual([])
      expect(Object.keys(messages).length).toBeGreaterThan(500)
    })
  }

  it.each([
    // [message, values, count, expected]: vue-i18n's documented syntax (named interpolation,
    // plural forms separated by a pipe), https://vue-i18n.intlify.dev/guide/essentials/syntax
    ['Hello {name}!', { name: 'Ana' }, 1, 'Hello Ana!'],
    ['{ name } waits', { name: 'Ana' }, 1, 'Ana waits'],
    ['no car | one car | {n} cars', {}, 0, 'no car'],
    ['no car | one car | {n} cars', {}, 1, 'one car'],
    ['no car | one car | {n} cars', {}, 7, '7 cars'],
    ['{n} entry | {n} entries', {}, 1, '1 entry'],
    ['{n} entry | {n} entries', {}, 3, '3 entries'],
  ])('%s with %o and count %i reads %s', (message, named, count, expected) => {
    const ctx = createMessageContext({ named: { ...named, n: count }, pluralIndex: count, locale: 'en' })
    expect(compileMessage(message, { key: 'k', locale: 'en' })(ctx)).toBe(expected)
    expect(compile(message, { key: 'k', locale: 'en' })(ctx)).toBe(expected)
  })
})
