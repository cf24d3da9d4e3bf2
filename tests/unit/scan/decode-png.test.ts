// PNG decoding, checked against files written and read by pngjs (an independent PNG library)
// and hand-built files that follow the PNG specification (ISO/IEC 15948).
import { crc32 as zlibCrc32 } from 'node:zlib'
import { PNG } from 'pngjs'
import { describe, expect, it } from 'vitest'
import { InputError } from '../../../shared/errors'
import { crc32 } from '../../../shared/scan/crc32'
import { decodeScan } from '../../../shared/scan/decode'
import { mulberry32 } from '../../../shared/scan/synthetic'
import { chunk, concat, ihdr, pngFromScanlines, SIGNATURE } from './png-craft'
import { writeTiff } from './tiff-writer'

type PngOpts = { colorType: 0 | 2 | 4 | 6, bitDepth: 8 | 16, filterType?: number }
const CHANNELS = { 0: 1, 2: 3, 4: 2, 6: 4 } as const

function writePng(w: number, h: number, samples: ArrayLike<number>, o: PngOpts): Uint8Array {
  const ch = CHANNELS[o.colorType]
  const buf = o.bitDepth === 16 ? Buffer.from(Uint16Array.from(samples).buffer) : Buffer.from(Uint8Array.from(samples))
  const png = new PNG({ width: w, height: h, colorType: o.colorType, inputColorType: o.colorType, bitDepth: o.bitDepth, inputHasAlpha: ch === 2 || ch === 4 })
  png.data = buf
  return new Uint8Array(PNG.sync.write(png, { colorType: o.colorType, inputColorType: o.colorType, bitDepth: o.bitDepth, inputHasAlpha: ch === 2 || ch === 4, filterType: o.filterType ?? -1 }))
}

function randomSamples(n: number, max: number, seed: number): number[] {
  const rnd = mulberry32(seed)
  return Array.from({ length: n }, () => Math.floor(rnd() * (max + 1)))
}

function expectInputError(fn: () => unknown, field: string, message: RegExp) {
  try {
    fn()
  }
  catch (e) {
    expect(e).toBeInstanceOf(InputError)
    expect((e as InputError).field).toBe(field)
    expect((e as InputError).message).toMatch(message)
    return
  }
  throw new Error('expected an InputError')
}

describe('PNG decoding', () => {
  it('reads a 16-bit grey PNG written by pngjs back exactly', () => {
    const w = 37, h = 23
    const src = randomSamples(w * h, 65535, 1)
    src[0] = 0
    src[1] = 65535
    const raw = decodeScan(writePng(w, h, src, { colorType: 0, bitDepth: 16 }), { filename: 'height.png' })
    expect(raw).toMatchObject({ width: w, height: h, format: 'png', bitDepth: 16, sampleType: 'uint', valueUnit: 'level', reduction: 'none', levelRange: [0, 65535] })
    expect(Array.from(raw.data)).toEqual(src)
  })

  it('reads an 8-bit grey PNG exactly, row 0 at the top', () => {
    const w = 5, h = 3
    const src = [0, 1, 2, 3, 4, 10, 11, 12, 13, 14, 250, 251, 252, 253, 255]
    const raw = decodeScan(writePng(w, h, src, { colorType: 0, bitDepth: 8 }))
    expect(raw.bitDepth).toBe(8)
    expect(Array.from(raw.data)).toEqual(src)
  })

  it('undoes each of the five scanline filters (PNG §9.2), 8 and 16 bit', () => {
    for (const bitDepth of [8, 16] as const) {
      for (const filterType of [0, 1, 2, 3, 4]) {
        const w = 19, h = 11
        const src = randomSamples(w * h * 3, bitDepth === 8 ? 255 : 65535, 10 + filterType)
        const file = writePng(w, h, src, { colorType: 2, bitDepth, filterType })
        // pngjs, an independent decoder, reads the same file; luma of its RGB is the reference.
        const ref = PNG.sync.read(Buffer.from(file), { skipRescale: true })
        const raw = decodeScan(file)
        expect(raw.reduction).toBe('luma-bt601')
        for (let i = 0; i < w * h; i++) {
          const want = Math.fround(0.299 * ref.data[4 * i]! + 0.587 * ref.data[4 * i + 1]! + 0.114 * ref.data[4 * i + 2]!)
          expect(raw.data[i]).toBe(want)
        }
        // And pngjs's own decode equals the samples that went in.
        expect(Array.from({ length: w * h * 3 }, (_, k) => ref.data[4 * Math.floor(k / 3) + (k % 3)])).toEqual(src)
      }
    }
  })

  it('grey stored as RGB or RGBA comes back as the grey value; alpha is ignored', () => {
    const w = 8, h = 4
    const grey = randomSamples(w * h, 65535, 3)
    const rgba = grey.flatMap((g, i) => [g, g, g, (i * 977) % 65536])
    expect(Array.from(decodeScan(writePng(w, h, rgba, { colorType: 6, bitDepth: 16 })).data)).toEqual(grey)
    const ga = grey.flatMap(g => [g >> 8, 7])
    expect(Array.from(decodeScan(writePng(w, h, ga, { colorType: 4, bitDepth: 8 })).data)).toEqual(grey.map(g => g >> 8))
  })

  it('reads 4-bit grey and palette PNGs through pngjs', () => {
    // 4-bit grey, 3 × 2: two pixels per byte, high nibble first (PNG §7.2).
    const grey4 = pngFromScanlines(3, 2, 4, 0, Uint8Array.of(0, 0x1F, 0x80, 0, 0x23, 0x40))
    const g = decodeScan(grey4)
    expect(Array.from(g.data)).toEqual([1, 15, 8, 2, 3, 4])
    expect(g.levelRange).toEqual([0, 15])
    // Palette of grey entries 0, 100, 200: indices map to those levels.
    const plte = chunk('PLTE', Uint8Array.of(0, 0, 0, 100, 100, 100, 200, 200, 200))
    const pal = decodeScan(pngFromScanlines(3, 1, 8, 3, Uint8Array.of(0, 2, 0, 1), [plte]))
    expect(Array.from(pal.data)).toEqual([200, 0, 100])
    expect(pal.reduction).toBe('none')
  })

  it('computes PNG chunk CRCs like zlib.crc32', () => {
    const bytes = Uint8Array.from(randomSamples(5000, 255, 4))
    expect(crc32(bytes)).toBe(zlibCrc32(bytes))
    expect(crc32(bytes, 17, 4000)).toBe(zlibCrc32(bytes.subarray(17, 4000)))
  })
})

