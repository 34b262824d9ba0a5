import { crc32, deflateSync } from 'node:zlib'

// Small real images built byte by byte from their format's own rules, shared by the API, S3
// and browser tests, so no test depends on a picture file or an image library.

type Rgb = [number, number, number]

/**
 * An RGB PNG by the W3C PNG specification: the 8-byte signature, then IHDR, IDAT (zlib-deflated
 * scanlines, each led by filter type 0) and IEND chunks, each with its length and a CRC-32 over
 * type and data (ISO 3309 / ITU-T V.42 polynomial, node's zlib.crc32). `pixel` paints it; the
 * default is a seeded gradient, so different seeds give different bytes.
 */
export function makePng(width: number, height: number, paint: number | ((x: number, y: number) => Rgb) = 0) {
  const pixel = typeof paint === 'function'
    ? paint
    : (x: number, y: number): Rgb => [0, 1, 2].map(c => ((x * 3 + c) * 37 + y * 11 + paint) & 0xFF) as Rgb
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data])
    const out = Buffer.alloc(12 + data.length)
    out.writeUInt32BE(data.length, 0)
    body.copy(out, 4)
    out.writeUInt32BE(crc32(body), 8 + data.length)
    return out
  }
  const ihdr = Buffer.alloc(13)
  ihdr.writeUInt32BE(width, 0)
  ihdr.writeUInt32BE(height, 4)
  ihdr[8] = 8 // bit depth
  ihdr[9] = 2 // colour type: truecolour
  const stride = 1 + width * 3
  const rows = Buffer.alloc(height * stride)
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) rows.set(pixel(x, y), y * stride + 1 + x * 3)
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(rows)),
    chunk('IEND', Buffer.alloc(0)),
  ])
}

/** The chunks of a PNG, each with whether its stored CRC-32 matches (W3C PNG specification, 5.3). */
export function pngChunks(bytes: Buffer) {
  const out: { type: string, data: Buffer, crcOk: boolean }[] = []
  for (let at = 8; at < bytes.length;) {
    const length = bytes.readUInt32BE(at)
    const type = bytes.subarray(at + 4, at + 8).toString('ascii')
    const data = bytes.subarray(at + 8, at + 8 + length)
    out.push({ type, data, crcOk: bytes.readUInt32BE(at + 8 + length) === crc32(bytes.subarray(at + 4, at + 8 + length)) })
    at += 12 + length
  }
  return out
}

/**
 * A mid-grey baseline JPEG by ITU-T T.81: SOI, a JFIF APP0 segment, one quantisation table,
 * a one-component SOF0 frame, one DC and one AC Huffman table each holding a single one-bit
 * code (DC difference category 0, AC end-of-block), and a scan of two bits per 8×8 block,
 * padded with 1-bits (T.81 F.1.2.3), then EOI. Every block decodes to level 128.
 */
export function makeJpeg(width: number, height: number) {
  const segment = (marker: number, data: number[]) => Buffer.from([0xFF, marker, (data.length + 2) >> 8, (data.length + 2) & 0xFF, ...data])
  const u16 = (n: number) => [n >> 8, n & 0xFF]
  const blocks = Math.ceil(width / 8) * Math.ceil(height / 8)
  const scan = Buffer.alloc(Math.ceil(blocks * 2 / 8), 0)
  // Bits 0 and 0 per block, so only the padding after the last block is set.
  const usedBits = blocks * 2
  for (let bit = usedBits; bit < scan.length * 8; bit++) scan[bit >> 3] = scan[bit >> 3]! | (0x80 >> (bit & 7))
  const oneCodeTable = (classAndId: number) => [classAndId, 1, ...Array(15).fill(0), 0x00]
  return Buffer.concat([
    Buffer.from([0xFF, 0xD8]),
    segment(0xE0, [...Buffer.from('JFIF\0', 'latin1'), 1, 1, 0, ...u16(1), ...u16(1), 0, 0]),
    segment(0xDB, [0x00, ...Array(64).fill(1)]),
    segment(0xC0, [8, ...u16(height), ...u16(width), 1, 1, 0x11, 0]),
    segment(0xC4, oneCodeTable(0x00)),
    segment(0xC4, oneCodeTable(0x10)),
    segment(0xDA, [1, 1, 0x00, 0, 63, 0]),
    scan,
    Buffer.from([0xFF, 0xD9]),
  ])
}

/**
 * Width and height from a JPEG's start-of-frame segment (ITU-T T.81, B.2.2: SOF0–SOF2).
 */
export function jpegSize(bytes: Buffer) {
  for (let at = 2; at < bytes.length;) {
    if (bytes[at] !== 0xFF) throw new Error(`no marker at ${at}`)
    const marker = bytes[at + 1]!
    const length = bytes.readUInt16BE(at + 2)
    if (marker >= 0xC0 && marker <= 0xC2) return { height: bytes.readUInt16BE(at + 5), width: bytes.readUInt16BE(at + 7) }
    at += 2 + length
  }
  throw new Error('no start-of-frame segment')
}

// A 1×1 lossless WebP, the sample widely used by browser feature checks (from memory): a RIFF
// container of form type WEBP with one VP8L chunk (RFC 9649).
export const WEBP_1PX = Buffer.from('UklGRhoAAABXRUJQVlA4TA0AAAAvAAAAEAcQERGIiP4HAA==', 'base64')
