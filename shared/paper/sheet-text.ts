import type { PDFFont } from 'pdf-lib'

// Text helpers for the printed sheet: wrapping to a width, and keeping to glyphs the embedded
// font has (the app's fonts ship the Latin subset), so nothing prints as an empty box.

const STAND_INS: Record<string, string> = { '≤': '<=', '≥': '>=', '→': '->', '−': '-', '…': '...' }

const charSets = new WeakMap<PDFFont, Set<number>>()

export function printable(font: PDFFont, text: string): string {
  const chars = charSets.get(font) ?? charSets.set(font, new Set(font.getCharacterSet())).get(font)!
  return [...text.replace(/\s+/g, ' ')].map((c) => {
    if (chars.has(c.codePointAt(0)!)) return c
    return STAND_INS[c] ?? '?'
  }).join('')
}

/** Lines of at most `width` points; a word longer than the width is cut. */
export function wrap(font: PDFFont, size: number, text: string, width: number): string[] {
  const lines: string[] = []
  let line = ''
  for (const word of printable(font, text).split(' ')) {
    const next = line ? `${line} ${word}` : word
    if (font.widthOfTextAtSize(next, size) <= width) { line = next; continue }
    if (line) lines.push(line)
    let rest = word
    while (font.widthOfTextAtSize(rest, size) > width && rest.length > 1) {
      let n = rest.length - 1
      while (n > 1 && font.widthOfTextAtSize(rest.slice(0, n), size) > width) n--
      lines.push(rest.slice(0, n))
      rest = rest.slice(n)
    }
    line = rest
  }
  if (line) lines.push(line)
  return lines
}
