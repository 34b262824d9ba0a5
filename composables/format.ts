// Every date, time and number on screen, in the screen's language (its file's `meta.tag`, e.g.
// "es" writes 0,127 and 3 dic 2026). Dates and times follow the patterns of the language file's
// `formats` section (a third language brings its own), "how long ago" Intl.RelativeTimeFormat
// ("5 minutes ago", "hace 5 minutos"), both through utils/date-text.ts. Units stay the
// machine's; only how numbers read changes.
export type DatePattern = 'date' | 'day' | 'dateTime' | 'dayTime' | 'stamp' | 'time' | 'weekdayTime'
type When = Date | string | number

export function useFormat() {
  const { locale, locales, t } = useI18n()
  const tag = computed(() => locales.value.find(l => l.code === locale.value)?.language ?? locale.value)
  const toDate = (v: When) => (v instanceof Date ? v : new Date(v))
  // A stored time that does not parse shows a dash instead of "NaN" or an error for the list.
  const when = (v: When, pattern: DatePattern) => {
    const d = toDate(v)
    return Number.isNaN(d.getTime()) ? '—' : datePatternText(d, t(`formats.${pattern}`), tag.value)
  }
  // The decimal mark of the language (',' in Spanish), for figures shared/machining wrote with '.'.
  const mark = computed(() => new Intl.NumberFormat(tag.value).formatToParts(1.5).find(p => p.type === 'decimal')?.value ?? '.')
  return {
    tag,
    /** "12.5 mm" → "12,5 mm" where the language writes a decimal comma; units stay as they are. */
    decimals: (text: string) => mark.value === '.' ? text : text.replace(/(\d)\.(\d)/g, `$1${mark.value}$2`),
    number: (n: number, options?: Intl.NumberFormatOptions) => new Intl.NumberFormat(tag.value, options).format(n),
    /** 3 Dec 2026 */
    date: (v: When) => when(v, 'date'),
    /** 3 Dec */
    day: (v: When) => when(v, 'day'),
    /** 3 Dec 2026, 2:05 PM */
    dateTime: (v: When) => when(v, 'dateTime'),
    /** 3 Dec, 2:05 PM */
    dayTime: (v: When) => when(v, 'dayTime'),
    /** 3 Dec, 2:05:09 PM: the record's and Ledger's entries, seconds apart */
    stamp: (v: When) => when(v, 'stamp'),
    /** 2:05 PM */
    time: (v: When) => when(v, 'time'),
    /** Thu 2:05 PM */
    weekdayTime: (v: When) => when(v, 'weekdayTime'),
    /** "5 minutes ago"; "now" within the last minute, and for a time a clock ahead of ours wrote */
    ago: (v: When, now: When = Date.now()) => {
      const d = toDate(v)
      if (Number.isNaN(d.getTime())) return '—'
      const from = toDate(now).getTime() - d.getTime() < 60_000 ? toDate(now) : d
      return timeAgoText(from, toDate(now), tag.value)
    },
  }
}
