import { describe, expect, it } from 'vitest'
import es from '../../../i18n/locales/es.json'
import { procedureSheetPdf, SHEET_WORDS, type SheetWords } from '../../../shared/paper/procedure-sheet'
import { STARTER_LIBRARY } from '../../../shared/procedures/starter-library'
import { STARTER_TRANSLATIONS } from '../../../shared/procedures/starter/es'
import { localizeStep, parseProcedure } from '../../../shared/procedures'
import { sheetFonts } from '../../support/sheet-fonts'
import { pdfText } from '../../support/pdf-qr'

// The printed sheet in the reader's language (issue 16): the sheet's own words from the locale
// file, the steps as the Spanish starter library has them, the signal words as bilingual Z535
// labels commonly print them (common practice for bilingual labels, from memory). Read back with
// pdf.js through unpdf, independent of the writer; every Spanish letter must print as itself
// (the app's fonts ship the Latin subset, and a missing glyph would print as "?").

const squash = (s: string) => s.replace(/\s+/g, ' ').trim()
const starter = STARTER_LIBRARY.find(p => p.steps.some(s => s.kind === 'hold') && p.steps.some(s => s.kind === 'check') && STARTER_TRANSLATIONS[p.slug])!
const parsed = parseProcedure(starter)
if (!parsed.ok) throw new Error(`starter ${starter.slug} does not parse`)
const procedure = parsed.procedure
const words = es.paper.sheet as SheetWords
const signals = { DANGER: 'PELIGRO', WARNING: 'ADVERTENCIA', CAUTION: 'PRECAUCIÓN', NOTICE: 'AVISO' }

describe('procedure sheet in Spanish', { timeout: 60_000 }, () => {
  it('has every word of the English sheet in Spanish', () => {
    expect(Object.keys(words).sort()).toEqual(Object.keys(SHEET_WORDS).sort())
  })

  it('prints its own words, the translated steps and the Spanish signal words', async () => {
    const spanish = STARTER_TRANSLATIONS[starter.slug]!.es!
    const steps = procedure.steps.map(s => localizeStep(s, STARTER_TRANSLATIONS[starter.slug], 'es').step)
    // Ranges as the Spanish screen writes them (composables/range-text.ts, decimal comma).
    const rangeText = ({ min, max, unit }: { min?: number, max?: number, unit: string }) =>
      min !== undefined && max !== undefined ? `${String(min).replace('.', ',')} a ${String(max).replace('.', ',')} ${unit}` : null
    const bytes = await procedureSheetPdf({
      ...procedure, title: spanish.title || procedure.title, summary: spanish.summary || procedure.summary, steps, version: 4, paperSize: 'a4',
      printedAt: new Date('2026-12-03T10:00:00Z'), url: 'https://shop.example/library/7', supplementNotice: es.editor.supplement,
      words, signalWords: signals, categoryLabel: es.categories[procedure.category], rangeText,
    }, await sheetFonts())
    const { text } = await pdfText(bytes)
    expect(text).toContain('Versión 4')
    expect(text).toContain(es.categories[procedure.category])
    expect(text).toContain('Impreso el 2026-12-03: comprueba si hay una versión más nueva')
    expect(text).toContain('Página 1 de')
    expect(text).toContain('¿Fuera del rango permitido? Motivo:')
    for (const s of steps) if (s.kind === 'check' && s.min !== undefined && s.max !== undefined) expect(text).toContain(`Permitido: ${rangeText(s)}`)
    expect(text).toContain(squash(es.editor.supplement))
    for (const [i, s] of steps.entries()) {
      expect(text).toContain(squash(`${i + 1}. ${s.title}`))
      if (s.kind === 'hold') {
        expect(text).toContain(signals[s.signalWord])
        expect(text).toContain(squash(`Qué hacer: ${s.avoid}`).slice(0, 40))
      }
    }
    for (const english of ['Printed on', 'What to do:', 'Allowed:', 'Sign-off', 'Page 1 of']) expect(text).not.toContain(english)
    // Every letter printed as itself: the only question marks are the Spanish question's own.
    expect(text.replaceAll('¿Fuera del rango permitido?', '')).not.toContain('?')
  })
})
