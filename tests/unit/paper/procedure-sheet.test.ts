import { describe, expect, it } from 'vitest'
import { procedureSheetPdf } from '../../../shared/paper/procedure-sheet'
import { STARTER_LIBRARY } from '../../../shared/procedures/starter-library'
import { describeRange, parseProcedure, SUPPLEMENT_NOTICE } from '../../../shared/procedures/schema'
import { sheetFonts } from '../../support/sheet-fonts'
import { blackSquares, decodeCells, pageFonts, pdfText } from '../../support/pdf-qr'

// The printed procedure sheet (issue 17), read back with libraries independent of the writer:
// pdf.js through unpdf for the text, the page size and the QR code's cells, jsQR to decode it.

const squash = (s: string) => s.replace(/\s+/g, ' ').trim()
const procedures = STARTER_LIBRARY.map((p) => {
  const parsed = parseProcedure(p)
  if (!parsed.ok) throw new Error(`starter ${p.slug} does not parse`)
  return parsed.procedure
})
const printedAt = new Date('2026-12-03T10:00:00Z')

// Making and reading back a sheet takes a few seconds on a busy machine.
describe('procedure sheet PDF', { timeout: 60_000 }, () => {
  it.each(procedures.map(p => [p.title, p] as const))('%s holds every step title, signal word and check range', async (_t, p) => {
    const bytes = await procedureSheetPdf({ ...p, version: 4, paperSize: 'a4', printedAt, url: 'https://shop.example/library/7' }, await sheetFonts())
    const { text } = await pdfText(bytes)
    expect(text).toContain(squash(p.title))
    expect(text).toContain('Version 4')
    p.steps.forEach((s, i) => {
      expect(text).toContain(squash(`${i + 1}. ${s.title}`))
      if (s.kind === 'hold') expect(text).toContain(s.signalWord)
      if (s.kind === 'check') {
        const range = describeRange(s)
        if (range) expect(text).toContain(`Allowed: ${range}`)
      }
    })
    // The notice of the brief's Safety section and the reprint warning of the issue.
    expect(text).toContain(squash(SUPPLEMENT_NOTICE))
    expect(text).toContain('Printed on 2026-12-03 — check for a newer version')
    expect(text).toContain('Sign-off')
  })

  it.each([
    // ISO 216: A4 is 210 × 297 mm = 595.28 × 841.89 pt (1 in = 25.4 mm, 72 pt per inch).
    ['a4', 595.28, 841.89],
    // ANSI/ASME Y14.1: Letter is 8.5 × 11 in = 612 × 792 pt.
    ['letter', 612, 792],
  ] as const)('prints on %s paper', async (paperSize, w, h) => {
    const p = procedures[0]!
    const bytes = await procedureSheetPdf({ ...p, version: 1, paperSize, printedAt, url: 'https://shop.example/library/7' }, await sheetFonts())
    const { sizes } = await pdfText(bytes)
    for (const s of sizes) {
      expect(s.width).toBeCloseTo(w, 1)
      expect(s.height).toBeCloseTo(h, 1)
    }
  })

  it('carries a QR code that decodes to the procedure\'s address', async () => {
    const url = 'https://jogwise.shop.example/library/42?version=3'
    const bytes = await procedureSheetPdf({ ...procedures[1]!, version: 3, paperSize: 'letter', printedAt, url }, await sheetFonts())
    expect(decodeCells(await blackSquares(bytes))).toBe(url)
  })

  it('embeds the app\'s own font', async () => {
    const bytes = await procedureSheetPdf({ ...procedures[1]!, version: 3, paperSize: 'a4', printedAt, url: 'https://x.example/' }, await sheetFonts())
    // pdf.js loads each font the page uses; missingFile would mean a viewer substitutes its own.
    const fonts = await pageFonts(bytes)
    expect(fonts.map(f => f.name).sort()).toEqual([expect.stringMatching(/^AtkinsonHyperlegible-Bold/), expect.stringMatching(/^AtkinsonHyperlegible-Regular/)])
    expect(fonts.every(f => f.missingFile === false)).toBe(true)
  })
})
