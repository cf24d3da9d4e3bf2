// TIFF strip codecs with hard bounds on input and output: LZW with 9–12-bit codes, MSB-first,
// "early change" (TIFF 6.0 §13), PackBits run lengths (TIFF 6.0 §9), and the predictors —
// horizontal differencing (§14) and the floating-point predictor of Adobe's TIFF Technical Note 3
// (byte planes most-significant first, then byte-wise differencing). Browser-safe.

/** Decodes LZW from src[start, end) into dst[off, off + n). Returns bytes written, or −1 for invalid codes. */
export function lzwDecode(src: Uint8Array, start: number, end: number, dst: Uint8Array, off: number, n: number): number {
  const prefix = new Int16Array(4096)
  const suffix = new Uint8Array(4096)
  const length = new Uint16Array(4096)
  for (let i = 0; i < 256; i++) {
    prefix[i] = -1
    suffix[i] = i
    length[i] = 1
  }
  const totalBits = (end - start) * 8
  const limit = off + n
  let bit = 0, width = 9, next = 258, old = -1, out = off
  while (out < limit) {
    // A stream that runs out of bits before its end-of-information code simply stops here.
    if (bit + width > totalBits) break
    // A code of ≤ 12 bits spans at most three bytes; bytes past the end read as 0.
    const p = start + (bit >>> 3)
    const v = (src[p]! << 16) | ((p + 1 < end ? src[p + 1]! : 0) << 8) | (p + 2 < end ? src[p + 2]! : 0)
    const code = (v >>> (24 - (bit & 7) - width)) & ((1 << width) - 1)
    bit += width
    if (code === 257) break
    if (code === 256) {
      width = 9
      next = 258
      old = -1
      continue
    }
    if (old < 0) {
      if (code > 255) return -1
      dst[out++] = code
      old = code
      continue
    }
    if (code > next || (code === next && next >= 4096)) return -1
    // The new entry is old's string plus the first byte of this code's string — for the
    // not-yet-defined code (code === next) that byte is old's own first byte.
    let c = code === next ? old : code
    while (prefix[c]! >= 0) c = prefix[c]!
    if (next < 4096) {
      prefix[next] = old
      suffix[next] = suffix[c]!
      length[next] = length[old]! + 1
      next++
    }
    const len = length[code]!
    for (let q = code, p = out + len - 1; q >= 0; q = prefix[q]!, p--) if (p < limit) dst[p] = suffix[q]!
    out += len
    old = code
    if (next >= (1 << width) - 1 && width < 12) width++
  }
  return Math.min(out, limit) - off
}

/** Decodes PackBits from src[start, end) into dst[off, off + n). Returns bytes written. */
export function packBitsDecode(src: Uint8Array, start: number, end: number, dst: Uint8Array, off: number, n: number): number {
  let i = start
  let o = off
  const limit = off + n
  while (i < end && o < limit) {
    const h = (src[i++]! << 24) >> 24
    if (h >= 0) {
      for (let k = 0; k <= h && i < end && o < limit; k++) dst[o++] = src[i++]!
    }
    else if (h !== -128) {
      if (i >= end) break
      const v = src[i++]!
      for (let k = 0; k <= -h && o < limit; k++) dst[o++] = v
    }
  }
  return o - off
}

/**
 * Undoes a predictor on `rows` rows of `width` pixels × `spp` samples of `bytes` bytes each,
 * stored from `off` in buf (file byte order `le`). Predictor 2 works in integer samples modulo
 * 2^bits; predictor 3 (floating point) on byte planes.
 */
export function undoPredictor(buf: Uint8Array, off: number, rows: number, width: number, spp: number, bytes: number, le: boolean, predictor: number) {
  const rowBytes = width * spp * bytes
  const dv = new DataView(buf.buffer, buf.byteOffset, buf.byteLength)
  const tmp = predictor === 3 ? new Uint8Array(rowBytes) : null
  for (let r = 0; r < rows; r++) {
    const p = off + r * rowBytes
    if (predictor === 2) {
      if (bytes === 1) for (let i = spp; i < rowBytes; i++) buf[p + i] = (buf[p + i]! + buf[p + i - spp]!) & 0xFF
      else if (bytes === 2) for (let i = spp; i < width * spp; i++) dv.setUint16(p + 2 * i, dv.getUint16(p + 2 * i, le) + dv.getUint16(p + 2 * (i - spp), le), le)
      else for (let i = spp; i < width * spp; i++) dv.setUint32(p + 4 * i, (dv.getUint32(p + 4 * i, le) + dv.getUint32(p + 4 * (i - spp), le)) >>> 0, le)
    }
    else if (predictor === 3 && tmp) {
      for (let i = spp; i < rowBytes; i++) buf[p + i] = (buf[p + i]! + buf[p + i - spp]!) & 0xFF
      // Plane k holds byte k (most significant first) of every sample of the row.
      const samples = width * spp
      for (let s = 0; s < samples; s++) {
        for (let k = 0; k < bytes; k++) tmp[s * bytes + (le ? bytes - 1 - k : k)] = buf[p + k * samples + s]!
      }
      buf.set(tmp, p)
    }
  }
}
