// TIFF decoding: files from the test's own TIFF 6.0 writer (tiff-writer.ts), read back exactly;
// compressed and tiled files also decoded by utif (photopea/UTIF.js, an independent decoder)
// for comparison.
import UTIF from 'utif'
import { describe, expect, it } from 'vitest'
import { decodeScan } from '../../../shared/scan/decode'
import { mulberry32 } from '../../../shared/scan/synthetic'
import { writeTiff, type TiffSpec } from './tiff-writer'
import { expectInputError } from './expect-file-error'

function utifBytes(file: Uint8Array): Uint8Array {
  const ab = file.buffer.slice(file.byteOffset, file.byteOffset + file.byteLength) as ArrayBuffer
  const ifds = UTIF.decode(ab)
  UTIF.decodeImage(ab, ifds[0]!)
  return ifds[0]!.data!
}

const rnd = mulberry32(42)
const W = 45, H = 31

// Float32 values including negatives, tiny, huge and subnormal numbers, compared by bit pattern.
const floats = new Float32Array(W * H).map((_, i) => (i % 7 === 0 ? -1 : 1) * Math.fround((rnd() - 0.3) * 10 ** Math.floor(rnd() * 12 - 6)))
floats[0] = 1.4e-45
floats[1] = -3.4028234663852886e38
floats[2] = 0

describe('TIFF decoding', () => {
  for (const littleEndian of [true, false]) {
    it(`reads 32-bit float samples bit-exactly (${littleEndian ? 'II' : 'MM'}, strips of 4 rows)`, () => {
      const file = writeTiff({ width: W, height: H, samples: floats, bits: 32, sampleFormat: 3, littleEndian, rowsPerStrip: 4 })
      const raw = decodeScan(file, { filename: 'z.tiff' })
      expect(raw).toMatchObject({ width: W, height: H, format: 'tiff', bitDepth: 32, sampleType: 'float', valueUnit: 'nm' })
      expect(Array.from(new Uint32Array(raw.data.buffer))).toEqual(Array.from(new Uint32Array(floats.buffer)))
    })
  }

  it('reads 8- and 16-bit unsigned and 16-bit signed samples exactly', () => {
    const u16 = Array.from({ length: W * H }, () => Math.floor(rnd() * 65536))
    const r16 = decodeScan(writeTiff({ width: W, height: H, samples: u16, bits: 16, littleEndian: false }))
    expect(Array.from(r16.data)).toEqual(u16)
    expect(r16.levelRange).toEqual([0, 65535])
    const u8 = u16.map(v => v >> 8)
    expect(Array.from(decodeScan(writeTiff({ width: W, height: H, samples: u8, bits: 8 })).data)).toEqual(u8)
    const s16 = u16.map(v => v - 32768)
    const r = decodeScan(writeTiff({ width: W, height: H, samples: s16.map(v => v & 0xFFFF), bits: 16, sampleFormat: 2 }))
    expect(r.sampleType).toBe('int')
    expect(r.levelRange).toEqual([-32768, 32767])
    expect(Array.from(r.data)).toEqual(s16)
  })

  it('inverts white-is-zero grey (TIFF 6.0 PhotometricInterpretation 0)', () => {
    const v = [0, 10, 200, 255]
    expect(Array.from(decodeScan(writeTiff({ width: 2, height: 2, samples: v, bits: 8, photometric: 0 })).data)).toEqual([255, 245, 55, 0])
  })

  it('takes BT.601 luma of RGB samples', () => {
    const rgb = [10, 20, 30, 200, 100, 0]
    const raw = decodeScan(writeTiff({ width: 2, height: 1, samples: rgb, bits: 8, spp: 3 }))
    expect(raw.reduction).toBe('luma-bt601')
    expect(raw.data[0]).toBe(Math.fround(0.299 * 10 + 0.587 * 20 + 0.114 * 30))
    expect(raw.data[1]).toBe(Math.fround(0.299 * 200 + 0.587 * 100))
  })

  // [label, writer options, also compared with utif]. utif undoes the predictor with the image
  // width instead of the tile width, so tiled files with a predictor are only round-tripped.
  const variants: [string, Partial<TiffSpec>, boolean][] = [
    ['LZW', { compression: 5 }, true],
    ['LZW + horizontal predictor', { compression: 5, predictor: 2 }, true],
    ['Deflate + predictor, big-endian', { compression: 8, predictor: 2, littleEndian: false }, true],
    ['PackBits', { compression: 32773 }, true],
    ['tiles 16 × 16 with partial edge tiles', { tile: { width: 16, height: 16 } }, true],
    ['LZW tiles + predictor', { tile: { width: 16, height: 32 }, compression: 5, predictor: 2 }, false],
  ]
  for (const [label, v, withUtif] of variants) {
    it(`reads 16-bit ${label}${withUtif ? ', as utif does' : ''}`, () => {
      // Smooth data with noise, so LZW tables grow past 9 bits and runs occur for PackBits.
      const samples = Array.from({ length: W * H }, (_, i) => (i % W) * 300 + Math.floor(i / W) * 17 + Math.floor(rnd() * 4))
      const file = writeTiff({ width: W, height: H, samples, bits: 16, rowsPerStrip: 7, ...v })
      const ours = decodeScan(file).data
      expect(Array.from(ours)).toEqual(samples)
      if (!withUtif) return
      const ref = utifBytes(file)
      const theirs = Array.from({ length: W * H }, (_, i) => ref[2 * i]! | (ref[2 * i + 1]! << 8))
      expect(Array.from(ours)).toEqual(theirs)
    })
  }

  it('reads the floating-point predictor (Adobe TIFF Technical Note 3) with Deflate and LZW', () => {
    for (const compression of [5, 8] as const) {
      for (const littleEndian of [true, false]) {
        const file = writeTiff({ width: W, height: H, samples: floats, bits: 32, sampleFormat: 3, predictor: 3, compression, littleEndian, rowsPerStrip: 5 })
        const raw = decodeScan(file)
        expect(Array.from(new Uint32Array(raw.data.buffer))).toEqual(Array.from(new Uint32Array(floats.buffer)))
      }
    }
  })

  it('decodes a long LZW stream that passes the 12-bit table limit (clear codes)', () => {
    const n = 200 * 200
    const samples = Array.from({ length: n }, () => Math.floor(rnd() * 256))
    const file = writeTiff({ width: 200, height: 200, samples, bits: 8, compression: 5 })
    expect(Array.from(decodeScan(file).data)).toEqual(samples)
    expect(Array.from(utifBytes(file).subarray(0, n))).toEqual(samples)
  })
})

