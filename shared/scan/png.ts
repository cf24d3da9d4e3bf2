// PNG decoding (ISO/IEC 15948, PNG 2nd ed.): chunk walk with CRC checks, IHDR size check before
// anything is allocated, zlib inflate and the five scanline filters (§9) for the common
// non-interlaced 8/16-bit grey, grey+alpha, RGB and RGBA images straight into Float32. pngjs
// decodes the rest (palette, 1/2/4-bit, Adam7): on a 2048² 16-bit grey file it took 300–500 ms
// and built a 33 MB RGBA Uint16 copy, the direct path 60–85 ms (tests/bench/scan.bench.ts).
// Server-side (node:zlib).
import { inflateSync } from 'node:zlib'
import { PNG } from 'pngjs'
import { InputError } from '../errors'
import { crc32 } from './crc32'
import { checkDecodedBytes, checkImageSize } from './grid'
import { lumaBt601 } from './luma'
import type { RawScan } from './types'

export interface PngHeader { width: number, height: number, bitDepth: number, colorType: number, interlace: number }

const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 }
const DEPTHS: Record<number, number[]> = { 0: [1, 2, 4, 8, 16], 2: [8, 16], 3: [1, 2, 4, 8], 4: [8, 16], 6: [8, 16] }

/** Reads and checks the IHDR chunk (first 33 bytes) only. */
export function readPngHeader(bytes: Uint8Array, name: string, maxSide: number): PngHeader {
  if (bytes.length < 33) throw new InputError('file', `${name} is truncated: it ends inside the PNG header`)
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const type = String.fromCharCode(bytes[12]!, bytes[13]!, bytes[14]!, bytes[15]!)
  if (dv.getUint32(8) !== 13 || type !== 'IHDR') throw new InputError('file', `${name} is corrupt: the PNG does not start with a valid IHDR chunk`)
  if (crc32(bytes, 12, 29) !== dv.getUint32(29)) throw new InputError('file', `${name} is corrupt: the checksum of the PNG header (IHDR) does not match`)
  const width = dv.getUint32(16)
  const height = dv.getUint32(20)
  const [bitDepth, colorType, compression, filter, interlace] = [bytes[24]!, bytes[25]!, bytes[26]!, bytes[27]!, bytes[28]!]
  checkImageSize(name, width, height, maxSide)
  checkDecodedBytes(name, width, height, Math.max(1, (CHANNELS[colorType] ?? 1) * Math.ceil(bitDepth / 8)))
  if (!DEPTHS[colorType]?.includes(bitDepth)) throw new InputError('file', `${name} is corrupt: PNG colour type ${colorType} with bit depth ${bitDepth} does not exist`)
  if (compression !== 0 || filter !== 0 || interlace > 1) throw new InputError('file', `${name} is corrupt: unknown PNG compression, filter or interlace method`)
  return { width, height, bitDepth, colorType, interlace }
}

export function decodePng(bytes: Uint8Array, name: string, maxSide: number): RawScan {
  const hdr = readPngHeader(bytes, name, maxSide)
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const idat: Uint8Array[] = []
  const kept: Uint8Array[] = [bytes.subarray(0, 8)]
  let idatBytes = 0
  let ended = false
  for (let p = 8; p < bytes.length;) {
    if (p + 12 > bytes.length) break
    const len = dv.getUint32(p)
    const type = String.fromCharCode(bytes[p + 4]!, bytes[p + 5]!, bytes[p + 6]!, bytes[p + 7]!)
    if (p + 12 + len > bytes.length) throw new InputError('file', `${name} is truncated: its ${type} chunk runs past the end of the file`)
    if (crc32(bytes, p + 4, p + 8 + len) !== dv.getUint32(p + 8 + len)) throw new InputError('file', `${name} is corrupt: the checksum of its ${type} chunk does not match`)
    if (type === 'IDAT') {
      idat.push(bytes.subarray(p + 8, p + 8 + len))
      idatBytes += len
    }
    // Transparency means nothing for heights and would make pngjs zero the pixels it marks.
    if (type !== 'tRNS') kept.push(bytes.subarray(p, p + 12 + len))
    p += 12 + len
    if (type === 'IEND') {
      ended = true
      break
    }
  }
  if (!ended) throw new InputError('file', `${name} is truncated: the PNG ends before its IEND chunk`)
  if (idatBytes === 0) throw new InputError('file', `${name} is corrupt: the PNG has no image data (IDAT)`)
  const { width, height, bitDepth, colorType, interlace } = hdr
  const direct = interlace === 0 && bitDepth >= 8 && colorType !== 3
  const out = direct ? decodeDirect(concat(idat, idatBytes), hdr, name) : decodeWithPngjs(concat(kept), hdr, name)
  return {
    width, height, data: out.data, format: 'png',
    bitDepth: colorType === 3 ? 8 : bitDepth, sampleType: 'uint', valueUnit: 'level',
    reduction: out.luma ? 'luma-bt601' : 'none',
    levelRange: [0, colorType === 3 ? 255 : 2 ** bitDepth - 1],
  }
}

