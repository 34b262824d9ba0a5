import { describe, expect, it } from 'vitest'
import { localTimeFormatter } from '../../server/utils/local-time'

// The CSV's local-time column against Intl.DateTimeFormat itself (the ICU time zone data in
// Node), the independent reference, through 2026 and a second either side of daylight-saving
// changes. The change instants are from memory (EU: last Sunday of March and October at 01:00
// UTC; US: second Sunday of March and first of November at 02:00 local); the reference decides.
const CHANGES: Record<string, string[]> = {
  'Europe/Madrid': ['2026-03-29T01:00:00Z', '2026-10-25T01:00:00Z'],
  'America/Chicago': ['2026-03-08T08:00:00Z', '2026-11-01T07:00:00Z'],
  'Australia/Lord_Howe': ['2026-04-04T15:00:00Z', '2026-10-03T15:30:00Z'],
}

describe('localTimeFormatter', () => {
  it.each(['UTC', 'America/Chicago', 'Europe/Madrid', 'Asia/Kolkata', 'Australia/Lord_Howe', 'Asia/Kathmandu'])('agrees with Intl through 2026 in %s', (zone) => {
    const intl = new Intl.DateTimeFormat('en-GB', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit', hourCycle: 'h23' })
    const reference = (iso: string) => {
      const p: Record<string, string> = {}
      for (const part of intl.formatToParts(new Date(iso))) p[part.type] = part.value
      return `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute}:${p.second}`
    }
    const f = localTimeFormatter(zone)
    const instants: number[] = []
    for (let ms = Date.UTC(2026, 0, 1); ms < Date.UTC(2027, 0, 1); ms += 1_801_000) instants.push(ms)
    for (const c of CHANGES[zone] ?? []) for (const d of [-1000, 0, 1000]) instants.push(Date.parse(c) + d)
    for (const ms of instants) {
      const iso = new Date(ms).toISOString()
      expect(f(iso), iso).toBe(reference(iso))
    }
  }, 30_000)

  it('January in Chicago is UTC−6 (CST), July UTC−5 (CDT) (IANA time zone database)', () => {
    const f = localTimeFormatter('America/Chicago')
    expect(f('2026-01-19T08:07:00.000Z')).toBe('2026-01-19 02:07:00')
    expect(f('2026-07-19T08:07:00.000Z')).toBe('2026-07-19 03:07:00')
    expect(f(null)).toBe('')
  })
})
