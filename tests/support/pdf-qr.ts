import jsQR from 'jsqr'
import { getDocumentProxy, getResolvedPDFJS } from 'unpdf'

// Reads a QR code back from a PDF page with libraries independent of the ones that wrote it:
// pdf.js (through unpdf) lists the page's drawing operations, the black square cells of the
// code are put back on a pixel grid, and jsQR decodes it (ISO/IEC 18004).

// pdf.js calls this ES2024 method; Node 20 lacks it.
const proto = ArrayBuffer.prototype as unknown as { transferToFixedLength?: () => ArrayBuffer }
proto.transferToFixedLength ??= function (this: ArrayBuffer) { return this.slice(0) }

type Matrix = [number, number, number, number, number, number]
const times = (m: Matrix, n: Matrix): Matrix => [
  n[0] * m[0] + n[1] * m[2], n[0] * m[1] + n[1] * m[3],
  n[2] * m[0] + n[3] * m[2], n[2] * m[1] + n[3] * m[3],
  n[4] * m[0] + n[5] * m[2] + m[4], n[4] * m[1] + n[5] * m[3] + m[5],
]

interface Cell { x: number, y: number, w: number, h: number }

/** Black filled squares smaller than `maxSide` points on the page, in page coordinates. */
export async function blackSquares(bytes: Uint8Array, pageNumber = 1, maxSide = 6): Promise<Cell[]> {
  const { OPS } = await getResolvedPDFJS()
  const pdf = await getDocumentProxy(new Uint8Array(bytes))
  const page = await pdf.getPage(pageNumber)
  const ops = await page.getOperatorList()
  const stack: { ctm: Matrix, fill: string }[] = []
  let state = { ctm: [1, 0, 0, 1, 0, 0] as Matrix, fill: '#000000' }
  const out: Cell[] = []
  ops.fnArray.forEach((fn, i) => {
    const args = ops.argsArray[i] as any
    if (fn === OPS.save) stack.push({ ...state })
    else if (fn === OPS.restore) state = stack.pop() ?? state
    else if (fn === OPS.transform) state = { ...state, ctm: times(state.ctm, args as Matrix) }
    else if (fn === OPS.setFillRGBColor) state = { ...state, fill: String(args[0]).toLowerCase() }
    else if (fn === OPS.constructPath && state.fill === '#000000') {
      const mm = args[2] as ArrayLike<number>
      const [a, , , d, e, f] = state.ctm
      const cell = { x: e + a * mm[0]!, y: f + d * mm[1]!, w: a * (mm[2]! - mm[0]!), h: d * (mm[3]! - mm[1]!) }
      if (cell.w > 0 && cell.w < maxSide && Math.abs(cell.w - cell.h) < 0.01) out.push(cell)
    }
  })
  return out
}

/** Decodes the QR code drawn as square cells; null when jsQR finds none. */
export function decodeCells(cells: Cell[]): string | null {
  if (!cells.length) return null
  const side = Math.min(...cells.map(c => c.w))
  const left = Math.min(...cells.map(c => c.x))
  const top = Math.max(...cells.map(c => c.y + c.h))
  const col = (c: Cell) => Math.round((c.x - left) / side)
  const row = (c: Cell) => Math.round((top - (c.y + c.h)) / side)
  const size = Math.max(...cells.map(col), ...cells.map(row)) + 1
  const quiet = 4
  const px = 6
  const dim = (size + 2 * quiet) * px
  const data = new Uint8ClampedArray(dim * dim * 4).fill(255)
  for (const c of cells) {
    for (let dy = 0; dy < px; dy++) {
      for (let dx = 0; dx < px; dx++) {
        const at = (((row(c) + quiet) * px + dy) * dim + (col(c) + quiet) * px + dx) * 4
        data[at] = data[at + 1] = data[at + 2] = 0
      }
    }
  }
  return jsQR(data, dim, dim)?.data ?? null
}

export async function pdfText(bytes: Uint8Array): Promise<{ text: string, pages: number, sizes: { width: number, height: number }[] }> {
  const pdf = await getDocumentProxy(new Uint8Array(bytes))
  const sizes: { width: number, height: number }[] = []
  const parts: string[] = []
  for (let n = 1; n <= pdf.numPages; n++) {
    const page = await pdf.getPage(n)
    const [x0, y0, x1, y1] = page.view
    sizes.push({ width: x1! - x0!, height: y1! - y0! })
    const content = await page.getTextContent()
    parts.push(content.items.map(it => ('str' in it ? it.str : '')).join(' '))
  }
  return { text: parts.join(' ').replace(/\s+/g, ' '), pages: pdf.numPages, sizes }
}

/** The fonts page 1 draws with, as pdf.js loaded them. */
export async function pageFonts(bytes: Uint8Array): Promise<{ name: string, missingFile: boolean }[]> {
  const { OPS } = await getResolvedPDFJS()
  const pdf = await getDocumentProxy(new Uint8Array(bytes))
  const page = await pdf.getPage(1)
  const ops = await page.getOperatorList()
  const ids = new Set(ops.fnArray.flatMap((fn, i) => (fn === OPS.setFont ? [String((ops.argsArray[i] as any)[0])] : [])))
  return [...ids].map((id) => {
    const font = page.commonObjs.get(id) as { name: string, missingFile: boolean }
    return { name: font.name, missingFile: font.missingFile }
  })
}
