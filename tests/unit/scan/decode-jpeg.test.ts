// JPEG decoding: baseline files encoded by jpeg-js in the test (an independent encoder); JPEG is
// lossy, so values are compared with the source within a tolerance and dimensions exactly.
import jpeg from 'jpeg-js'
import { describe, expect, it } from 'vitest'
import { decodeScan } from '../../../shared/scan/decode'
import { expectInputError } from './expect-file-error'

function encodeGrey(w: number, h: number, level: (c: number, r: number) => number, quality = 95): Uint8Array {
  const data = new Uint8Array(w * h * 4)
  for (let r = 0; r < h; r++) {
    for (let c = 0; c < w; c++) {
      const v = level(c, r)
      data.set([v, v, v, 255], 4 * (r * w + c))
    }
  }
  return new Uint8Array(jpeg.encode({ width: w, height: h, data }, quality).data)
}

describe('JPEG decoding', () => {
  const w = 80, h = 56
  const level = (c: number, r: number) => Math.round(20 + 2 * c + r)
  const file = encodeGrey(w, h, level)

  it('reads dimensions exactly and grey levels within JPEG loss', () => {
    const raw = decodeScan(file, { filename: 'scan.jpg' })
    expect(raw).toMatchObject({ width: w, height: h, format: 'jpeg', bitDepth: 8, sampleType: 'uint', valueUnit: 'level', levelRange: [0, 255] })
    let sum = 0, worst = 0
    for (let r = 0; r < h; r++) {
      for (let c = 0; c < w; c++) {
        const err = Math.abs(raw.data[r * w + c]! - level(c, r))
        sum += err
        worst = Math.max(worst, err)
      }
    }
    // A smooth ramp at quality 95: errors of a level or two (8 × 8 DCT quantisation).
    expect(sum / (w * h)).toBeLessThan(1.5)
    expect(worst).toBeLessThan(8)
    // Row 0 is the top: the ramp rises downwards by one level per row.
    expect(raw.data[(h - 1) * w]! - raw.data[0]!).toBeGreaterThan(h - 8)
  })

  it('rejects a huge frame header before decoding', () => {
    const big = file.slice()
    const sof = big.findIndex((b, i) => b === 0xFF && big[i + 1] === 0xC0)
    expect(sof).toBeGreaterThan(0)
    big.set([0xFF, 0xFF, 0xFF, 0xFF], sof + 5) // height, width = 65535
    expectInputError(() => decodeScan(big, { filename: 'big.jpeg' }), /big\.jpeg is 65535 × 65535 pixels; the largest accepted is 8192 × 8192/)
  })

  it('rejects a truncated JPEG and a PNG named .jpg', () => {
    expectInputError(() => decodeScan(file.subarray(0, Math.floor(file.length * 0.7)), { filename: 'cut.jpg' }), /cut\.jpg is truncated/)
    expectInputError(() => decodeScan(file.subarray(0, 40)), /truncated/)
    const png = Uint8Array.of(0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 13)
    expectInputError(() => decodeScan(png, { filename: 'photo.jpg' }), /^photo\.jpg is not a JPEG: its content is a PNG image$/)
  })
})