function concat(parts: Uint8Array[], total = parts.reduce((s, p) => s + p.length, 0)): Uint8Array {
  const out = new Uint8Array(total)
  let o = 0
  for (const p of parts) {
    out.set(p, o)
    o += p.length
  }
  return out
}

function decodeDirect(compressed: Uint8Array, hdr: PngHeader, name: string): { data: Float32Array, luma: boolean } {
  const { width: w, height: h, bitDepth, colorType } = hdr
  const channels = CHANNELS[colorType]!
  const bpp = channels * (bitDepth / 8)
  const rowBytes = w * bpp
  const expected = h * (rowBytes + 1)
  let raw: Uint8Array
  try {
    raw = inflateSync(compressed, { maxOutputLength: expected })
  }
  catch (e) {
    const code = (e as { code?: string }).code
    if (code === 'ERR_BUFFER_TOO_LARGE') throw new InputError('file', `${name} is corrupt: its image data are larger than the header's ${w} × ${h} pixels`)
    if (code === 'Z_BUF_ERROR') throw new InputError('file', `${name} is truncated: its compressed image data end early`)
    throw new InputError('file', `${name} is corrupt: its compressed image data cannot be read (${(e as Error).message})`)
  }
  if (raw.length < expected) throw new InputError('file', `${name} is truncated: it holds ${Math.floor(raw.length / (rowBytes + 1))} of ${h} image rows`)
  const data = new Float32Array(w * h)
  const luma = channels >= 3
  for (let r = 0; r < h; r++) {
    const p = r * (rowBytes + 1)
    const filter = raw[p]!
    if (filter > 4) throw new InputError('file', `${name} is corrupt: row ${r} has unknown filter type ${filter}`)
    unfilter(raw, p + 1, r === 0 ? -1 : p + 1 - (rowBytes + 1), rowBytes, bpp, filter)
    const o = r * w
    for (let c = 0; c < w; c++) {
      const q = p + 1 + c * bpp
      if (bitDepth === 8) {
        data[o + c] = luma ? lumaBt601(raw[q]!, raw[q + 1]!, raw[q + 2]!) : raw[q]!
      }
      else {
        const v0 = (raw[q]! << 8) | raw[q + 1]!
        data[o + c] = luma ? lumaBt601(v0, (raw[q + 2]! << 8) | raw[q + 3]!, (raw[q + 4]! << 8) | raw[q + 5]!) : v0
      }
    }
  }
  return { data, luma }
}

// Reverses one scanline filter in place (PNG §9.2); prev = −1 for the first row (all zero).
function unfilter(b: Uint8Array, cur: number, prev: number, n: number, bpp: number, filter: number) {
  switch (filter) {
    case 1:
      for (let i = bpp; i < n; i++) b[cur + i] = (b[cur + i]! + b[cur + i - bpp]!) & 0xFF
      break
    case 2:
      if (prev >= 0) for (let i = 0; i < n; i++) b[cur + i] = (b[cur + i]! + b[prev + i]!) & 0xFF
      break
    case 3:
      for (let i = 0; i < n; i++) {
        const left = i >= bpp ? b[cur + i - bpp]! : 0
        const up = prev >= 0 ? b[prev + i]! : 0
        b[cur + i] = (b[cur + i]! + ((left + up) >> 1)) & 0xFF
      }
      break
    case 4:
      for (let i = 0; i < n; i++) {
        const a = i >= bpp ? b[cur + i - bpp]! : 0
        const up = prev >= 0 ? b[prev + i]! : 0
        const c = i >= bpp && prev >= 0 ? b[prev + i - bpp]! : 0
        const pa = Math.abs(up - c), pb = Math.abs(a - c), pc = Math.abs(a + up - 2 * c)
        const pred = pa <= pb && pa <= pc ? a : pb <= pc ? up : c
        b[cur + i] = (b[cur + i]! + pred) & 0xFF
      }
      break
  }
}

function decodeWithPngjs(file: Uint8Array, hdr: PngHeader, name: string): { data: Float32Array, luma: boolean } {
  let png: { width: number, height: number, data: ArrayLike<number> }
  try {
    png = PNG.sync.read(Buffer.from(file.buffer, file.byteOffset, file.byteLength), { skipRescale: true })
  }
  catch (e) {
    throw new InputError('file', `${name} is corrupt: ${(e as Error).message}`)
  }
  const n = hdr.width * hdr.height
  if (png.width !== hdr.width || png.height !== hdr.height || png.data.length < 4 * n) throw new InputError('file', `${name} is corrupt: its image data do not match its header`)
  const data = new Float32Array(n)
  // pngjs returns RGBA; grey files have R = G = B, palette files are reduced only if coloured.
  let luma = false
  const src = png.data
  for (let i = 0; i < n; i++) {
    const r = src[4 * i]!, g = src[4 * i + 1]!, b = src[4 * i + 2]!
    if (r !== g || g !== b) luma = true
    data[i] = r
  }
  if (luma) for (let i = 0; i < n; i++) data[i] = lumaBt601(src[4 * i]!, src[4 * i + 1]!, src[4 * i + 2]!)
  return { data, luma }
}
