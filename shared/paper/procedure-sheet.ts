import { PDFDocument, rgb, type PDFFont, type PDFPage, type RGB } from 'pdf-lib'
import fontkit from '@pdf-lib/fontkit'
import { describeRange, PROCEDURE_CATEGORY_LABELS, SIGNAL_WORD_INFO, type ProcedureCategory, type ProcedureStep, type SignalWord } from '../procedures/schema'
import { PAPER_POINTS, type PaperSize } from './sizes'
import { qrMatrix, QR_QUIET_ZONE } from './qr-matrix'
import { printable, wrap } from './sheet-text'
import { woffToSfnt } from './woff'

// A procedure version as a printed sheet (PDF), for the laminated copy on the machine and for
// runs done on paper. Pure: the browser makes it with no network (the fonts come from the
// app's own files) and the tests read it back. Hold points carry the same signal-word panel
// as the screen (components/library/HoldPanel.vue, ANSI Z535.4 colours and alert triangle).

/** The app's own font files in WOFF 1.0, regular and bold. */
export interface SheetFonts { regular: Uint8Array | ArrayBuffer, bold: Uint8Array | ArrayBuffer }

export interface SheetInput {
  title: string
  version: number
  category: ProcedureCategory
  summary?: string
  supplementNotice: string
  steps: readonly ProcedureStep[]
  paperSize: PaperSize
  printedAt: Date
  /** Opens this procedure in Jogwise; printed as the QR code. */
  url: string
  shopName?: string
  /** The sheet's own words in the reader's language (the `paper.sheet` section); English when left out. */
  words?: SheetWords
  /** The signal words and the category as the reader's language writes them. */
  signalWords?: Partial<Record<SignalWord, string>>
  categoryLabel?: string
  /** A check's allowed range in the reader's language ("12 a 19,5 mm"); describeRange's English when left out. */
  rangeText?: (check: { min?: number, max?: number, unit: string }) => string | null
}

/**
 * The words the sheet prints around the procedure's own text, with {name} placeholders. The
 * locale files hold the same keys under `paper.sheet`, so a sheet prints in its reader's language.
 */
export const SHEET_WORDS = {
  continued: '{title} — version {version} (continued)',
  scanToOpen: 'Scan to open in Jogwise',
  version: 'Version {version}',
  machineLine: 'Machine kind: gantry CNC router. Machine: ______________________',
  doneByLine: 'Done by: __________________   Date: ____________   Started: ______   Finished: ______',
  signoff: 'Sign-off',
  signoffNames: 'Done by (name): ____________________   Signed by trainer or owner (name): ____________________',
  signoffSignature: 'Signature: ____________________   Date and time: ____________________',
  printedOn: 'Printed on {date} — check for a newer version',
  pageOf: 'Page {n} of {total}',
  reading: '{label}: ____________ {unit}    Allowed: {range}',
  anyValue: 'any value',
  outsideReason: 'Outside the allowed range? Reason: ______________________________________________',
  photo: 'Photo: {subject} (take it, or note here why not)',
  planner: 'Surfacing plan: cutter ______  stepover ______  depth ______  feed ______',
  signed: 'Signed: ____________________   Name: ____________________',
  whatToDo: 'What to do: {avoid}',
  trainerSigns: 'Trainer or owner signs before going on: ____________________',
} as const
export type SheetWords = Record<keyof typeof SHEET_WORDS, string>

const fill = (template: string, values: Record<string, string | number>) =>
  template.replace(/\{(\w+)\}/g, (whole, name: string) => (name in values ? String(values[name]) : whole))

const MARGIN = 40
const INK = rgb(0.1, 0.1, 0.1)
const GREY = rgb(0.4, 0.4, 0.4)

