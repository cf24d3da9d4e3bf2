// Orientation search for a lattice fit by phase coherence of short mark-to-mark difference vectors:
// C(N) = Σ_G w_G Σ_pairs cos(2π G·N·d) / (Σ w · pairs), N the scan → ideal map. For marks on one
// site lattice every short d is a lattice vector, so C = 1 at the true N (the pair form of
// |Σ exp(2πi G·x)|²); short pairs keep the peak broad, so drift of a few % does not split it.
import type { Vec2 } from './vec'

export interface RecipVector { gx: number, gy: number, w: number }

/**
 * Reciprocal vectors G = h·b1 + k·b2 (a_i·b_j = δ_ij) with |G| ≤ 2·|G_min|, one of each ±G pair,
 * weighted by |F(G)|²·(G_min/|G|)², F the basis structure factor: for a single site type every G
 * counts; for bridge sites the orders where the basis interferes destructively drop out. No two
 * vectors of this range have equal length unless related by the cell's symmetry, so no spurious
 * coincidence rotation scores.
 */
export function reciprocalSet(a1: Vec2, a2: Vec2, basis: Vec2[]): RecipVector[] {
  const det = a1[0] * a2[1] - a1[1] * a2[0]
  const b1: Vec2 = [a2[1] / det, -a2[0] / det]
  const b2: Vec2 = [-a1[1] / det, a1[0] / det]
  const cands: { gx: number, gy: number, len: number, f2: number }[] = []
  for (let h = -2; h <= 2; h++) {
    for (let k = -2; k <= 2; k++) {
      if (h < 0 || (h === 0 && k <= 0)) continue
      const gx = h * b1[0] + k * b2[0]
      const gy = h * b1[1] + k * b2[1]
      let re = 0, im = 0
      for (const s of basis) {
        const ph = 2 * Math.PI * (gx * s[0] + gy * s[1])
        re += Math.cos(ph)
        im += Math.sin(ph)
      }
      const f2 = (re * re + im * im) / (basis.length * basis.length)
      if (f2 > 0.01) cands.push({ gx, gy, len: Math.hypot(gx, gy), f2 })
    }
  }
  const gmin = Math.min(...cands.map(c => c.len))
  return cands.filter(c => c.len <= 2.001 * gmin).map(c => ({ gx: c.gx, gy: c.gy, w: c.f2 * (gmin / c.len) ** 2 }))
}

export type Mat2 = [number, number, number, number]

/** Pair coherence for a linear map N = [n11, n12, n21, n22] (scan → ideal); d interleaved (dx, dy). */
export function pairCoherence(d: Float64Array, G: RecipVector[], N: Mat2): number {
  const [n11, n12, n21, n22] = N
  const n = d.length >> 1
  if (n === 0) return 0
  let total = 0, wsum = 0
  for (const g of G) {
    // G·(N·d) = (Nᵀ·G)·d
    const kx = 2 * Math.PI * (g.gx * n11 + g.gy * n21)
    const ky = 2 * Math.PI * (g.gx * n12 + g.gy * n22)
    let s = 0
    for (let m = 0; m < n; m++) s += Math.cos(kx * d[2 * m]! + ky * d[2 * m + 1]!)
    total += g.w * s
    wsum += g.w
  }
  return total / (wsum * n)
}

export function rotationInverse(theta_rad: number, s: number): Mat2 {
  const c = Math.cos(theta_rad) / s, sn = Math.sin(theta_rad) / s
  return [c, sn, -sn, c]
}

export interface Orientation { theta_rad: number, score: number }

function maxLength(d: Float64Array): number {
  let R = 0
  for (let m = 0; m < d.length >> 1; m++) R = Math.max(R, Math.hypot(d[2 * m]!, d[2 * m + 1]!))
  return R
}

/**
 * Orientation maxima over θ ∈ [−period/2, period/2) at the handbook scale (or ±3° around a hint).
 * Pairs must come sorted by length. A coarse grid uses the 400 shortest pairs (broad peaks, few
 * steps, strongest orders only); each of the 4 best maxima scoring ≥ 0.4 × the best is rescanned with up to 1500 pairs over ± one coarse step and polished
 * by step halving. Step: phase change ≲ 0.2 rad at the longest pair used, dθ = 0.03/(|d|max·|G|max).
 */
