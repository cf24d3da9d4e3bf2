// TIFF decoding (TIFF 6.0 with the SampleFormat tag of §19): grey or RGB(A), 8/16/32-bit
// unsigned or signed integer and 32-bit IEEE float samples, strips or tiles, uncompressed,
// LZW, PackBits or Deflate (Adobe's zlib compression, codes 8 and 32946), predictors 1–3.
// The directory is read by tiff-ifd.ts and the pixels by our own bounded codecs rather than by
// utif: utif.decodeImage on a 256² LZW file cut at 60 % had not returned after 20 s (it reads
// past the end as zero codes and never meets the end code), and utif.decode follows directory
// counts without bounds. utif stays the tests' independent reference decoder. Server-side.
import { inflateSync } from 'node:zlib'
import { InputError } from '../errors'
import { checkDecodedBytes, checkImageSize } from './grid'
import { lumaBt601 } from './luma'
import { lzwDecode, packBitsDecode, undoPredictor } from './tiff-codecs'
import { readTiffInfo, type TiffInfo } from './tiff-ifd'
import type { RawScan } from './types'

const COMPRESSION: Record<number, string> = { 1: 'none', 5: 'LZW', 8: 'Deflate', 32946: 'Deflate', 32773: 'PackBits' }

export function decodeTiff(bytes: Uint8Array, name: string, maxSide: number): RawScan {
  const t = readTiffInfo(bytes, name)
  checkImageSize(name, t.width, t.height, maxSide)
  const bits = t.bitsPerSample[0]!
  const spp = t.samplesPerPixel
  const sampleType = t.sampleFormat === 3 ? 'float' : t.sampleFormat === 2 ? 'int' : t.sampleFormat === 1 ? 'uint' : null
  if (!sampleType) throw new InputError('file', `${name} uses TIFF sample format ${t.sampleFormat}, which Tessera does not read`)
  if (t.bitsPerSample.some(b => b !== bits) || t.bitsPerSample.length !== spp) throw new InputError('file', `${name} is corrupt: BitsPerSample does not match SamplesPerPixel`)
  if (sampleType === 'float' ? bits !== 32 : bits !== 8 && bits !== 16 && bits !== 32) {
    throw new InputError('file', `${name} has ${bits}-bit ${sampleType} samples; Tessera reads 8/16/32-bit integers and 32-bit floats`)
  }
  if (!COMPRESSION[t.compression]) throw new InputError('file', `${name} uses TIFF compression ${t.compression}, which Tessera does not read (use none, LZW, Deflate or PackBits)`)
  if (t.photometric > 2) throw new InputError('file', `${name} is a palette or colour-space TIFF (photometric ${t.photometric}); save heights as grey`)
  if (t.photometric === 2 ? spp < 3 : spp < 1) throw new InputError('file', `${name} is corrupt: ${spp} samples per pixel for photometric ${t.photometric}`)
  if (t.photometric === 0 && sampleType !== 'uint') throw new InputError('file', `${name}: white-is-zero grey is only read for unsigned samples`)
  if (spp > 1 && t.planar !== 1) throw new InputError('file', `${name} stores colour planes separately (PlanarConfiguration 2), which Tessera does not read`)
  if (t.predictor < 1 || t.predictor > 3 || (t.predictor === 3 && sampleType !== 'float') || (t.predictor === 2 && sampleType === 'float')) {
    throw new InputError('file', `${name} uses TIFF predictor ${t.predictor} with ${sampleType} samples, which is not defined`)
  }
  const bytesPer = bits / 8
  const pixelBytes = spp * bytesPer
  checkDecodedBytes(name, t.width, t.height, pixelBytes)
  const image = new Uint8Array(t.width * t.height * pixelBytes)
  if (t.tile) readTiles(bytes, t, image, pixelBytes, bytesPer, name)
  else readStrips(bytes, t, image, pixelBytes, bytesPer, name)
  const data = toSamples(image, t, sampleType, bytesPer, name)
  const levelRange: [number, number] | undefined = sampleType === 'uint' ? [0, 2 ** bits - 1] : sampleType === 'int' ? [-(2 ** (bits - 1)), 2 ** (bits - 1) - 1] : undefined
  return {
    width: t.width, height: t.height, data, format: 'tiff', bitDepth: bits, sampleType,
    valueUnit: sampleType === 'float' ? 'nm' : 'level', reduction: spp >= 3 ? 'luma-bt601' : 'none',
    ...(levelRange ? { levelRange } : {}),
  }
}

function readStrips(bytes: Uint8Array, t: TiffInfo, image: Uint8Array, pixelBytes: number, bytesPer: number, name: string) {
  const rowBytes = t.width * pixelBytes
  const strips = Math.ceil(t.height / t.rowsPerStrip)
  if (t.offsets.length < strips || t.counts.length < strips) {
    throw new InputError('file', `${name} is corrupt: ${strips} strips are needed but ${Math.min(t.offsets.length, t.counts.length)} are listed`)
  }
  for (let s = 0; s < strips; s++) {
    const rows = Math.min(t.rowsPerStrip, t.height - s * t.rowsPerStrip)
    const at = s * t.rowsPerStrip * rowBytes
    decodeChunk(bytes, t, s, image, at, rows * rowBytes, name)
    if (t.predictor > 1) undoPredictor(image, at, rows, t.width, t.samplesPerPixel, bytesPer, t.littleEndian, t.predictor)
  }
}

