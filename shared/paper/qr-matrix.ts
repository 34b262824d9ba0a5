import QRCode from 'qrcode'

// The dark modules of a QR code (ISO/IEC 18004), from the qrcode package, for drawing as
// rectangles in a PDF or pixels in a picture. Error correction M (15 %) survives a dusty,
// scuffed print; the quiet zone of 4 modules around it is the standard's minimum.

export const QR_QUIET_ZONE = 4

export interface QrMatrix { size: number, dark: (row: number, col: number) => boolean }

export function qrMatrix(text: string): QrMatrix {
  const qr = QRCode.create(text, { errorCorrectionLevel: 'M' })
  const { size, data } = qr.modules
  return { size, dark: (row, col) => data[row * size + col] === 1 }
}
