import { describe, expect, it } from 'vitest'
import jsQR from 'jsqr'
import { machineTagUrl, readScannedCode } from '../../../shared/paper/tag-url'
import { qrMatrix, QR_QUIET_ZONE } from '../../../shared/paper/qr-matrix'

// Machine tag addresses (issue 17) and the tag's QR code, decoded by jsQR, a decoder
// independent of the qrcode encoder (ISO/IEC 18004).

const here = { origin: 'https://jogwise.shop.example', shopId: 7 }

describe('machine tag addresses', () => {
  it.each([
    [machineTagUrl(here.origin, 7, 12), { kind: 'machine', machineId: 12 }],
    [`${here.origin}/tag/7/12/`, { kind: 'machine', machineId: 12 }],
    [machineTagUrl(here.origin, 8, 12), { kind: 'other-shop' }],
    [machineTagUrl('https://other.example', 7, 12), { kind: 'other-shop' }],
    [`${here.origin}/library/5`, { kind: 'procedure', procedureId: 5 }],
    ['https://example.org/some/page', { kind: 'not-jogwise' }],
    ['WIFI:T:WPA;S:shop;P:secret;;', { kind: 'not-jogwise' }],
    ['4006381333931', { kind: 'not-jogwise' }],
    [`${here.origin}/tag/7/abc`, { kind: 'not-jogwise' }],
  ])('%s', (text, expected) => {
    expect(readScannedCode(text, here)).toEqual(expected)
  })
})

describe('the tag\'s QR code', () => {
  it('decodes to the machine\'s tag address', () => {
    const url = machineTagUrl(here.origin, 7, 12)
    const m = qrMatrix(url)
    const px = 5
    const dim = (m.size + 2 * QR_QUIET_ZONE) * px
    const data = new Uint8ClampedArray(dim * dim * 4).fill(255)
    for (let y = 0; y < dim; y++) {
      for (let x = 0; x < dim; x++) {
        const r = Math.floor(y / px) - QR_QUIET_ZONE
        const c = Math.floor(x / px) - QR_QUIET_ZONE
        if (r >= 0 && c >= 0 && r < m.size && c < m.size && m.dark(r, c)) data.fill(0, (y * dim + x) * 4, (y * dim + x) * 4 + 3)
      }
    }
    expect(jsQR(data, dim, dim)?.data).toBe(url)
  })
})
