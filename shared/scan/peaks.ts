// Peak finding on a smoothed grid: strict local maxima (ties broken in raster order), prominence
// over the median of a ring of samples around each peak (a local background that follows tilt
// and bow), three-point Gaussian refinement (a parabola through the logarithms, exact for a
// sampled Gaussian), and greedy non-maximum suppression by distance.
import { BucketGrid } from './buckets'

/** Peak positions in samples (fractional) and prominences, in the order found. */
export interface Peaks { x: number[], y: number[], prom: number[] }

export function findPeaks(S: Float32Array, w: number, h: number, ringDx: Int32Array, ringDy: Int32Array, minProm: number): Peaks {
  const out: Peaks = { x: [], y: [], prom: [] }
  const ring = new Float64Array(ringDx.length)
  for (let r = 1; r < h - 1; r++) {
    for (let c = 1; c < w - 1; c++) {
      const i = r * w + c
      const v = S[i]!
      if (!(v > S[i - 1]! && v >= S[i + 1]! && v > S[i - w]! && v >= S[i + w]!
        && v > S[i - w - 1]! && v > S[i - w + 1]! && v >= S[i + w - 1]! && v >= S[i + w + 1]!)) continue
      let n = 0
      for (let j = 0; j < ringDx.length; j++) {
        const cc = c + ringDx[j]!, rr = r + ringDy[j]!
        if (cc >= 0 && cc < w && rr >= 0 && rr < h) ring[n++] = S[rr * w + cc]!
      }
      const bg = n > 0 ? sortedMedian(ring.subarray(0, n)) : 0
      // Cheap rejection first: the refined apex exceeds the sample by a few per cent at most.
      if ((v - bg) * 1.25 < minProm) continue
      const fx = refine1D(S[i - 1]! - bg, v - bg, S[i + 1]! - bg)
      const fy = refine1D(S[i - w]! - bg, v - bg, S[i + w]! - bg)
      // Separable Gaussian: the apex ratios along x and y multiply.
      const prom = (v - bg) * fx.gain * fy.gain
      if (prom < minProm) continue
      out.x.push(c + fx.delta)
      out.y.push(r + fy.delta)
      out.prom.push(prom)
    }
  }
  return out
}

/**
 * Three-point apex estimate from samples at −1, 0, +1: Gaussian (parabola through the logs) when
 * all three are positive, plain parabola otherwise. Returns the apex offset (|δ| ≤ ½) and the
 * ratio of the apex value to the centre sample.
 */
export function refine1D(a: number, b: number, c: number): { delta: number, gain: number } {
  if (a > 0 && b > 0 && c > 0) {
    const la = Math.log(a), lb = Math.log(b), lc = Math.log(c)
    const d2 = la - 2 * lb + lc
    if (d2 < 0) {
      const delta = clampHalf((la - lc) / (2 * d2))
      return { delta, gain: Math.exp(-0.25 * (la - lc) * delta) }
    }
    return { delta: 0, gain: 1 }
  }
  const d2 = a - 2 * b + c
  if (d2 < 0 && b > 0) {
    const delta = clampHalf((a - c) / (2 * d2))
    return { delta, gain: (b - 0.25 * (a - c) * delta) / b }
  }
  return { delta: 0, gain: 1 }
}

function clampHalf(d: number): number {
  return d > 0.5 ? 0.5 : d < -0.5 ? -0.5 : d
}

/** Median of a short list by insertion sort, in place (the list is scratch storage). */
export function sortedMedian(s: Float64Array): number {
  const n = s.length
  for (let i = 1; i < n; i++) {
    const v = s[i]!
    let j = i - 1
    while (j >= 0 && s[j]! > v) {
      s[j + 1] = s[j]!
      j--
    }
    s[j + 1] = v
  }
  return n % 2 ? s[(n - 1) / 2]! : 0.5 * (s[n / 2 - 1]! + s[n / 2]!)
}

/**
 * Greedy non-maximum suppression: visits peaks by decreasing prominence and keeps one unless a
 * kept peak lies closer than minSep (nm; sample spacing sxNm × syNm). Returns kept indices.
 */
export function suppressNonMaxima(peaks: Peaks, sxNm: number, syNm: number, minSep: number, w: number, h: number): number[] {
  const order = peaks.prom.map((_, i) => i).sort((a, b) => peaks.prom[b]! - peaks.prom[a]!)
  if (!(minSep > 0)) return order
  const cellX = minSep / sxNm, cellY = minSep / syNm
  const grid = new BucketGrid(w / cellX, h / cellY)
  const kept: number[] = []
  const min2 = minSep * minSep
  for (const i of order) {
    const x = peaks.x[i]!, y = peaks.y[i]!
    let clear = true
    grid.forNear(x / cellX, y / cellY, (m) => {
      if (((peaks.x[m]! - x) * sxNm) ** 2 + ((peaks.y[m]! - y) * syNm) ** 2 < min2) clear = false
      return !clear
    })
    if (!clear) continue
    kept.push(i)
    grid.add(i, x / cellX, y / cellY)
  }
  return kept
}
