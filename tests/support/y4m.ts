import { writeFile } from 'node:fs/promises'
import { qrMatrix, QR_QUIET_ZONE } from '../../shared/paper/qr-matrix'

// A small YUV4MPEG2 (Y4M) writer for Chromium's fake camera (--use-file-for-fake-video-capture).
// Format as the mjpegtools yuv4mpeg(5) manual page gives it, from memory: a text header
// "YUV4MPEG2 W<w> H<h> F<num>:<den> Ip A1:1 C420jpeg", then per frame "FRAME\n" and the
// planes Y (w×h), U and V (w/2 × h/2 each), 8 bits per sample.

export async function writeY4m(file: string, width: number, height: number, luma: (x: number, y: number) => number, frames = 5) {
  const header = Buffer.from(`YUV4MPEG2 W${width} H${height} F10:1 Ip A1:1 C420jpeg\n`, 'ascii')
  const y = Buffer.alloc(width * height)
  for (let j = 0; j < height; j++) for (let i = 0; i < width; i++) y[j * width + i] = luma(i, j)
  // No colour: both chroma planes at the middle value.
  const chroma = Buffer.alloc((width / 2) * (height / 2) * 2, 128)
  const frame = Buffer.concat([Buffer.from('FRAME\n', 'ascii'), y, chroma])
  await writeFile(file, Buffer.concat([header, ...Array.from({ length: frames }, () => frame)]))
}

/** A video of a printed QR code (black on white, centred) that reads as `text`. */
export async function writeQrVideo(file: string, text: string, width = 640, height = 480) {
  const m = qrMatrix(text)
  const side = m.size + 2 * QR_QUIET_ZONE
  const px = Math.floor(Math.min(width, height) * 0.9 / side)
  const left = Math.floor((width - side * px) / 2)
  const top = Math.floor((height - side * px) / 2)
  await writeY4m(file, width, height, (x, y) => {
    const c = Math.floor((x - left) / px) - QR_QUIET_ZONE
    const r = Math.floor((y - top) / px) - QR_QUIET_ZONE
    // Studio-swing luma (ITU-R BT.601): black 16, white 235.
    return r >= 0 && c >= 0 && r < m.size && c < m.size && m.dark(r, c) ? 16 : 235
  })
}
