// JPEG decoding (ITU-T T.81): the frame header (SOFn) is read by a bounded marker walk first, so
// the size is checked before jpeg-js allocates anything; jpeg-js then decodes baseline and
// progressive Huffman images. Grey JPEGs give their Y levels; colour ones the BT.601 luma.
import jpeg from 'jpeg-js'
import { InputError } from '../errors'
import { checkImageSize } from './grid'
import { lumaBt601 } from './luma'
import type { RawScan } from './types'

interface Frame { width: number, height: number, precision: number, components: number, marker: number }

export function readJpegFrame(bytes: Uint8Array, name: string): Frame {
  const n = bytes.length
  let p = 2
  while (p < n) {
    if (bytes[p] !== 0xFF) throw new InputError('file', `${name} is corrupt: expected a JPEG marker at byte ${p}`)
    while (p < n && bytes[p] === 0xFF) p++
    if (p >= n) break
    const m = bytes[p++]!
    // Stand-alone markers carry no length.
    if (m === 0x01 || (m >= 0xD0 && m <= 0xD7)) continue
    if (m === 0xD9 || m === 0xDA) throw new InputError('file', `${name} is corrupt: the JPEG has no frame header before its image data`)
    if (p + 2 > n) break
    const len = (bytes[p]! << 8) | bytes[p + 1]!
    if (len < 2 || p + len > n) break
    const isSof = m >= 0xC0 && m <= 0xCF && m !== 0xC4 && m !== 0xC8 && m !== 0xCC
    if (isSof) {
      if (len < 8) throw new InputError('file', `${name} is corrupt: short JPEG frame header`)
      return {
        precision: bytes[p + 2]!,
        height: (bytes[p + 3]! << 8) | bytes[p + 4]!,
        width: (bytes[p + 5]! << 8) | bytes[p + 6]!,
        components: bytes[p + 7]!,
        marker: m,
      }
    }
    p += len
  }
  throw new InputError('file', `${name} is truncated: it ends before the JPEG frame header`)
}

export function decodeJpeg(bytes: Uint8Array, name: string, maxSide: number): RawScan {
  const f = readJpegFrame(bytes, name)
  if (f.height === 0) throw new InputError('file', `${name} gives its height in a later DNL marker, which Tessera does not read`)
  checkImageSize(name, f.width, f.height, maxSide)
  if (f.marker >= 0xC9) throw new InputError('file', `${name} is an arithmetic-coded JPEG, which Tessera does not read`)
  if (f.marker === 0xC3 || f.marker === 0xC7) throw new InputError('file', `${name} is a lossless JPEG, which Tessera does not read`)
  if (f.precision !== 8) throw new InputError('file', `${name} has ${f.precision}-bit JPEG samples; Tessera reads 8-bit JPEG`)
  if (f.components !== 1 && f.components !== 3) throw new InputError('file', `${name} has ${f.components} colour components; Tessera reads grey or RGB JPEG`)
  // A cut-off file has no end-of-image marker after its scan data.
  if (!endsWithEoi(bytes)) throw new InputError('file', `${name} is truncated: the JPEG has no end-of-image marker`)
  let img: { width: number, height: number, data: Uint8Array }
  try {
    img = jpeg.decode(bytes, { useTArray: true, formatAsRGBA: false, tolerantDecoding: false, maxResolutionInMP: (maxSide * maxSide) / 1e6 + 1, maxMemoryUsageInMB: 1024 })
  }
  catch (e) {
    throw new InputError('file', `${name} is corrupt: ${(e as Error).message}`)
  }
  const count = img.width * img.height
  if (img.width !== f.width || img.height !== f.height || img.data.length < 3 * count) throw new InputError('file', `${name} is corrupt: decoded size does not match its header`)
  const data = new Float32Array(count)
  const src = img.data
  if (f.components === 1) for (let i = 0; i < count; i++) data[i] = src[3 * i]!
  else for (let i = 0; i < count; i++) data[i] = lumaBt601(src[3 * i]!, src[3 * i + 1]!, src[3 * i + 2]!)
  return {
    width: img.width, height: img.height, data, format: 'jpeg', bitDepth: 8, sampleType: 'uint', valueUnit: 'level',
    reduction: f.components === 3 ? 'luma-bt601' : 'none', levelRange: [0, 255],
  }
}

// Some writers pad after EOI, so look for FF D9 among the last bytes rather than at the very end.
function endsWithEoi(bytes: Uint8Array): boolean {
  for (let i = bytes.length - 2; i >= Math.max(2, bytes.length - 4096); i--) if (bytes[i] === 0xFF && bytes[i + 1] === 0xD9) return true
  return false
}
