// Draws Jogwise's app icons (our own mark: three steps rising to a check dot) as PNG files,
// with no image library: shapes are filled into an RGBA buffer and written with node's zlib.
// Run once with `node scripts/make-icons.mjs`; the PNGs in public/icons are committed.
import { writeFileSync, mkdirSync } from 'node:fs'
import { deflateSync } from 'node:zlib'

const BG = [20, 32, 28, 255]
const STEP = [242, 240, 232, 255]
const DOT = [52, 190, 130, 255]

function crc32(buf) {
  let c, crc = 0xffffffff
  for (let n = 0; n < buf.length; n++) {
    c = (crc ^ buf[n]) & 0xff
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1
    crc = (crc >>> 8) ^ c
  }
  return (crc ^ 0xffffffff) >>> 0
}
function chunk(type, data) {
  const len = Buffer.alloc(4); len.writeUInt32BE(data.length)
  const td = Buffer.concat([Buffer.from(type), data])
  const crc = Buffer.alloc(4); crc.writeUInt32BE(crc32(td))
  return Buffer.concat([len, td, crc])
}
function png(size, px) {
  const raw = Buffer.alloc(size * (size * 4 + 1))
  for (let y = 0; y < size; y++) {
    raw[y * (size * 4 + 1)] = 0
    px.copy(raw, y * (size * 4 + 1) + 1, y * size * 4, (y + 1) * size * 4)
  }
  const ihdr = Buffer.alloc(13)
  ihdr.writeUInt32BE(size, 0); ihdr.writeUInt32BE(size, 4)
  ihdr[8] = 8; ihdr[9] = 6; ihdr[10] = 0; ihdr[11] = 0; ihdr[12] = 0
  return Buffer.concat([Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw)), chunk('IEND', Buffer.alloc(0))])
}
function draw(size, { rounded, safe }) {
  const px = Buffer.alloc(size * size * 4)
  const r = rounded ? size * 0.18 : 0
  const set = (x, y, c) => { const i = (y * size + x) * 4; px[i] = c[0]; px[i + 1] = c[1]; px[i + 2] = c[2]; px[i + 3] = c[3] }
  for (let y = 0; y < size; y++) for (let x = 0; x < size; x++) {
    const dx = Math.max(r - x, 0, x - (size - 1 - r)), dy = Math.max(r - y, 0, y - (size - 1 - r))
    if (dx * dx + dy * dy <= r * r || r === 0) set(x, y, BG)
  }
  // The mark sits in the central `safe` fraction (maskable icons keep it inside 80 %).
  const m = size * (1 - safe) / 2, w = size * safe
  const rect = (x0, y0, x1, y1, c) => { for (let y = Math.round(m + y0 * w); y < Math.round(m + y1 * w); y++) for (let x = Math.round(m + x0 * w); x < Math.round(m + x1 * w); x++) set(x, y, c) }
  rect(0.12, 0.70, 0.40, 0.84, STEP)
  rect(0.36, 0.50, 0.64, 0.64, STEP)
  rect(0.60, 0.30, 0.88, 0.44, STEP)
  const cx = m + 0.74 * w, cy = m + 0.16 * w, cr = 0.09 * w
  for (let y = Math.floor(cy - cr); y <= cy + cr; y++) for (let x = Math.floor(cx - cr); x <= cx + cr; x++) if ((x - cx) ** 2 + (y - cy) ** 2 <= cr * cr) set(x, y, DOT)
  return png(size, px)
}
const out = new URL('../public/icons/', import.meta.url).pathname
mkdirSync(out, { recursive: true })
writeFileSync(out + 'jogwise-192.png', draw(192, { rounded: true, safe: 0.8 }))
writeFileSync(out + 'jogwise-512.png', draw(512, { rounded: true, safe: 0.8 }))
writeFileSync(out + 'jogwise-maskable-512.png', draw(512, { rounded: false, safe: 0.62 }))
writeFileSync(out + 'apple-touch-icon-180.png', draw(180, { rounded: false, safe: 0.7 }))
console.log('icons written to public/icons')
