import { readFile } from 'node:fs/promises'
import { createRequire } from 'node:module'
import { describe, expect, it } from 'vitest'
import fontkit from '@pdf-lib/fontkit'
import { woffToSfnt } from '../../../shared/paper/woff'

// The WOFF the app ships, unwrapped to the sfnt the printed sheet embeds. Checked against the
// OpenType spec's table checksum (sum of the table's big-endian uint32 words; the head table
// with its checkSumAdjustment taken as 0) and against fontkit's own reading of the WOFF.
const require = createRequire(import.meta.url)
const woffFile = (w: number) => require.resolve(`@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-${w}-normal.woff`)

function checksum(bytes: Uint8Array, isHead: boolean) {
  const padded = new Uint8Array((bytes.length + 3) & ~3)
  padded.set(bytes)
  if (isHead) padded.fill(0, 8, 12)
  const view = new DataView(padded.buffer)
  let sum = 0
  for (let i = 0; i < padded.length; i += 4) sum = (sum + view.getUint32(i)) >>> 0
  return sum
}

describe('woffToSfnt', () => {
  it.each([400, 700])('unwraps weight %i with every table intact', async (weight) => {
    const woff = new Uint8Array(await readFile(woffFile(weight)))
    const sfnt = await woffToSfnt(woff)
    const view = new DataView(sfnt.buffer)
    const numTables = view.getUint16(4)
    expect(numTables).toBe(new DataView(woff.buffer, woff.byteOffset).getUint16(12))
    for (let i = 0; i < numTables; i++) {
      const at = 12 + i * 16
      const tag = String.fromCharCode(...sfnt.subarray(at, at + 4))
      const table = sfnt.subarray(view.getUint32(at + 8), view.getUint32(at + 8) + view.getUint32(at + 12))
      expect(checksum(table, tag === 'head'), tag).toBe(view.getUint32(at + 4))
    }
    const fromWoff = fontkit.create(woff)
    const fromSfnt = fontkit.create(sfnt)
    expect(fromSfnt.numGlyphs).toBe(fromWoff.numGlyphs)
    expect(fromSfnt.postscriptName).toBe(fromWoff.postscriptName)
  })

  it('refuses bytes that are not WOFF', async () => {
    await expect(woffToSfnt(new Uint8Array(64))).rejects.toThrow('Not a WOFF font.')
  })
})