describe('PNG bad input', () => {
  const good = writePng(16, 16, randomSamples(256, 255, 5), { colorType: 0, bitDepth: 8 })

  it('rejects a 100 000 × 100 000 header from the header alone', () => {
    // Valid signature and IHDR with a correct CRC, and no image data at all: the size check
    // must fire before anything else is read or allocated.
    const huge = concat(SIGNATURE, ihdr(100000, 100000, 16, 0))
    expectInputError(() => decodeScan(huge, { filename: 'huge.png' }), 'file', /huge\.png is 100000 × 100000 pixels; the largest accepted is 8192 × 8192/)
  })

  it('rejects from the header a size whose decoded samples would pass 256 MiB', () => {
    // 8192² × 16-bit RGBA = 537 MB of samples; grey 16-bit at the same size (134 MB) is allowed.
    expectInputError(() => decodeScan(concat(SIGNATURE, ihdr(8192, 8192, 16, 6))), 'file', /too large to decode: 8192 × 8192 pixels of 8 bytes exceed 256 MiB/)
    expectInputError(() => decodeScan(concat(SIGNATURE, ihdr(8192, 8192, 16, 0))), 'file', /truncated: the PNG ends before its IEND chunk/)
  })

  it('rejects zero size', () => {
    expectInputError(() => decodeScan(concat(SIGNATURE, ihdr(0, 5, 8, 0))), 'file', /zero size \(0 × 5/)
  })

  it('rejects a truncated file', () => {
    expectInputError(() => decodeScan(good.subarray(0, Math.floor(good.length / 2)), { filename: 'cut.png' }), 'file', /cut\.png is truncated/)
    expectInputError(() => decodeScan(good.subarray(0, 20)), 'file', /truncated/)
  })

  it('rejects a corrupted chunk (CRC mismatch) and corrupt compressed data with valid CRCs', () => {
    const bad = good.slice()
    bad[bad.length - 20]! ^= 0xFF
    expectInputError(() => decodeScan(bad), 'file', /corrupt: the checksum of its IDAT chunk does not match/)
    const garbage = pngFromScanlines(4, 4, 8, 0, new Uint8Array(0))
    expectInputError(() => decodeScan(garbage), 'file', /truncated|corrupt/)
    const notZlib = concat(SIGNATURE, ihdr(4, 4, 8, 0), chunk('IDAT', Uint8Array.of(1, 2, 3, 4, 5, 6, 7, 8)), chunk('IEND', new Uint8Array(0)))
    expectInputError(() => decodeScan(notZlib), 'file', /corrupt: its compressed image data cannot be read/)
  })

  it('rejects an unknown filter type byte', () => {
    const bad = pngFromScanlines(2, 1, 8, 0, Uint8Array.of(7, 1, 2))
    expectInputError(() => decodeScan(bad), 'file', /row 0 has unknown filter type 7/)
  })

  it('rejects a file whose extension claims PNG but whose bytes are another format', () => {
    const tiff = writeTiff({ width: 2, height: 2, samples: [1, 2, 3, 4], bits: 8 })
    expectInputError(() => decodeScan(tiff, { filename: 'file.png' }), 'file', /^file\.png is not a PNG: its content is a TIFF image$/)
    expectInputError(() => decodeScan(good, { filename: 'scan.tif' }), 'file', /^scan\.tif is not a TIFF: its content is a PNG image$/)
    expectInputError(() => decodeScan(Uint8Array.of(0, 1, 2, 3, 255), { filename: 'x.png' }), 'file', /x\.png is not a PNG: its content matches no format/)
  })

  it('rejects an empty upload and unknown bytes', () => {
    expectInputError(() => decodeScan(new Uint8Array(0), { filename: 'empty.png' }), 'file', /empty\.png is empty \(0 bytes\)/)
    expectInputError(() => decodeScan(Uint8Array.of(0, 1, 2, 3, 255, 254)), 'file', /not a PNG, TIFF, JPEG or numeric text grid/)
  })
})
