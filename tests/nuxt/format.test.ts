import { mountSuspended } from '@nuxt/test-utils/runtime'
import { afterEach, describe, expect, it } from 'vitest'
import { defineComponent, h } from 'vue'

// Dates, times and "how long ago" in the screen's language (issues 13 and 16), through the
// language files' patterns and Intl.RelativeTimeFormat (utils/date-text.ts). Month and weekday
// names and the relative phrases are the CLDR data in the browser's Intl (Unicode CLDR), not written by us.
const at = new Date(2026, 11, 3, 14, 5, 9) // 3 December 2026, 14:05:09 local time

async function formatted(lang: 'en' | 'es') {
  await useI18n().setLocale(lang)
  let out: Record<string, string> = {}
  await mountSuspended(defineComponent(() => {
    const f = useFormat()
    out = {
      date: f.date(at), dateTime: f.dateTime(at), stamp: f.stamp(at), time: f.time(at),
      ago: f.ago(new Date(at.getTime() - 5 * 60_000), at), now: f.ago(at, at), recent: f.ago(new Date(at.getTime() - 40_000), at), ahead: f.ago(new Date(at.getTime() + 4000), at), bad: f.dateTime('not a time'),
      number: f.number(0.127), decimals: f.decimals('12.5 mm'),
    }
    return () => h('p')
  }))
  return out
}

describe('useFormat', () => {
  afterEach(async () => { await useI18n().setLocale('en') })

  it('writes English dates with the 12-hour clock', async () => {
    const f = await formatted('en')
    expect(f.date).toBe('3 Dec 2026')
    expect(f.dateTime).toBe('3 Dec 2026, 2:05 PM')
    expect(f.stamp).toBe('3 Dec, 2:05:09 PM')
    expect(f.ago).toBe('5 minutes ago')
    expect(f.now).toBe('now')
    // Within a minute, or a moment ahead (the last sync, read against a clock ticking every 15 s)
    expect(f.recent).toBe('now')
    expect(f.ahead).toBe('now')
  })

  it('writes Spanish dates, the 24-hour clock and the decimal comma', async () => {
    const f = await formatted('es')
    expect(f.date).toBe('3 dic 2026')
    expect(f.dateTime).toBe('3 dic 2026, 14:05')
    expect(f.time).toBe('14:05')
    expect(f.ago).toBe('hace 5 minutos')
    expect(f.now).toBe('ahora')
    expect(f.number).toBe('0,127')
    expect(f.decimals).toBe('12,5 mm')
  })

  it('shows a dash for a stored time that does not parse, rather than breaking the list', async () => {
    expect((await formatted('en')).bad).toBe('—')
  })
})