export function searchOrientation(d: Float64Array, G: RecipVector[], opts: { period_deg: number, hint_deg?: number, candidates?: number }): Orientation[] {
  const gmax = Math.max(...G.map(g => Math.hypot(g.gx, g.gy)))
  const period = opts.period_deg * Math.PI / 180
  const span = opts.hint_deg === undefined ? period : Math.min(period, 6 * Math.PI / 180)
  const lo = opts.hint_deg === undefined ? -period / 2 : opts.hint_deg * Math.PI / 180 - span / 2
  const coarse = d.subarray(0, Math.min(d.length, 2 * 400))
  // The coarse grid only needs the strongest orders (the first shell for single-site types).
  const wmax = Math.max(...G.map(g => g.w))
  const Gc = G.filter(g => g.w >= 0.5 * wmax)
  let step = Math.min(0.5 * Math.PI / 180, 0.03 / Math.max(1e-9, maxLength(coarse) * gmax))
  const steps = Math.min(4000, Math.max(24, Math.ceil(span / step)))
  step = span / steps
  const scores = new Float64Array(steps)
  for (let k = 0; k < steps; k++) scores[k] = pairCoherence(coarse, Gc, rotationInverse(lo + k * step, 1))
  const circular = opts.hint_deg === undefined
  const peaks: number[] = []
  for (let k = 0; k < steps; k++) {
    const prev = k > 0 ? scores[k - 1]! : circular ? scores[steps - 1]! : -Infinity
    const next = k < steps - 1 ? scores[k + 1]! : circular ? scores[0]! : -Infinity
    if (scores[k]! >= prev && scores[k]! > next) peaks.push(k)
  }
  peaks.sort((a, b) => scores[b]! - scores[a]!)
  const dFine = d.subarray(0, Math.min(d.length, 2 * 1500))
  const fine = Math.min(step, 0.03 / Math.max(1e-9, maxLength(dFine) * gmax))
  const nFine = Math.min(24, Math.ceil(step / fine))
  // Rescan only maxima that can compete: a true orientation scores far above spurious ones.
  const kept = peaks.slice(0, Math.max(4, opts.candidates ?? 3)).filter(k => scores[k]! >= 0.4 * scores[peaks[0]!]!)
  const out = kept.map((k) => {
    const c = lo + k * step
    let th = c
    let best = -Infinity
    for (let m = -nFine; m <= nFine; m++) {
      const t2 = c + (m * step) / nFine
      const v = pairCoherence(dFine, G, rotationInverse(t2, 1))
      if (v > best) {
        best = v
        th = t2
      }
    }
    for (let dth = step / nFine / 2; dth > 1e-5; dth /= 2) {
      for (const t2 of [th + dth, th - dth]) {
        const v = pairCoherence(dFine, G, rotationInverse(t2, 1))
        if (v > best) {
          best = v
          th = t2
        }
      }
    }
    return { theta_rad: th, score: best }
  })
  out.sort((a, b) => b.score - a.score)
  return out.slice(0, opts.candidates ?? 3)
}

/**
 * Pattern search over the four entries of N from a rigid start, maximising the pair coherence:
 * takes up anisotropic scale and shear (drift, creep) before any index is assigned. Returns M = N⁻¹.
 */
export function refineLinear(d: Float64Array, G: RecipVector[], theta_rad: number): { M: Mat2, score: number } {
  let N = rotationInverse(theta_rad, 1)
  let best = pairCoherence(d, G, N)
  for (let step = 0.005; step > 2e-4;) {
    let moved = false
    for (let k = 0; k < 4; k++) {
      for (const dir of [1, -1]) {
        const trial: Mat2 = [...N]
        trial[k] = trial[k]! + dir * step
        const v = pairCoherence(d, G, trial)
        if (v > best) {
          best = v
          N = trial
          moved = true
        }
      }
    }
    if (!moved) step /= 2
  }
  const det = N[0] * N[3] - N[1] * N[2]
  return { M: [N[3] / det, -N[1] / det, -N[2] / det, N[0] / det], score: best }
}
