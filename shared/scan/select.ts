// Order statistics in O(n) average time: Hoare's quickselect (C. A. R. Hoare, "Algorithm 65:
// Find", CACM 4, 321 (1961)) with a median-of-three pivot; percentiles interpolate linearly
// between order statistics (the "type 7" rule of Hyndman & Fan, Am. Stat. 50, 361 (1996)).

export type NumArray = Float32Array | Float64Array

/** Reorders `a[lo..hi]` so that `a[k]` holds the k-th smallest value, and returns it. */
export function selectInPlace(a: NumArray, k: number, lo = 0, hi = a.length - 1): number {
  while (hi > lo) {
    const mid = (lo + hi) >>> 1
    // Median of three keeps sorted or constant runs from going quadratic.
    if (a[mid]! < a[lo]!) swap(a, mid, lo)
    if (a[hi]! < a[lo]!) swap(a, hi, lo)
    if (a[hi]! < a[mid]!) swap(a, hi, mid)
    const pivot = a[mid]!
    let i = lo
    let j = hi
    while (i <= j) {
      while (a[i]! < pivot) i++
      while (a[j]! > pivot) j--
      if (i <= j) {
        swap(a, i, j)
        i++
        j--
      }
    }
    if (k <= j) hi = j
    else if (k >= i) lo = i
    else return a[k]!
  }
  return a[k]!
}

function swap(a: NumArray, i: number, j: number) {
  const t = a[i]!
  a[i] = a[j]!
  a[j] = t
}

/** Quantile q ∈ [0, 1] of `a` (type 7: linear between order statistics). Reorders `a`. */
export function quantileInPlace(a: NumArray, q: number): number {
  const n = a.length
  if (n === 0) return Number.NaN
  const pos = Math.min(Math.max(q, 0), 1) * (n - 1)
  const k = Math.floor(pos)
  const lower = selectInPlace(a, k)
  const frac = pos - k
  if (frac === 0 || k + 1 >= n) return lower
  // After selection every element right of k is ≥ a[k]; the next order statistic is their minimum.
  let upper = Number.POSITIVE_INFINITY
  for (let i = k + 1; i < n; i++) if (a[i]! < upper) upper = a[i]!
  return lower + frac * (upper - lower)
}

/** Median of `a` (mean of the two middle values for even n). Reorders `a`. */
export function medianInPlace(a: NumArray): number {
  return quantileInPlace(a, 0.5)
}

/**
 * Copies the finite values of `values` into a Float64Array, taking every `stride`-th one so that
 * at most about `maxSamples` remain (a strided subsample; exact when `maxSamples` ≥ length).
 */
export function finiteSample(values: ArrayLike<number>, maxSamples = Number.POSITIVE_INFINITY): Float64Array {
  const n = values.length
  const stride = Math.max(1, Math.ceil(n / maxSamples))
  const out = new Float64Array(Math.ceil(n / stride))
  let m = 0
  for (let i = 0; i < n; i += stride) {
    const v = values[i]!
    if (Number.isFinite(v)) out[m++] = v
  }
  return out.subarray(0, m)
}
