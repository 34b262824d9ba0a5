import { describe, expect, it } from 'vitest'
import { SIGNAL_WORD_INFO, SIGNAL_WORDS, SIGNAL_WORDS_BY_SEVERITY } from '../../../shared/procedures/signal-words'

describe('signal words', () => {
  // ANSI Z535.4-2007 §4.14 (wording read in a secondary copy): DANGER "will" and WARNING "could"
  // result in death or serious injury; CAUTION could result in minor or moderate injury;
  // NOTICE is for practices not related to personal injury and never carries the alert symbol.
  it.each<[string, string, string | null, boolean]>([
    ['DANGER', 'death or serious injury', 'will', true],
    ['WARNING', 'death or serious injury', 'could', true],
    ['CAUTION', 'minor or moderate injury', 'could', true],
    ['NOTICE', 'property or equipment damage', null, false],
  ])('%s means %s (%s), alert symbol %s', (word, harm, likelihood, alert) => {
    const info = SIGNAL_WORD_INFO[word as keyof typeof SIGNAL_WORD_INFO]
    expect(info).toMatchObject({ word, harm, likelihood, alertSymbol: alert })
  })

  // Colours from the same standard (read in a secondary copy).
  it.each([['DANGER', 'red'], ['WARNING', 'orange'], ['CAUTION', 'yellow'], ['NOTICE', 'blue']] as const)('%s uses %s', (word, colour) => {
    expect(SIGNAL_WORD_INFO[word].colour).toBe(colour)
  })

  // ISO 3864-2 (2004, 2016) has the first three words only ("no NOTICE" is from memory).
  it('marks which words ISO 3864-2 shares', () => {
    expect(SIGNAL_WORDS.filter(w => SIGNAL_WORD_INFO[w].inIso3864)).toEqual(['DANGER', 'WARNING', 'CAUTION'])
  })

  it('orders by severity, most severe first', () => {
    expect(SIGNAL_WORDS_BY_SEVERITY).toEqual(['DANGER', 'WARNING', 'CAUTION', 'NOTICE'])
  })

  // The screen colours are our own sRGB picks; check each lies in its named hue band (sRGB to
  // HSL hue, standard colour-space arithmetic, COMPUTED; bands are our own choice).
  const hue = (hex: string) => {
    const [r, g, b] = [1, 3, 5].map(i => Number.parseInt(hex.slice(i, i + 2), 16) / 255) as [number, number, number]
    const max = Math.max(r, g, b)
    const d = max - Math.min(r, g, b)
    const h = max === r ? ((g - b) / d) % 6 : max === g ? (b - r) / d + 2 : (r - g) / d + 4
    return (h * 60 + 360) % 360
  }
  it.each([['DANGER', 345, 375], ['WARNING', 15, 40], ['CAUTION', 45, 60], ['NOTICE', 200, 230]] as const)('%s background hue lies in its band', (word, lo, hi) => {
    const h = hue(SIGNAL_WORD_INFO[word].background)
    const wrapped = h < lo ? h + 360 : h
    expect(wrapped).toBeGreaterThanOrEqual(lo)
    expect(wrapped).toBeLessThanOrEqual(hi)
  })

  // Panel text must stay readable: WCAG 2.x contrast ratio (L1 + 0.05) / (L2 + 0.05) with sRGB
  // relative luminance, at least 4.5:1 (SC 1.4.3, AA). Formula and threshold from memory
  // (MEMORY), W3C WCAG 2.2 definitions "contrast ratio" and "relative luminance".
  const luminance = (hex: string) => {
    const [r, g, b] = [1, 3, 5].map((i) => {
      const c = Number.parseInt(hex.slice(i, i + 2), 16) / 255
      return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
    }) as [number, number, number]
    return 0.2126 * r + 0.7152 * g + 0.0722 * b
  }
  it('contrast check reproduces the known extremes (black on white is 21:1)', () => {
    expect((luminance('#FFFFFF') + 0.05) / (luminance('#000000') + 0.05)).toBeCloseTo(21, 10)
  })
  it.each(SIGNAL_WORDS.map(w => [w]))('%s text is readable on its panel (>= 4.5:1)', (word) => {
    const { background, text } = SIGNAL_WORD_INFO[word]
    const [a, b] = [luminance(background), luminance(text)].sort((x, y) => y - x) as [number, number]
    expect((a + 0.05) / (b + 0.05)).toBeGreaterThanOrEqual(4.5)
  })
})
