// Minimal TIFF 6.0 writer for the tests (utif's encoder only writes 8-bit RGBA): one image,
// strips or tiles, grey or RGB, 8/16/32-bit integer or 32-bit float samples, either byte order,
// compression none / LZW (TIFF 6.0 §13, early change) / Deflate (node:zlib) / PackBits (§9),
// predictor 2 (§14) or 3 (Adobe TIFF Technical Note 3). Written from the specification.
import { deflateSync } from 'node:zlib'

export interface TiffSpec {
  width: number
  height: number
  /** Samples, pixel-interleaved, row 0 first. */
  samples: ArrayLike<number>
  bits: 8 | 16 | 32
  sampleFormat?: 1 | 2 | 3
  spp?: number
  photometric?: number
  littleEndian?: boolean
  compression?: 1 | 5 | 8 | 32773
  predictor?: 1 | 2 | 3
  rowsPerStrip?: number
  tile?: { width: number, height: number }
  /** Extra IFD entries [tag, type, count, value] written verbatim (value inline). */
  extraEntries?: [number, number, number, number][]
}

export function writeTiff(s: TiffSpec): Uint8Array {
  const spp = s.spp ?? 1
  const le = s.littleEndian ?? true
  const bytesPer = s.bits / 8
  const fmt = s.sampleFormat ?? 1
  const comp = s.compression ?? 1
  const pred = s.predictor ?? 1
  // Chunks: strips of rowsPerStrip rows, or tiles padded with zeros.
  const chunks: { w: number, rows: number, pick: (r: number, c: number) => number | null }[] = []
  if (s.tile) {
    const { width: tw, height: th } = s.tile
    for (let ty = 0; ty < Math.ceil(s.height / th); ty++) {
      for (let tx = 0; tx < Math.ceil(s.width / tw); tx++) {
        chunks.push({ w: tw, rows: th, pick: (r, c) => (ty * th + r < s.height && tx * tw + c < s.width ? (ty * th + r) * s.width + tx * tw + c : null) })
      }
    }
  }
  else {
    const rps = s.rowsPerStrip ?? s.height
    for (let r0 = 0; r0 < s.height; r0 += rps) {
      chunks.push({ w: s.width, rows: Math.min(rps, s.height - r0), pick: (r, c) => (r0 + r) * s.width + c })
    }
  }
  const encoded = chunks.map((ch) => {
    const raw = new Uint8Array(ch.w * ch.rows * spp * bytesPer)
    const dv = new DataView(raw.buffer)
    for (let r = 0; r < ch.rows; r++) {
      for (let c = 0; c < ch.w; c++) {
        const px = ch.pick(r, c)
        for (let k = 0; k < spp; k++) {
          const v = px === null ? 0 : s.samples[px * spp + k]!
          const at = ((r * ch.w + c) * spp + k) * bytesPer
          if (fmt === 3) dv.setFloat32(at, v, le)
          else if (bytesPer === 1) dv.setUint8(at, v & 0xFF)
          else if (bytesPer === 2) dv.setUint16(at, v & 0xFFFF, le)
          else dv.setUint32(at, v >>> 0, le)
        }
      }
    }
    if (pred !== 1) applyPredictor(raw, ch.rows, ch.w, spp, bytesPer, le, pred)
    return comp === 5 ? lzwEncode(raw) : comp === 8 ? new Uint8Array(deflateSync(raw)) : comp === 32773 ? packBitsEncode(raw) : raw
  })
  const entries: [number, number, number, number | number[]][] = [
    [256, 4, 1, s.width], [257, 4, 1, s.height], [258, 3, spp, Array(spp).fill(s.bits)], [259, 3, 1, comp],
    [262, 3, 1, s.photometric ?? (spp >= 3 ? 2 : 1)], [277, 3, 1, spp], [284, 3, 1, 1], [317, 3, 1, pred], [339, 3, spp, Array(spp).fill(fmt)],
  ]
  if (s.tile) entries.push([322, 3, 1, s.tile.width], [323, 3, 1, s.tile.height], [324, 4, chunks.length, []], [325, 4, chunks.length, encoded.map(e => e.length)])
  else entries.push([273, 4, chunks.length, []], [278, 4, 1, s.rowsPerStrip ?? s.height], [279, 4, chunks.length, encoded.map(e => e.length)])
  for (const e of s.extraEntries ?? []) entries.push(e)
  entries.sort((a, b) => a[0] - b[0])
  // Layout: header, IFD, out-of-line values, chunk data.
  const ifdSize = 2 + 12 * entries.length + 4
  const arrays = entries.map(e => (Array.isArray(e[3]) ? e[3] : [e[3]]))
  const sizes = entries.map(e => (e[1] === 3 ? 2 : 4) * e[2])
  let extra = 8 + ifdSize
  const valueAt = sizes.map((sz) => {
    if (sz <= 4) return -1
    const at = extra
    extra += sz
    return at
  })
  let dataAt = extra
  const offsets = encoded.map((e) => {
    const at = dataAt
    dataAt += e.length
    return at
  })
  const offTag = s.tile ? 324 : 273
  const out = new Uint8Array(dataAt)
  const dv = new DataView(out.buffer)
  out.set(le ? [0x49, 0x49, 42, 0] : [0x4D, 0x4D, 0, 42])
  dv.setUint32(4, 8, le)
  dv.setUint16(8, entries.length, le)
  entries.forEach((e, i) => {
    const p = 10 + 12 * i
    const vals = e[0] === offTag ? offsets : arrays[i]!
    dv.setUint16(p, e[0], le)
    dv.setUint16(p + 2, e[1], le)
    dv.setUint32(p + 4, e[2], le)
    const at = valueAt[i]! < 0 ? p + 8 : valueAt[i]!
    if (valueAt[i]! >= 0) dv.setUint32(p + 8, at, le)
    vals.forEach((v, k) => (e[1] === 3 ? dv.setUint16(at + 2 * k, v, le) : dv.setUint32(at + 4 * k, v, le)))
  })
  dv.setUint32(10 + 12 * entries.length, 0, le)
  encoded.forEach((e, i) => out.set(e, offsets[i]))
  return out
}

