// Bounded reader for the header and first image file directory of a classic TIFF (TIFF 6.0
// specification, Adobe 1992, §2 "TIFF Structure"). Every offset and count is checked against the
// file length before it is followed, so a crafted file can neither loop nor make us allocate
// more than the file itself. Browser-safe.
import { InputError } from '../errors'

export interface TiffInfo {
  littleEndian: boolean
  width: number
  height: number
  bitsPerSample: number[]
  samplesPerPixel: number
  compression: number
  photometric: number
  planar: number
  predictor: number
  sampleFormat: number
  rowsPerStrip: number
  /** Strip (or tile) offsets and byte counts. */
  offsets: number[]
  counts: number[]
  tile?: { width: number, height: number }
}

// Bytes per value of the TIFF field types (1 BYTE … 12 DOUBLE).
const TYPE_SIZE: Record<number, number> = { 1: 1, 2: 1, 3: 2, 4: 4, 5: 8, 6: 1, 7: 1, 8: 2, 9: 4, 10: 8, 11: 4, 12: 8 }

export function readTiffInfo(bytes: Uint8Array, name: string): TiffInfo {
  const len = bytes.length
  if (len < 8) throw new InputError('file', `${name} is truncated: it ends inside the TIFF header`)
  const le = bytes[0] === 0x49
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const u16 = (p: number) => dv.getUint16(p, le)
  const u32 = (p: number) => dv.getUint32(p, le)
  const version = u16(2)
  if (version === 43) throw new InputError('file', `${name} is a BigTIFF file, which Tessera does not read; save it as a classic TIFF`)
  if (version !== 42) throw new InputError('file', `${name} is corrupt: bad TIFF version number ${version}`)
  const ifd = u32(4)
  if (ifd < 8 || ifd + 2 > len) throw new InputError('file', `${name} is truncated: its first image directory lies past the end of the file`)
  const n = u16(ifd)
  if (ifd + 2 + 12 * n + 4 > len) throw new InputError('file', `${name} is truncated: its image directory (${n} entries) runs past the end of the file`)
  const tags = new Map<number, number[]>()
  for (let i = 0; i < n; i++) {
    const e = ifd + 2 + 12 * i
    const tag = u16(e), type = u16(e + 2), count = u32(e + 4)
    const size = TYPE_SIZE[type]
    // Only integer fields are needed; others (strings, rationals, private tags) are skipped.
    if (!WANTED.has(tag) || (type !== 1 && type !== 3 && type !== 4) || size === undefined) continue
    const bytesNeeded = size * count
    const at = bytesNeeded <= 4 ? e + 8 : u32(e + 8)
    if (count === 0) continue
    if (at + bytesNeeded > len) throw new InputError('file', `${name} is truncated or corrupt: the values of TIFF tag ${tag} lie outside the file`)
    const vals = new Array<number>(count)
    for (let k = 0; k < count; k++) vals[k] = type === 1 ? bytes[at + k]! : type === 3 ? u16(at + 2 * k) : u32(at + 4 * k)
    tags.set(tag, vals)
  }
  const one = (tag: number, dflt?: number): number => {
    const v = tags.get(tag)?.[0] ?? dflt
    if (v === undefined) throw new InputError('file', `${name} is corrupt: required TIFF tag ${tag} (${TAG_NAMES[tag]}) is missing`)
    return v
  }
  const width = one(256)
  const height = one(257)
  const samplesPerPixel = one(277, 1)
  const bitsPerSample = tags.get(258) ?? [1]
  const tiled = tags.has(322) || tags.has(324)
  const info: TiffInfo = {
    littleEndian: le, width, height, bitsPerSample, samplesPerPixel,
    compression: one(259, 1), photometric: one(262, 1), planar: one(284, 1), predictor: one(317, 1),
    sampleFormat: one(339, 1),
    rowsPerStrip: Math.min(one(278, height), height),
    offsets: tags.get(tiled ? 324 : 273) ?? [],
    counts: tags.get(tiled ? 325 : 279) ?? [],
  }
  if (tiled) info.tile = { width: one(322), height: one(323) }
  return info
}

const TAG_NAMES: Record<number, string> = {
  256: 'ImageWidth', 257: 'ImageLength', 258: 'BitsPerSample', 259: 'Compression', 262: 'PhotometricInterpretation',
  273: 'StripOffsets', 277: 'SamplesPerPixel', 278: 'RowsPerStrip', 279: 'StripByteCounts', 284: 'PlanarConfiguration',
  317: 'Predictor', 322: 'TileWidth', 323: 'TileLength', 324: 'TileOffsets', 325: 'TileByteCounts', 339: 'SampleFormat',
}
const WANTED = new Set(Object.keys(TAG_NAMES).map(Number))