function readTiles(bytes: Uint8Array, t: TiffInfo, image: Uint8Array, pixelBytes: number, bytesPer: number, name: string) {
  const { width: tw, height: th } = t.tile!
  if (tw < 1 || th < 1 || tw > 65536 || th > 65536) throw new InputError('file', `${name} is corrupt: tile size ${tw} × ${th}`)
  const across = Math.ceil(t.width / tw), down = Math.ceil(t.height / th)
  if (t.offsets.length < across * down || t.counts.length < across * down) throw new InputError('file', `${name} is corrupt: ${across * down} tiles are needed but fewer are listed`)
  const tileRow = tw * pixelBytes
  const tile = new Uint8Array(tileRow * th)
  for (let ty = 0; ty < down; ty++) {
    for (let tx = 0; tx < across; tx++) {
      tile.fill(0)
      decodeChunk(bytes, t, ty * across + tx, tile, 0, tile.length, name)
      if (t.predictor > 1) undoPredictor(tile, 0, th, tw, t.samplesPerPixel, bytesPer, t.littleEndian, t.predictor)
      // Tiles at the right and bottom edges hang over the image; only the inside is copied.
      const cols = Math.min(tw, t.width - tx * tw), rows = Math.min(th, t.height - ty * th)
      for (let r = 0; r < rows; r++) {
        const dst = ((ty * th + r) * t.width + tx * tw) * pixelBytes
        image.set(tile.subarray(r * tileRow, r * tileRow + cols * pixelBytes), dst)
      }
    }
  }
}

// Decodes strip or tile i into dst[at, at + n), checking that the stored bytes lie in the file
// and produce the full n bytes.
function decodeChunk(bytes: Uint8Array, t: TiffInfo, i: number, dst: Uint8Array, at: number, n: number, name: string) {
  const off = t.offsets[i]!, count = t.counts[i]!
  const what = t.tile ? `tile ${i}` : `strip ${i}`
  if (off + count > bytes.length) throw new InputError('file', `${name} is truncated: ${what} runs past the end of the file`)
  let got: number
  switch (t.compression) {
    case 1:
      got = Math.min(count, n)
      dst.set(bytes.subarray(off, off + got), at)
      break
    case 5:
      got = lzwDecode(bytes, off, off + count, dst, at, n)
      if (got < 0) throw new InputError('file', `${name} is corrupt: invalid LZW codes in ${what}`)
      break
    case 32773:
      got = packBitsDecode(bytes, off, off + count, dst, at, n)
      break
    default: {
      let out: Uint8Array
      try {
        out = inflateSync(bytes.subarray(off, off + count), { maxOutputLength: n })
      }
      catch (e) {
        const code = (e as { code?: string }).code
        if (code === 'Z_BUF_ERROR') throw new InputError('file', `${name} is truncated: the compressed data of ${what} end early`)
        if (code === 'ERR_BUFFER_TOO_LARGE') throw new InputError('file', `${name} is corrupt: ${what} holds more data than its size needs`)
        throw new InputError('file', `${name} is corrupt: the compressed data of ${what} cannot be read (${(e as Error).message})`)
      }
      dst.set(out, at)
      got = out.length
    }
  }
  if (got < n) throw new InputError('file', `${name} is truncated: ${what} holds ${got} of its ${n} bytes`)
}

function toSamples(image: Uint8Array, t: TiffInfo, type: 'uint' | 'int' | 'float', bytesPer: number, name: string): Float32Array {
  const n = t.width * t.height
  const spp = t.samplesPerPixel
  const le = t.littleEndian
  const dv = new DataView(image.buffer, image.byteOffset, image.byteLength)
  const read: (p: number) => number
    = bytesPer === 1
      ? (type === 'int' ? p => dv.getInt8(p) : p => image[p]!)
      : bytesPer === 2
        ? (type === 'int' ? p => dv.getInt16(p, le) : p => dv.getUint16(p, le))
        : type === 'float' ? p => dv.getFloat32(p, le) : type === 'int' ? p => dv.getInt32(p, le) : p => dv.getUint32(p, le)
  const data = new Float32Array(n)
  const step = spp * bytesPer
  const invert = t.photometric === 0 ? 2 ** (8 * bytesPer) - 1 : 0
  for (let i = 0; i < n; i++) {
    const p = i * step
    let v = spp >= 3 ? lumaBt601(read(p), read(p + bytesPer), read(p + 2 * bytesPer)) : read(p)
    if (invert) v = invert - v
    if (!Number.isFinite(v)) {
      throw new InputError('file', `${name}: the sample at row ${Math.floor(i / t.width)}, column ${i % t.width} is ${v}; every pixel needs a finite height`)
    }
    data[i] = v
  }
  return data
}