describe('TIFF bad input', () => {
  const samples = Array.from({ length: 64 * 64 }, () => Math.floor(rnd() * 256))

  it('rejects a cut-off LZW strip with a message (where utif does not return)', () => {
    const file = writeTiff({ width: 64, height: 64, samples, bits: 8, compression: 5 })
    expectInputError(() => decodeScan(file.subarray(0, Math.floor(file.length * 0.6)), { filename: 'cut.tif' }), /cut\.tif is truncated: strip 0 runs past the end/)
    // The whole file present, but the strip's byte count (StripByteCounts, 9th entry) cut to 60 %:
    // the codes run out before the end-of-information code.
    const short = file.slice()
    const dv = new DataView(short.buffer)
    const count = dv.getUint32(10 + 12 * 8 + 8, true)
    expect(dv.getUint16(10 + 12 * 8, true)).toBe(279)
    dv.setUint32(10 + 12 * 8 + 8, Math.floor(count * 0.6), true)
    expectInputError(() => decodeScan(short), /truncated: strip 0 holds \d+ of its 4096 bytes/)
  })

  it('rejects a 100 000 × 100 000 header before reading pixels', () => {
    const file = writeTiff({ width: 2, height: 2, samples: [1, 2, 3, 4], bits: 8 })
    const dv = new DataView(file.buffer, file.byteOffset)
    // Entries are sorted by tag; 256 and 257 are the first two, values inline at +8.
    dv.setUint32(8 + 2 + 8, 100000, true)
    dv.setUint32(8 + 2 + 12 + 8, 100000, true)
    expectInputError(() => decodeScan(file, { filename: 'huge.tif' }), /huge\.tif is 100000 × 100000 pixels; the largest accepted is 8192 × 8192/)
  })

  it('rejects truncated directories, non-finite floats, BigTIFF and unsupported sample types', () => {
    const file = writeTiff({ width: 4, height: 4, samples: Array(16).fill(1), bits: 8 })
    expectInputError(() => decodeScan(file.subarray(0, 30)), /truncated: its image directory/)
    expectInputError(() => decodeScan(file.subarray(0, 6)), /truncated: it ends inside the TIFF header/)
    const nan = Float32Array.from(Array(16).fill(1))
    nan[6] = Number.NaN
    expectInputError(() => decodeScan(writeTiff({ width: 4, height: 4, samples: nan, bits: 32, sampleFormat: 3 })), /sample at row 1, column 2 is NaN/)
    expectInputError(() => decodeScan(Uint8Array.of(0x49, 0x49, 0x2B, 0, 8, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0)), /BigTIFF/)
    const bits4 = writeTiff({ width: 4, height: 4, samples: Array(16).fill(1), bits: 8 })
    const dv = new DataView(bits4.buffer, bits4.byteOffset)
    dv.setUint16(8 + 2 + 24 + 8, 4, true) // BitsPerSample (third entry) → 4
    expectInputError(() => decodeScan(bits4), /4-bit uint samples/)
  })

  it('rejects a strip list that points past the end of the file', () => {
    const file = writeTiff({ width: 8, height: 8, samples: Array(64).fill(9), bits: 8, rowsPerStrip: 2 })
    expectInputError(() => decodeScan(file.subarray(0, file.length - 3)), /truncated: strip 3 runs past the end of the file/)
  })
})
