import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { checkedInput, inputProblems, isWellFormed, MAX_INPUT_MAGNITUDE } from '../../../shared/schemas/input'

// The one walk every API input goes through. Well-formedness is checked against the language's
// own String.prototype.isWellFormed (ECMA-262 2024, Unicode section 3.9 D91: a lone surrogate
// code unit is ill-formed UTF-16), an implementation independent of ours.

describe('isWellFormed', () => {
  it('agrees with String.prototype.isWellFormed on any UTF-16 string (fixed seed)', () => {
    fc.assert(fc.property(fc.string({ unit: fc.integer({ min: 0, max: 0xFFFF }).map(c => String.fromCharCode(c)), maxLength: 12 }), (s) => {
      expect(isWellFormed(s)).toBe((s as string & { isWellFormed: () => boolean }).isWellFormed())
    }), { seed: 20261203, numRuns: 2000 })
  })

  it('accepts a surrogate pair and refuses either half alone', () => {
    expect(isWellFormed('board 📏 ok')).toBe(true)
    expect(isWellFormed('\ud83d')).toBe(false)
    expect(isWellFormed('\udccf')).toBe(false)
    expect(isWellFormed('\udccf\ud83d')).toBe(false)
  })
})

describe('inputProblems', () => {
  it('names the path of each ill-formed text, key and huge number', () => {
    expect(inputProblems({ a: ['ok', 'x\ud800'], b: { c: 3e303 }, ['k\udc00']: 1, d: -1e16, e: 1e15 })).toEqual([
      { path: ['a', 1], message: expect.stringMatching(/surrogate/) },
      { path: ['b', 'c'], message: expect.stringMatching(/between/) },
      { path: ['k\udc00'], message: expect.stringMatching(/field name/) },
      { path: ['d'], message: expect.stringMatching(/between/) },
    ])
  })

  it('leaves the skipped top-level keys to be checked item by item', () => {
    expect(inputProblems({ events: [{ text: '\ud800' }], since: 1 }, ['events'])).toEqual([])
  })

  it('stops at a nesting depth instead of overflowing the stack', () => {
    let deep: unknown = 1
    for (let i = 0; i < 100_000; i++) deep = [deep]
    expect(inputProblems({ deep })[0]!.message).toMatch(/nested more than/)
  })

  it('reports before the schema, so the field is named even when the schema would refuse more', () => {
    const schema = checkedInput(z.object({ name: z.string() }).strict())
    const r = schema.safeParse({ name: 'a\ud800', extra: MAX_INPUT_MAGNITUDE * 10 })
    expect(r.success).toBe(false)
    expect(r.error!.issues.map(i => i.path.join('.'))).toEqual(['name', 'extra'])
    expect(schema.safeParse({ name: 'fine' }).data).toEqual({ name: 'fine' })
  })
})