function hex(colour: string): RGB {
  const n = Number.parseInt(colour.slice(1), 16)
  return rgb(((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255)
}

/** "printed on 2026-12-03 — check for a newer version" (date in UTC, as ISO 8601 writes it). */
export function printedLine(at: Date, words: SheetWords = SHEET_WORDS) {
  return fill(words.printedOn, { date: at.toISOString().slice(0, 10) })
}

export async function procedureSheetPdf(input: SheetInput, fonts: SheetFonts): Promise<Uint8Array> {
  const w = input.words ?? SHEET_WORDS
  const word = (signal: SignalWord) => input.signalWords?.[signal] ?? SIGNAL_WORD_INFO[signal].word
  const doc = await PDFDocument.create()
  doc.registerFontkit(fontkit)
  const regular = await doc.embedFont(await woffToSfnt(new Uint8Array(fonts.regular)), { subset: false })
  const bold = await doc.embedFont(await woffToSfnt(new Uint8Array(fonts.bold)), { subset: false })
  doc.setTitle(`${input.title} — version ${input.version}`)
  doc.setProducer('Jogwise')
  doc.setCreationDate(input.printedAt)
  const { width, height } = PAPER_POINTS[input.paperSize]
  const inner = width - 2 * MARGIN
  const pages: PDFPage[] = []
  let page!: PDFPage
  let y = 0

  const newPage = () => {
    page = doc.addPage([width, height])
    pages.push(page)
    y = height - MARGIN
    if (pages.length > 1) {
      text(fill(w.continued, { title: input.title, version: input.version }), { font: bold, size: 10, color: GREY })
      y -= 6
    }
  }
  const text = (s: string, o: { font?: PDFFont, size?: number, x?: number, w?: number, color?: RGB, gap?: number } = {}) => {
    const font = o.font ?? regular
    const size = o.size ?? 11
    const lineH = size * 1.3
    for (const line of wrap(font, size, s, o.w ?? inner - ((o.x ?? MARGIN) - MARGIN))) {
      ensure(lineH)
      page.drawText(line, { x: o.x ?? MARGIN, y: y - size, size, font, color: o.color ?? INK })
      y -= lineH
    }
    y -= o.gap ?? 0
  }
  // Room for `h` points, or a new page (the footer keeps its band at the bottom).
  const ensure = (h: number) => { if (y - h < MARGIN + 24) newPage() }
  const height_ = (font: PDFFont, size: number, s: string, w: number) => wrap(font, size, s, w).length * size * 1.3

  newPage()
  // Heading: title, version, kind of work, the QR code in the corner.
  const qrSide = 84
  drawQr(page, input.url, width - MARGIN - qrSide, height - MARGIN - qrSide, qrSide)
  page.drawText(printable(regular, w.scanToOpen), { x: width - MARGIN - qrSide, y: height - MARGIN - qrSide - 10, size: 7, font: regular, color: GREY })
  const headW = inner - qrSide - 12
  text(input.title, { font: bold, size: 18, w: headW, gap: 2 })
  const category = input.categoryLabel ?? PROCEDURE_CATEGORY_LABELS[input.category]
  text(`${fill(w.version, { version: input.version })} · ${category}${input.shopName ? ` · ${input.shopName}` : ''}`, { size: 11, w: headW })
  text(w.machineLine, { size: 11, w: headW })
  text(w.doneByLine, { size: 10, w: headW, gap: 4 })
  if (input.summary) text(input.summary, { size: 10, color: GREY, w: headW })
  y = Math.min(y, height - MARGIN - qrSide - 18)
  // The supplement notice, boxed, before the first step (brief: Safety).
  const noticeH = height_(regular, 9, input.supplementNotice, inner - 12) + 10
  ensure(noticeH)
  page.drawRectangle({ x: MARGIN, y: y - noticeH, width: inner, height: noticeH, borderColor: GREY, borderWidth: 0.8 })
  y -= 5
  text(input.supplementNotice, { size: 9, x: MARGIN + 6, w: inner - 12, gap: 5 })
  y -= 8

  input.steps.forEach((step, i) => {
    drawStep(step, i)
    y -= 8
  })

  // The sheet's own sign-off box: who did the run and who signed, for entering it later.
  ensure(78)
  y -= 4
  page.drawRectangle({ x: MARGIN, y: y - 72, width: inner, height: 72, borderColor: INK, borderWidth: 1.2 })
  page.drawText(printable(bold, w.signoff), { x: MARGIN + 8, y: y - 16, size: 12, font: bold, color: INK })
  page.drawText(printable(regular, w.signoffNames), { x: MARGIN + 8, y: y - 38, size: 9.5, font: regular, color: INK })
  page.drawText(printable(regular, w.signoffSignature), { x: MARGIN + 8, y: y - 60, size: 9.5, font: regular, color: INK })
  y -= 80

  // Footer on every page: printed date and the page count.
  const footer = printedLine(input.printedAt, w)
  pages.forEach((p, n) => {
    p.drawText(printable(regular, footer), { x: MARGIN, y: MARGIN - 4, size: 8.5, font: regular, color: GREY })
    const count = printable(regular, fill(w.pageOf, { n: n + 1, total: pages.length }))
    p.drawText(count, { x: width - MARGIN - regular.widthOfTextAtSize(count, 8.5), y: MARGIN - 4, size: 8.5, font: regular, color: GREY })
  })
  return doc.save()

  function drawStep(step: ProcedureStep, i: number) {
    const x = MARGIN + 22
    const width_ = inner - 22
    const bodyH = height_(regular, 10, step.body, width_)
    ensure(Math.min(14 * 1.3 + bodyH, 120))
    // The tick box, then the step's number and title.
    page.drawRectangle({ x: MARGIN, y: y - 14, width: 13, height: 13, borderColor: INK, borderWidth: 1.2 })
    text(`${i + 1}. ${step.title}`, { font: bold, size: 12, x, w: width_ })
    text(step.body, { size: 10, x, w: width_, gap: 2 })
    if (step.kind === 'hold') drawHold(step, x, width_)
    else if (step.kind === 'check') {
      const range = input.rangeText ? input.rangeText(step) : describeRange(step)
      ensure(44)
      text(fill(w.reading, { label: step.label, unit: step.unit, range: range ?? w.anyValue }), { font: bold, size: 10.5, x, w: width_, gap: 2 })
      if (range) text(w.outsideReason, { size: 9.5, x, w: width_ })
    }
    else if (step.kind === 'photo') text(fill(w.photo, { subject: step.subject }), { size: 9.5, x, w: width_, color: GREY })
    else if (step.kind === 'planner') text(w.planner, { size: 9.5, x, w: width_ })
    else if (step.kind === 'signoff') {
      text(step.statement, { font: bold, size: 10, x, w: width_, gap: 2 })
      text(w.signed, { size: 9.5, x, w: width_ })
    }
    if (step.guidance) text(step.guidance, { size: 9, x, w: width_, color: GREY })
  }

  function drawHold(step: Extract<ProcedureStep, { kind: 'hold' }>, x: number, bw: number) {
    const info = SIGNAL_WORD_INFO[step.signalWord]
    const pad = 6
    const hazardH = height_(bold, 10, step.hazard, bw - 2 * pad)
    const avoidH = height_(regular, 10, fill(w.whatToDo, { avoid: step.avoid }), bw - 2 * pad)
    const signH = step.needsTrainerSignoff ? 14 : 0
    const band = 22
    const boxH = band + hazardH + avoidH + signH + 2 * pad
    ensure(boxH + 4)
    const top = y
    // Border in the word's colour, then the coloured band with the alert triangle and word.
    page.drawRectangle({ x, y: top - boxH, width: bw, height: boxH, borderColor: hex(info.background), borderWidth: 3 })
    page.drawRectangle({ x, y: top - band, width: bw, height: band, color: hex(info.background) })
    const wordSize = 14
    const shown = printable(bold, word(step.signalWord))
    const wordW = bold.widthOfTextAtSize(shown, wordSize)
    const tri = info.alertSymbol ? 18 : 0
    const startX = x + (bw - wordW - tri - (tri ? 6 : 0)) / 2
    if (info.alertSymbol) {
      // The safety-alert symbol as on screen: the triangle in the text colour, the mark in the band's.
      page.drawSvgPath('M9 0 L18 16 L0 16 Z', { x: startX, y: top - 3, color: hex(info.text) })
      page.drawRectangle({ x: startX + 8, y: top - 3 - 11, width: 2, height: 6.5, color: hex(info.background) })
      page.drawCircle({ x: startX + 9, y: top - 3 - 13.5, size: 1.1, color: hex(info.background) })
    }
    page.drawText(shown, { x: startX + tri + (tri ? 6 : 0), y: top - band + 6, size: wordSize, font: bold, color: hex(info.text) })
    y = top - band - pad
    text(step.hazard, { font: bold, size: 10, x: x + pad, w: bw - 2 * pad })
    text(fill(w.whatToDo, { avoid: step.avoid }), { size: 10, x: x + pad, w: bw - 2 * pad })
    if (step.needsTrainerSignoff) text(w.trainerSigns, { size: 9.5, x: x + pad, w: bw - 2 * pad })
    y = top - boxH - 4
  }

  function drawQr(p: PDFPage, url: string, x: number, yBottom: number, side: number) {
    const m = qrMatrix(url)
    const cell = side / (m.size + 2 * QR_QUIET_ZONE)
    for (let r = 0; r < m.size; r++) {
      for (let c = 0; c < m.size; c++) {
        if (!m.dark(r, c)) continue
        p.drawRectangle({ x: x + (c + QR_QUIET_ZONE) * cell, y: yBottom + side - (r + QR_QUIET_ZONE + 1) * cell, width: cell, height: cell, color: rgb(0, 0, 0) })
      }
    }
  }
}
