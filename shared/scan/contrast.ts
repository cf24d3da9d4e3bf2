// Display contrast: a fixed-bin histogram, a percentile range (type-7 quantiles), and robust
// location/scale — median and median absolute deviation, scaled by 1.4826 ≈ 1/Φ⁻¹(3/4) so that
// it estimates σ for normal data (Rousseeuw & Croux, J. Am. Stat. Assoc. 88, 1273 (1993)).
import { InputError } from '../errors'
import { finiteSample, medianInPlace, quantileInPlace } from './select'

export interface Histogram {
  counts: Uint32Array
  min: number
  max: number
  binWidth: number
  /** Finite values below `min` / above `max` (only when a range was given), and non-finite ones. */
  below: number
  above: number
  nonFinite: number
}

/** Counts values into `bins` equal bins over [min, max] (the data's own finite range by default). */
export function histogram(values: ArrayLike<number>, bins = 256, range?: { min: number, max: number }): Histogram {
  if (!Number.isInteger(bins) || bins < 1 || bins > 65536) throw new InputError('bins', 'bins must be a whole number from 1 to 65536')
  let min = range?.min ?? Number.POSITIVE_INFINITY
  let max = range?.max ?? Number.NEGATIVE_INFINITY
  if (range) {
    if (!Number.isFinite(min) || !Number.isFinite(max) || !(max >= min)) throw new InputError('range', 'range needs finite min ≤ max')
  }
  else {
    for (let i = 0; i < values.length; i++) {
      const v = values[i]!
      if (v < min) min = v
      if (v > max) max = v
    }
    if (!Number.isFinite(min)) {
      min = 0
      max = 0
    }
  }
  const counts = new Uint32Array(bins)
  const span = max - min
  const scale = span > 0 ? bins / span : 0
  let below = 0
  let above = 0
  let nonFinite = 0
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!
    if (!Number.isFinite(v)) {
      nonFinite++
      continue
    }
    if (v < min) {
      below++
      continue
    }
    if (v > max) {
      above++
      continue
    }
    // The top edge belongs to the last bin so that max itself is counted.
    const b = Math.min(bins - 1, Math.floor((v - min) * scale))
    counts[b]!++
  }
  return { counts, min, max, binWidth: span / bins, below, above, nonFinite }
}

/**
 * The values at the `low_pct` and `high_pct` percentiles (e.g. 0.5 and 99.5), for a display range
 * that ignores a few outliers. Exact unless `maxSamples` asks for a strided subsample.
 */
export function percentileRange(values: ArrayLike<number>, low_pct = 0.5, high_pct = 99.5, opts: { maxSamples?: number } = {}): { lo: number, hi: number } {
  if (!(low_pct >= 0 && low_pct <= 100)) throw new InputError('low_pct', 'low_pct must lie between 0 and 100')
  if (!(high_pct >= 0 && high_pct <= 100)) throw new InputError('high_pct', 'high_pct must lie between 0 and 100')
  if (!(low_pct <= high_pct)) throw new InputError('low_pct', 'low_pct must not exceed high_pct')
  const sample = finiteSample(values, opts.maxSamples)
  if (sample.length === 0) return { lo: Number.NaN, hi: Number.NaN }
  const lo = quantileInPlace(sample, low_pct / 100)
  const hi = quantileInPlace(sample, high_pct / 100)
  return { lo, hi }
}

export interface RobustStats {
  median: number
  /** Median absolute deviation from the median. */
  mad: number
  /** 1.4826 · MAD: the normal-consistent estimate of the standard deviation. */
  sigma: number
  n: number
}

export const MAD_TO_SIGMA = 1.4826

export function robustStats(values: ArrayLike<number>, opts: { maxSamples?: number } = {}): RobustStats {
  const sample = finiteSample(values, opts.maxSamples)
  const n = sample.length
  if (n === 0) return { median: Number.NaN, mad: Number.NaN, sigma: Number.NaN, n }
  const median = medianInPlace(sample)
  for (let i = 0; i < n; i++) sample[i] = Math.abs(sample[i]! - median)
  const mad = medianInPlace(sample)
  return { median, mad, sigma: MAD_TO_SIGMA * mad, n }
}
