// The Ledger CSV's local-time column (server/utils/ledger-query.ts).

/**
 * "2026-01-12 09:02:00" in one IANA time zone. Intl's formatter costs tens of microseconds a
 * call, too much for 200,000 rows, so the zone's offset is looked up once per quarter hour of
 * UTC (offset changes happen on quarter hours) and the digits are written from it.
 */
export function localTimeFormatter(timeZone: string): (iso: string | null) => string {
  const format = new Intl.DateTimeFormat('en-GB', {
    timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit', hourCycle: 'h23',
  })
  const QUARTER = 900_000
  const offsets = new Map<number, number>()
  const offsetAt = (ms: number) => {
    const bucket = Math.floor(ms / QUARTER)
    let offset = offsets.get(bucket)
    if (offset === undefined) {
      const p: Record<string, string> = {}
      for (const part of format.formatToParts(new Date(bucket * QUARTER))) p[part.type] = part.value
      offset = Date.UTC(Number(p.year), Number(p.month) - 1, Number(p.day), Number(p.hour), Number(p.minute), Number(p.second)) - bucket * QUARTER
      if (offsets.size > 100_000) offsets.clear()
      offsets.set(bucket, offset)
    }
    return offset
  }
  const two = (n: number) => String(n).padStart(2, '0')
  return (iso) => {
    if (!iso) return ''
    const ms = Date.parse(iso)
    if (Number.isNaN(ms)) return ''
    const d = new Date(ms + offsetAt(ms))
    return `${d.getUTCFullYear()}-${two(d.getUTCMonth() + 1)}-${two(d.getUTCDate())} ${two(d.getUTCHours())}:${two(d.getUTCMinutes())}:${two(d.getUTCSeconds())}`
  }
}
