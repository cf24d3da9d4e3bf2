// Hand-built PNG files for the tests, following the PNG specification (ISO/IEC 15948): chunk
// layout length · type · data · CRC-32, with the CRC from node:zlib (independent of ours).
import { crc32, deflateSync } from 'node:zlib'

export function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length)
  const dv = new DataView(out.buffer)
  dv.setUint32(0, data.length)
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i)
  out.set(data, 8)
  dv.setUint32(8 + data.length, crc32(out.subarray(4, 8 + data.length)))
  return out
}

export function ihdr(width: number, height: number, bitDepth: number, colorType: number, interlace = 0): Uint8Array {
  const d = new Uint8Array(13)
  const dv = new DataView(d.buffer)
  dv.setUint32(0, width)
  dv.setUint32(4, height)
  d.set([bitDepth, colorType, 0, 0, interlace], 8)
  return chunk('IHDR', d)
}

export const SIGNATURE = Uint8Array.of(0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A)

export function concat(...parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((s, p) => s + p.length, 0))
  let o = 0
  for (const p of parts) {
    out.set(p, o)
    o += p.length
  }
  return out
}

/** A PNG from raw scanlines (each already prefixed by its filter byte). */
export function pngFromScanlines(width: number, height: number, bitDepth: number, colorType: number, scanlines: Uint8Array, extra: Uint8Array[] = []): Uint8Array {
  return concat(SIGNATURE, ihdr(width, height, bitDepth, colorType), ...extra, chunk('IDAT', new Uint8Array(deflateSync(scanlines))), chunk('IEND', new Uint8Array(0)))
}
