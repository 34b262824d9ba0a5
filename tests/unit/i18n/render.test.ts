import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { compile, createMessageContext } from '@intlify/core-base'
import { flatten, type MessageTree } from '../../../shared/i18n/translate'
import { renderMessage } from '../../../shared/i18n/render'

// The app's own message renderer (shared/i18n/render.ts) against vue-i18n's compiler and message
// context (@intlify/core-base, an independent implementation of the same documented syntax):
// every message of every locale file, with every placeholder filled and plural counts 0, 1, 2
// and 5, and with no count at all, renders the same.

const DIR = join(import.meta.dirname, '../../../i18n/locales')
const files = readdirSync(DIR).filter(f => f.endsWith('.json')).sort()

function valuesOf(message: string) {
  const named: Record<string, unknown> = {}
  for (const m of message.matchAll(/\{\s*(\w+)\s*\}/g)) named[m[1]!] = `<${m[1]}>`
  return named
}

/** vue-i18n's rendering: its context sets `n` and `count` to the plural count, as t() does. */
function theirs(message: string, count: number | undefined) {
  const fn = compile(message, { key: 'k', locale: 'en', onError: (e) => { throw e } }) as (ctx: unknown) => unknown
  const named = valuesOf(message)
  return fn(createMessageContext(count === undefined ? { named, locale: 'en' } : { named, pluralIndex: count, locale: 'en' }))
}

describe('message renderer', () => {
  for (const file of files) {
    it(`renders every message of ${file} as vue-i18n does`, () => {
      const messages = flatten(JSON.parse(readFileSync(join(DIR, file), 'utf8')) as MessageTree)
      const differ: string[] = []
      for (const [key, message] of Object.entries(messages)) {
        for (const count of [0, 1, 2, 5, undefined]) {
          const a = theirs(message, count)
          const b = renderMessage(message, valuesOf(message), count)
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
    expect(renderMessage(message, named, count)).toBe(expected)
    expect((compile(message, { key: 'k', locale: 'en' }) as (c: unknown) => unknown)(ctx)).toBe(expected)
  })

  it.each([
    // Values vue-i18n shows its own way: nothing for a missing one, a number as its digits.
    ['{a} and {b}', { a: 1 }, '1 and '],
    ['{x}', { x: 2.5 }, '2.5'],
    ['{x}', { x: null }, ''],
  ])('%s with %o reads %s', (message, named, expected) => {
    expect(renderMessage(message, named)).toBe(expected)
    expect((compile(message, { key: 'k', locale: 'en' }) as (c: unknown) => unknown)(createMessageContext({ named: named as Record<string, unknown>, locale: 'en' }))).toBe(expected)
  })
})
