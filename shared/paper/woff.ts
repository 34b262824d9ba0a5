// Turns a WOFF 1.0 font (W3C WOFF File Format 1.0: a 44-byte header, 20-byte table entries,
// each table zlib-compressed when that made it smaller) back into the plain sfnt (TrueType or
// OpenType) it wraps, so the printed sheet embeds the app's own font whole. pdf-lib can only
// embed sfnt bytes as they are; its subsetting garbled glyphs of this font in pdf.js.

async function inflate(bytes: Uint8Array): Promise<Uint8Array> {
  // 'deflate' is the zlib format (RFC 1950) that WOFF uses.
  const stream = new Blob([bytes as BlobPart]).stream().pipeThrough(new DecompressionStream('deflate'))
  return new Uint8Array(await new Response(stream).arrayBuffer())
}

export async function woffToSfnt(woff: Uint8Array): Promise<Uint8Array> {
  const src = new DataView(woff.buffer, woff.byteOffset, woff.byteLength)
  if (src.getUint32(0) !== 0x774F4646) throw new Error('Not a WOFF font.')
  const flavor = src.getUint32(4)
  const numTables = src.getUint16(12)
  const tables: { tag: number, checksum: number, data: Uint8Array }[] = []
  for (let i = 0; i < numTables; i++) {
    const at = 44 + i * 20
    const offset = src.getUint32(at + 4)
    const compLength = src.getUint32(at + 8)
    const origLength = src.getUint32(at + 12)
    const raw = woff.subarray(offset, offset + compLength)
    tables.push({ tag: src.getUint32(at), checksum: src.getUint32(at + 16), data: compLength < origLength ? await inflate(raw) : raw })
  }
  // The sfnt offset table's binary-search fields (OpenType spec, "Organization of an OpenType font").
  const entrySelector = Math.floor(Math.log2(numTables))
  const searchRange = 2 ** entrySelector * 16
  const headerSize = 12 + numTables * 16
  const padded = (n: number) => (n + 3) & ~3
  const total = tables.reduce((sum, t) => sum + padded(t.data.length), headerSize)
  const out = new Uint8Array(total)
  const dst = new DataView(out.buffer)
  dst.setUint32(0, flavor)
  dst.setUint16(4, numTables)
  dst.setUint16(6, searchRange)
  dst.setUint16(8, entrySelector)
  dst.setUint16(10, numTables * 16 - searchRange)
  let offset = headerSize
  tables.forEach((t, i) => {
    const at = 12 + i * 16
    dst.setUint32(at, t.tag)
    dst.setUint32(at + 4, t.checksum)
    dst.setUint32(at + 8, offset)
    dst.setUint32(at + 12, t.data.length)
    out.set(t.data, offset)
    offset += padded(t.data.length)
  })
  return out
}
