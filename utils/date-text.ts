// Dates and "how long ago" as the screens write them, with the patterns of each language file's
// `formats` section (D MMM YYYY, h:mm A…). Jogwise's own few lines rather than VueUse's
// formatDate and formatTimeAgoIntl, which brought more of VueUse to every screen's first load
// (issue 14); tests/unit/format/date-text.test.ts renders every pattern of every language file
// with both and fails on any difference. Month and weekday names come from the browser's Intl.

/** The pattern letters the language files may use; anything else, or text in [brackets], stays as written. */
const TOKENS = /\[([^\]]+)\]|YYYY|M{1,4}|D{1,2}|d{3,4}|H{1,2}|h{1,2}|A|a|m{1,2}|s{1,2}/g

export function datePatternText(date: Date, pattern: string, locale: string): string {
  const pad = (n: number) => String(n).padStart(2, '0')
  const name = (options: Intl.DateTimeFormatOptions) => date.toLocaleDateString(locale, options)
  const hours = date.getHours()
  const h12 = hours % 12 || 12
  const noon = hours < 12 ? 'AM' : 'PM'
  return pattern.replace(TOKENS, (token, literal?: string) => {
    if (literal !== undefined) return literal
    switch (token) {
      case 'YYYY': return String(date.getFullYear())
      case 'M': return String(date.getMonth() + 1)
      case 'MM': return pad(date.getMonth() + 1)
      case 'MMM': return name({ month: 'short' })
      case 'MMMM': return name({ month: 'long' })
      case 'D': return String(date.getDate())
      case 'DD': return pad(date.getDate())
      case 'ddd': return name({ weekday: 'short' })
      case 'dddd': return name({ weekday: 'long' })
      case 'H': return String(hours)
      case 'HH': return pad(hours)
      case 'h': return String(h12)
      case 'hh': return pad(h12)
      case 'A': return noon
      case 'a': return noon.toLowerCase()
      case 'm': return String(date.getMinutes())
      case 'mm': return pad(date.getMinutes())
      case 's': return String(date.getSeconds())
      default: return pad(date.getSeconds())
    }
  })
}

/** From the largest down: the first unit the difference reaches is the one said. */
const UNITS: [Intl.RelativeTimeFormatUnit, number][] = [
  ['year', 31_536_000_000], ['month', 2_592_000_000], ['week', 604_800_000], ['day', 86_400_000],
  ['hour', 3_600_000], ['minute', 60_000], ['second', 1000],
]

/** "5 minutes ago", "hace 5 minutos", "now" (Intl.RelativeTimeFormat, numeric: auto). */
export function timeAgoText(from: Date, now: Date, locale: string): string {
  const rtf = new Intl.RelativeTimeFormat(locale, { numeric: 'auto' })
  const diff = from.getTime() - now.getTime()
  const unit = UNITS.find(([, ms]) => Math.abs(diff) >= ms)
  // Under a second either way reads as this very moment ("now").
  const parts = unit ? rtf.formatToParts(Math.round(diff / unit[1]), unit[0]) : rtf.formatToParts(0, 'second')
  return parts.map(p => p.value.trim()).join(' ')
}
