import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { formatDate, formatTimeAgoIntl } from '@vueuse/core'
import { datePatternText, timeAgoText } from '../../../utils/date-text'

// The screens' date patterns and "how long ago" (utils/date-text.ts) against VueUse's
// formatDate and formatTimeAgoIntl, an independent implementation of the same pattern letters
// and of the same Intl.RelativeTimeFormat rule: every pattern of every language file, in that
// language, at times that reach each hour of the day, the year's ends and single digits.

const DIR = join(import.meta.dirname, '../../../i18n/locales')
const languages = readdirSync(DIR).filter(f => f.endsWith('.json')).map((f) => {
  const file = JSON.parse(readFileSync(join(DIR, f), 'utf8')) as { meta: { tag: string }, formats: Record<string, string> }
  return { file: f, tag: file.meta.tag, formats: file.formats }
})

const times: Date[] = []
for (let hour = 0; hour < 24; hour++) times.push(new Date(2026, hour % 12, 1 + hour, hour, hour * 2 % 60, hour * 3 % 60))
times.push(new Date(2026, 11, 31, 23, 59, 59), new Date(2027, 0, 1, 0, 0, 0), new Date(2026, 4, 9, 12, 5, 7))

describe('date patterns', () => {
  for (const { file, tag, formats } of languages) {
    it(`writes every pattern of ${file} as VueUse's formatDate does`, () => {
      const differ: string[] = []
      for (const [name, pattern] of Object.entries(formats)) {
        for (const at of times) {
          const ours = datePatternText(at, pattern, tag)
          const theirs = formatDate(at, pattern, { locales: tag })
          if (ours !== theirs) differ.push(`${name} ${at.toISOString()}: ${ours} ≠ ${theirs}`)
        }
      }
      expect(differ).toEqual([])
      expect(Object.keys(formats).length).toBeGreaterThan(5)
    })
  }

  it('keeps text in brackets and letters it does not know', () => {
    const at = new Date(2026, 11, 3, 14, 5, 9)
    for (const pattern of ['[at] H:mm', 'DD/MM/YYYY hh:mm:ss a', 'dddd D MMMM', 'Q x']) {
      expect(datePatternText(at, pattern, 'en')).toBe(formatDate(at, pattern, { locales: 'en' }))
    }
  })
})

describe('how long ago', () => {
  const now = new Date(2026, 11, 3, 14, 5, 9)
  const offsets = [0, 400, 999, 1000, 45_000, 60_000, 89_000, 5 * 60_000, 59 * 60_000, 3_600_000, 5 * 3_600_000, 86_400_000, 3 * 86_400_000, 8 * 86_400_000, 40 * 86_400_000, 400 * 86_400_000]
  for (const { file, tag } of languages) {
    it(`says it in ${file} as VueUse's formatTimeAgoIntl does, past and ahead`, () => {
      for (const ms of offsets) {
        for (const from of [new Date(now.getTime() - ms), new Date(now.getTime() + ms)]) {
          expect(timeAgoText(from, now, tag), `${ms}`).toBe(formatTimeAgoIntl(from, { locale: tag, relativeTimeFormatOptions: { numeric: 'auto' } }, now))
        }
      }
    })
  }
})
