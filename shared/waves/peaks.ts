// Peaks of a point spectrum (dI/dV against bias): local maxima with their topographic prominence
// (height above the higher of the two lowest points reached before a higher sample or the edge),
// refined by a parabola through the reciprocals of three samples (exact for a sampled Lorentzian,
// whose reciprocal is a parabola), and matched to the nearest model level.
import { InputError } from '../errors'

export interface SpectrumPeak {
  /** refined position (same unit as x: V or eV) */
  x: number
  /** height at the refined position (parabola vertex) */
  y: number
  /** index of the highest sample */
  index: number
  prominence: number
}

export interface PeakOptions {
  /** absolute prominence threshold; default `minProminenceFraction` of the data's range */
  minProminence?: number
  /** fraction of (max − min) of the (smoothed) data; default 0.05 */
  minProminenceFraction?: number
  /** odd moving-average window in samples before the search; default 1 (none) */
  smooth?: number
}

/** Centred moving average over an odd window (shrinking at the ends). */
export function movingAverage(y: ArrayLike<number>, window: number): Float64Array {
  const n = y.length
  const out = new Float64Array(n)
  const h = Math.max(0, Math.floor(window / 2))
  for (let i = 0; i < n; i++) {
    let s = 0
    let c = 0
    for (let j = Math.max(0, i - h); j <= Math.min(n - 1, i + h); j++) {
      s += y[j]!
      c++
    }
    out[i] = s / c
  }
  return out
}

/** Vertex (x, y) of the parabola through three points (x ascending). */
function vertex(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number): [number, number] | null {
  const d0 = (y1 - y0) / (x1 - x0)
  const d1 = (y2 - y1) / (x2 - x1)
  const a = (d1 - d0) / (x2 - x0)
  if (!(Math.abs(a) > 0)) return null
  // Newton form p(x) = y0 + d0·(x − x0) + a·(x − x0)(x − x1); p′(xv) = 0.
  const xv = (x0 + x1) / 2 - d0 / (2 * a)
  return [xv, y0 + d0 * (xv - x0) + a * (xv - x0) * (xv - x1)]
}

function refine(x: ArrayLike<number>, y: ArrayLike<number>, i: number): [number, number] {
  const xi = x[i]!, yi = y[i]!
  if (i === 0 || i === y.length - 1) return [xi, yi]
  const xa = x[i - 1]!, ya = y[i - 1]!, xb = x[i + 1]!, yb = y[i + 1]!
  // For a Lorentzian A/((x − x0)² + Γ²), 1/y is a parabola with its minimum at x0.
  if (ya > 0 && yi > 0 && yb > 0) {
    const v = vertex(xa, 1 / ya, xi, 1 / yi, xb, 1 / yb)
    if (v && v[1] > 0 && v[0] >= xa && v[0] <= xb) return [v[0], 1 / v[1]]
  }
  const v = vertex(xa, ya, xi, yi, xb, yb)
  if (v && v[0] >= xa && v[0] <= xb) return v
  return [xi, yi]
}

/**
 * Peaks of y(x), x strictly ascending, sorted by position. A flat top counts once (its middle
 * sample). Peaks at the first or last sample are not reported: their prominence is unknown.
 */
export function findSpectrumPeaks(x: ArrayLike<number>, yRaw: ArrayLike<number>, opts: PeakOptions = {}): SpectrumPeak[] {
  const n = x.length
  if (yRaw.length !== n) throw new InputError('y', `has ${yRaw.length} values for ${n} positions`)
  for (let i = 1; i < n; i++) if (!(x[i]! > x[i - 1]!)) throw new InputError('x', `must be strictly ascending (sample ${i})`)
  if (n < 3) return []
  const y = (opts.smooth ?? 1) > 1 ? movingAverage(yRaw, opts.smooth!) : Float64Array.from(yRaw)
  let lo = Infinity
  let hi = -Infinity
  for (const v of y) {
    lo = Math.min(lo, v)
    hi = Math.max(hi, v)
  }
  const minProm = opts.minProminence ?? (opts.minProminenceFraction ?? 0.05) * (hi - lo)
  const out: SpectrumPeak[] = []
  for (let i = 1; i < n - 1;) {
    if (!(y[i]! > y[i - 1]!)) {
      i++
      continue
    }
    let j = i
    while (j + 1 < n && y[j + 1] === y[i]) j++
    if (j + 1 >= n || !(y[j + 1]! < y[i]!)) {
      i = j + 1
      continue
    }
    const top = Math.floor((i + j) / 2)
    const h = y[top]!
    let left = h
    for (let k = i - 1; k >= 0 && y[k]! <= h; k--) left = Math.min(left, y[k]!)
    let right = h
    for (let k = j + 1; k < n && y[k]! <= h; k++) right = Math.min(right, y[k]!)
    const prominence = h - Math.max(left, right)
    if (prominence > 0 && prominence >= minProm) {
      const [px, py] = i === j ? refine(x, y, top) : [x[top]!, h]
      out.push({ x: px, y: py, index: top, prominence })
    }
    i = j + 1
  }
  return out
}

export interface LevelRef { E_eV: number, label: string }
export interface PeakMatch { peak_eV: number, level: LevelRef | null, diff_meV: number | null }

/** Each peak (eV) with the nearest level and peak − level in meV; null when there are no levels. */
export function matchPeaksToLevels(peaks_eV: readonly number[], levels: readonly LevelRef[]): PeakMatch[] {
  return peaks_eV.map((p) => {
    let best: LevelRef | null = null
    for (const l of levels) if (!best || Math.abs(l.E_eV - p) < Math.abs(best.E_eV - p)) best = l
    return { peak_eV: p, level: best, diff_meV: best ? (p - best.E_eV) * 1000 : null }
  })
}
