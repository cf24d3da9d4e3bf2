// Robust white-noise level of a scan from second differences along the fast-scan axis (rows):
// d = z[c−1] − 2z[c] + z[c+1] has variance 6σ² for white noise and cancels offsets and tilts of a
// line; σ ≈ 1.4826·MAD(d)/√6 (MAD scaled to σ as in Rousseeuw & Croux 1993; common practice).
import { MAD_TO_SIGMA } from './contrast'
import { medianInPlace } from './select'

/** σ of the white noise in the units of `data`; uses every k-th row so that about `maxSamples` differences are examined. */
export function noiseSigmaRows(data: ArrayLike<number>, w: number, h: number, maxSamples = 262144): number {
  if (w < 3 || h < 1) return 0
  const perRow = w - 2
  const rowStride = Math.max(1, Math.ceil((perRow * h) / maxSamples))
  const d = new Float64Array(Math.ceil(h / rowStride) * perRow)
  let m = 0
  for (let r = 0; r < h; r += rowStride) {
    const base = r * w
    for (let c = 1; c < w - 1; c++) {
      const v = data[base + c - 1]! - 2 * data[base + c]! + data[base + c + 1]!
      if (Number.isFinite(v)) d[m++] = v
    }
  }
  if (m === 0) return 0
  const s = d.subarray(0, m)
  const med = medianInPlace(s)
  for (let i = 0; i < m; i++) s[i] = Math.abs(s[i]! - med)
  return (MAD_TO_SIGMA * medianInPlace(s)) / Math.sqrt(6)
}
