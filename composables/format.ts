// Dates, times and numbers through Intl in the screen's language (its file's `meta.tag`, e.g.
// "es" writes 0,127 and 3 dic 2026). Units stay the machine's; only how numbers read changes.
export function useFormat() {
  const { locale, locales } = useI18n()
  const tag = computed(() => locales.value.find(l => l.code === locale.value)?.language ?? locale.value)
  const toDate = (v: Date | string | number) => (v instanceof Date ? v : new Date(v))
  // The decimal mark of the language (',' in Spanish), for figures shared/machining wrote with '.'.
  const mark = computed(() => new Intl.NumberFormat(tag.value).formatToParts(1.5).find(p => p.type === 'decimal')?.value ?? '.')
  return {
    tag,
    /** "12.5 mm" → "12,5 mm" where the language writes a decimal comma; units stay as they are. */
    decimals: (text: string) => mark.value === '.' ? text : text.replace(/(\d)\.(\d)/g, `$1${mark.value}$2`),
    number: (n: number, options?: Intl.NumberFormatOptions) => new Intl.NumberFormat(tag.value, options).format(n),
    date: (v: Date | string | number) => new Intl.DateTimeFormat(tag.value, { dateStyle: 'medium' }).format(toDate(v)),
    dateTime: (v: Date | string | number) => new Intl.DateTimeFormat(tag.value, { dateStyle: 'medium', timeStyle: 'short' }).format(toDate(v)),
    time: (v: Date | string | number) => new Intl.DateTimeFormat(tag.value, { timeStyle: 'short' }).format(toDate(v)),
    weekdayTime: (v: Date | string | number) => new Intl.DateTimeFormat(tag.value, { weekday: 'short', hour: '2-digit', minute: '2-digit' }).format(toDate(v)),
  }
}
