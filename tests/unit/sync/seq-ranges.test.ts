import { describe, expect, it } from 'vitest'
import { seqsLeftOut } from '../../../server/utils/seq-ranges'
import { seededRandom } from '../../support/seeded-random'

// The read-back's "leave out these rows" must leave out exactly the batch's own sequence numbers:
// one number too many would hide another tablet's event from this tablet for good.

/** The numbers the condition leaves out, read back from its ranges or its list. */
function leftOut(sql: string): Set<number> {
  const out = new Set<number>()
  for (const [, a, b] of sql.matchAll(/between (\d+) and (\d+)/g)) for (let n = Number(a); n <= Number(b); n++) out.add(n)
  const list = /not in \(([^)]*)\)/.exec(sql)
  if (list) for (const n of list[1]!.split(',')) out.add(Number(n))
  return out
}

// A seeded generator, so every run draws the same cases
const random = seededRandom

describe('seqsLeftOut', () => {
  it('is empty for no numbers', () => {
    expect(seqsLeftOut([])).toBe('')
  })

  it('writes one range for the consecutive numbers of one INSERT, in any order', () => {
    expect(seqsLeftOut([103, 101, 102, 100])).toBe(' and not (r.seq between 100 and 103)')
  })

  it('never covers a number between two runs of the batch (another batch\'s row)', () => {
    expect(seqsLeftOut([1, 2, 3, 7, 8, 10])).toBe(' and not (r.seq between 1 and 3 or r.seq between 7 and 8 or r.seq between 10 and 10)')
  })

  it('leaves out exactly the numbers given, for scattered and repeated numbers too', () => {
    const next = random(14)
    for (let round = 0; round < 200; round++) {
      const seqs: number[] = []
      let n = Math.floor(next() * 1000)
      const count = 1 + Math.floor(next() * 120)
      for (let i = 0; i < count; i++) {
        n += next() < 0.8 ? 1 : 2 + Math.floor(next() * 5)
        seqs.push(n)
        if (next() < 0.05) seqs.push(n)
      }
      expect(leftOut(seqsLeftOut(seqs))).toEqual(new Set(seqs))
    }
  })

  it('falls back to a list when the numbers are too scattered for ranges', () => {
    const seqs = Array.from({ length: 40 }, (_, i) => i * 3)
    expect(seqsLeftOut(seqs)).toMatch(/^ and r\.seq not in \(0, 3, 6/)
    expect(leftOut(seqsLeftOut(seqs))).toEqual(new Set(seqs))
  })
})
