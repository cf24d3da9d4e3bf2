// Zeros j_{m,n} of J_m (DLMF §10.21): bracketed by a sign scan, refined by safeguarded Halley
// iteration using J_m' = (m/x)J_m − J_{m+1} and Bessel's equation for J_m''.
// Agrees with Abramowitz & Stegun Table 9.5 to all ten printed decimals (tests/unit/waves).
import { besselJPair } from './bessel'

/**
 * Scan step. Consecutive zeros of J_m are more than π apart for m ≥ 1 and more than 3.11 apart
 * for m = 0 (DLMF §10.21(i)–(ii)), so a step of 2.5 holds at most one zero and a sign change
 * brackets it exactly. J_m has no zero below x = m (j_{m,1} > m), so the scan starts there.
 */
const SCAN_STEP = 2.5

const pair = new Float64Array(2)

/** Refines the single zero of J_m in [lo, hi] (f(lo)·f(hi) ≤ 0) to full double precision. */
function refineZero(m: number, lo: number, hi: number, flo: number, fhi: number): number {
  if (flo === 0) return lo
  if (fhi === 0) return hi
  let x = lo - (flo * (hi - lo)) / (fhi - flo)
  for (let it = 0; it < 60; it++) {
    besselJPair(m, x, pair)
    const f = pair[0]!
    if (f === 0) return x
    if ((f > 0) === (flo > 0)) {
      lo = x
      flo = f
    }
    else hi = x
    const fp = (m / x) * f - pair[1]!
    const fpp = -fp / x - (1 - (m * m) / (x * x)) * f
    const newton = -f / fp
    let next = x + newton / (1 - (0.5 * newton * fpp) / fp)
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi)
    const step = Math.abs(next - x)
    x = next
    if (step <= 2e-16 * x || hi - lo <= 4e-16 * x) break
  }
  return x
}

/**
 * Zeros of J_m in increasing order: the first `count` of them, or (with `below`) all that are
 * ≤ below. j_{m,n} = the n-th positive zero (n = 1, 2, …), as in A&S Table 9.5.
 */
export function besselJZeros(m: number, opts: { count?: number, below?: number }): number[] {
  if (!Number.isInteger(m) || m < 0) throw new RangeError(`order m must be an integer ≥ 0, got ${m}`)
  const count = opts.count ?? Number.POSITIVE_INFINITY
  const below = opts.below ?? Number.POSITIVE_INFINITY
  if (!Number.isFinite(count) && !Number.isFinite(below)) throw new RangeError('give count or below')
  const zeros: number[] = []
  let a = m
  besselJPair(m, a, pair)
  let fa = m === 0 ? 1 : pair[0]!
  while (zeros.length < count) {
    if (a > below) break
    const b = a + SCAN_STEP
    besselJPair(m, b, pair)
    const fb = pair[0]!
    if (fb === 0 || (fa > 0) !== (fb > 0)) {
      const z = refineZero(m, a, b, fa, fb)
      if (z > below) break
      zeros.push(z)
      if (fb === 0) {
        // the zero sits on the grid point; step just past it so the next bracket is clean
        a = b + 1e-9
        besselJPair(m, a, pair)
        fa = pair[0]!
        continue
      }
    }
    a = b
    fa = fb
  }
  return zeros
}

/** j_{m,n}, the n-th positive zero of J_m (n ≥ 1). */
export function besselJZero(m: number, n: number): number {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`zero index n must be an integer ≥ 1, got ${n}`)
  return besselJZeros(m, { count: n })[n - 1]!
}