function applyPredictor(raw: Uint8Array, rows: number, w: number, spp: number, bytes: number, le: boolean, pred: number) {
  const dv = new DataView(raw.buffer)
  const rowBytes = w * spp * bytes
  for (let r = 0; r < rows; r++) {
    const p = r * rowBytes
    if (pred === 2) {
      for (let i = w * spp - 1; i >= spp; i--) {
        if (bytes === 1) raw[p + i] = (raw[p + i]! - raw[p + i - spp]!) & 0xFF
        else if (bytes === 2) dv.setUint16(p + 2 * i, (dv.getUint16(p + 2 * i, le) - dv.getUint16(p + 2 * (i - spp), le)) & 0xFFFF, le)
        else dv.setUint32(p + 4 * i, (dv.getUint32(p + 4 * i, le) - dv.getUint32(p + 4 * (i - spp), le)) >>> 0, le)
      }
    }
    else {
      // Technote 3: split each sample into bytes, most significant first, plane by plane…
      const n = w * spp
      const planes = new Uint8Array(rowBytes)
      for (let sIdx = 0; sIdx < n; sIdx++) {
        for (let k = 0; k < bytes; k++) planes[k * n + sIdx] = raw[p + sIdx * bytes + (le ? bytes - 1 - k : k)]!
      }
      // …then difference the byte sequence with a stride of spp.
      for (let i = rowBytes - 1; i >= spp; i--) planes[i] = (planes[i]! - planes[i - spp]!) & 0xFF
      raw.set(planes, p)
    }
  }
}

/** TIFF LZW: Clear first, codes MSB-first, width grows one code early, EOI last. */
export function lzwEncode(src: Uint8Array): Uint8Array {
  const out: number[] = []
  let acc = 0, accBits = 0
  let width = 9
  const put = (code: number) => {
    acc = (acc << width) | code
    accBits += width
    while (accBits >= 8) {
      out.push((acc >>> (accBits - 8)) & 0xFF)
      accBits -= 8
    }
    acc &= (1 << accBits) - 1
  }
  let dict = new Map<number, number>()
  let next = 258
  put(256)
  if (src.length === 0) {
    put(257)
    return flush()
  }
  let w = src[0]!
  for (let i = 1; i < src.length; i++) {
    const k = src[i]!
    const key = w * 256 + k
    const hit = dict.get(key)
    if (hit !== undefined) {
      w = hit
      continue
    }
    put(w)
    dict.set(key, next++)
    if (next >= 4094) {
      put(256)
      dict = new Map()
      next = 258
      width = 9
    }
    else if (next > (1 << width) - 1) width++
    w = k
  }
  put(w)
  next++
  if (next > (1 << width) - 1 && width < 12) width++
  put(257)
  return flush()
  function flush() {
    if (accBits > 0) out.push((acc << (8 - accBits)) & 0xFF)
    return Uint8Array.from(out)
  }
}

export function packBitsEncode(src: Uint8Array): Uint8Array {
  const out: number[] = []
  let i = 0
  while (i < src.length) {
    let run = 1
    while (i + run < src.length && run < 128 && src[i + run] === src[i]) run++
    if (run >= 2) {
      out.push((257 - run) & 0xFF, src[i]!)
      i += run
      continue
    }
    let lit = 1
    while (i + lit < src.length && lit < 128 && !(i + lit + 1 < src.length && src[i + lit] === src[i + lit + 1])) lit++
    out.push(lit - 1, ...src.subarray(i, i + lit))
    i += lit
  }
  return Uint8Array.from(out)
}
