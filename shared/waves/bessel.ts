// Bessel functions J_m(x), Y_m(x) of real argument and integer order m ≥ 0 (DLMF ch. 10):
// Miller's backward recurrence with Neumann-series Y0/Y1 below x = 25, Hankel's asymptotic
// expansion above. Accuracy (tests/unit/waves): |error| ≲ 1e-15 absolute for J against a 70-digit
// power series; zeros j_{m,n} agree with Abramowitz & Stegun Table 9.5 to all 10 printed digits.
//
// Why not rational minimax fits: the recurrence gives all orders in one pass and needs no table
// of transcribed coefficients; at x < 25 it costs ≈ 60 multiply-adds, about 0.1 µs.

const TWO_OVER_PI = 2 / Math.PI
const EULER_GAMMA = 0.5772156649015329
const SQRT1_2 = Math.SQRT1_2
/** Above this argument Hankel's expansion converges to < 1e-17 before its terms turn (DLMF 10.17). */
export const ASYMPTOTIC_MIN_X = 25
const RESCALE_ABOVE = 1e250
const RESCALE_BY = 1e-250

/**
 * Top order of Miller's backward recurrence (even), chosen so that the neglected minimal
 * solution is below double precision: from Debye's form J_N(x) ~ exp(−N(α − tanh α)),
 * sech α = x/N, the margin N − max(m, x) ≈ 8·max(m, x)^(1/3) + 12 suffices (checked in tests).
 */
export function millerStart(x: number, m: number): number {
  const top = Math.max(m, x)
  const n = Math.ceil(top + 8 * Math.cbrt(top) + 12)
  return n + (n & 1)
}

/** [J0, J1, Y0, Y1](x) for 0 < x < 25 by one backward recurrence (DLMF §10.74(iv)), normalised by
 * 1 = J0 + 2ΣJ_2k; Y from Neumann's series Y0 = (2/π)(ln(x/2)+γ)J0 − (4/π)Σ(−1)^k J_2k/k and its
 * derivative Y1 = −Y0' (Abramowitz & Stegun §9.1). */
function jy01Miller(x: number, out: Float64Array): void {
  const N = millerStart(x, 1)
  const w = 2 / x
  let jp = 0 // J_{k+1}
  let jc = 1 // J_k, arbitrary start
  let norm = 0
  let s0 = 0 // Σ_{k≥1} (−1)^k J_2k / k
  let s1 = 0 // Σ_{k≥1} (−1)^k (J_{2k−1} − J_{2k+1}) / k, gathered per odd index
  for (let k = N; k >= 1; k--) {
    if (k & 1) {
      const h = (k + 1) >> 1
      let c = (h & 1 ? -1 : 1) / h
      if (k >= 3) {
        const l = (k - 1) >> 1
        c -= (l & 1 ? -1 : 1) / l
      }
      s1 += c * jc
    }
    else {
      const h = k >> 1
      norm += 2 * jc
      s0 += ((h & 1 ? -1 : 1) * jc) / h
    }
    const jn = k * w * jc - jp
    jp = jc
    jc = jn
    if (Math.abs(jc) > RESCALE_ABOVE) {
      jc *= RESCALE_BY
      jp *= RESCALE_BY
      norm *= RESCALE_BY
      s0 *= RESCALE_BY
      s1 *= RESCALE_BY
    }
  }
  norm += jc
  const j0 = jc / norm
  const j1 = jp / norm
  const lg = Math.log(x / 2) + EULER_GAMMA
  out[0] = j0
  out[1] = j1
  out[2] = TWO_OVER_PI * (lg * j0 - (2 * s0) / norm)
  out[3] = TWO_OVER_PI * (-j0 / x + lg * j1 + s1 / norm)
}

/** Hankel's expansion (DLMF 10.17.3): P and Q for order ν, μ = 4ν², written to out[0], out[1]. */
function hankelPQ(mu: number, x: number, out: Float64Array): void {
  let t = 1
  let p = 1
  let q = 0
  for (let k = 1; k < 80; k++) {
    const r = 2 * k - 1
    t *= (mu - r * r) / (8 * k * x)
    const sign = ((k >> 1) & 1) ? -1 : 1
    if (k & 1) q += sign * t
    else p += sign * t
    if (Math.abs(t) < 1e-17) break
  }
  out[0] = p
  out[1] = q
}

// Scratch buffers: used synchronously inside one call, never carry data between calls.
const pq = new Float64Array(2)

/** [J0, J1, Y0, Y1](x) for x ≥ 25 from Hankel's expansion (DLMF 10.17.3–4). */
function jy01Asymptotic(x: number, out: Float64Array): void {
  const s = Math.sqrt(TWO_OVER_PI / x)
  const c = Math.cos(x)
  const sn = Math.sin(x)
  // cos/sin of χ0 = x − π/4 and χ1 = x − 3π/4, from one cos/sin of x
  const c0 = (c + sn) * SQRT1_2
  const s0 = (sn - c) * SQRT1_2
  const c1 = (sn - c) * SQRT1_2
  const s1 = -(sn + c) * SQRT1_2
  hankelPQ(0, x, pq)
  const p0 = pq[0]!
  const q0 = pq[1]!
  hankelPQ(4, x, pq)
  const p1 = pq[0]!
  const q1 = pq[1]!
  out[0] = s * (p0 * c0 - q0 * s0)
  out[1] = s * (p1 * c1 - q1 * s1)
  out[2] = s * (p0 * s0 + q0 * c0)
  out[3] = s * (p1 * s1 + q1 * c1)
}

/** Writes [J0(x), J1(x), Y0(x), Y1(x)] for x > 0 into out (length ≥ 4). */
export function besselJY01(x: number, out: Float64Array): void {
  if (x >= ASYMPTOTIC_MIN_X) jy01Asymptotic(x, out)
  else jy01Miller(x, out)
}

/** [J_m(x), J_{m+1}(x)] for x > 0 by Miller's recurrence normalised with 1 = J0 + 2ΣJ_2k. */
function millerPair(m: number, x: number, out: Float64Array): void {
  const N = millerStart(x, m + 1)
  const w = 2 / x
  let jp = 0
  let jc = 1
  let norm = 0
  let jm = 0
  let jm1 = 0
  for (let k = N; k >= 1; k--) {
    if (k === m + 1) jm1 = jc
    else if (k === m) jm = jc
    if ((k & 1) === 0) norm += 2 * jc
    const jn = k * w * jc - jp
    jp = jc
    jc = jn
    if (Math.abs(jc) > RESCALE_ABOVE) {
      jc *= RESCALE_BY
      jp *= RESCALE_BY
      norm *= RESCALE_BY
      jm *= RESCALE_BY
      jm1 *= RESCALE_BY
    }
  }
  if (m === 0) jm = jc
  norm += jc
  out[0] = jm / norm
  out[1] = jm1 / norm
}

const scratch4 = new Float64Array(4)

/**
 * [J_m(x), J_{m+1}(x)] for integer m ≥ 0 and x ≥ 0, written to out. Forward recurrence
 * J_{k+1} = (2k/x)J_k − J_{k−1} (stable while k < x) from the asymptotic J0, J1 when x ≥ 25 and
 * m + 1 < x; Miller's backward recurrence otherwise.
 */
export function besselJPair(m: number, x: number, out: Float64Array): void {
  if (x === 0) {
    out[0] = m === 0 ? 1 : 0
    out[1] = 0
    return
  }
  if (x >= ASYMPTOTIC_MIN_X && m + 1 < x) {
    jy01Asymptotic(x, scratch4)
    let a = scratch4[0]!
    let b = scratch4[1]!
    for (let k = 1; k <= m; k++) {
      const c = ((2 * k) / x) * b - a
      a = b
      b = c
    }
    out[0] = a
    out[1] = b
    return
  }
  millerPair(m, x, out)
}

const pair = new Float64Array(2)

/** J_m(x), first-kind Bessel function of integer order m ≥ 0 and real x (J_m(−x) = (−1)^m J_m(x)). */
export function besselJ(m: number, x: number): number {
  if (!Number.isInteger(m) || m < 0) return Number.NaN
  if (Number.isNaN(x)) return Number.NaN
  if (!Number.isFinite(x)) return 0
  if (x < 0) return (m & 1 ? -1 : 1) * besselJ(m, -x)
  if (m <= 1 && x > 0) {
    besselJY01(x, scratch4)
    return scratch4[m]!
  }
  besselJPair(m, x, pair)
  return pair[0]!
}

/** Y_m(x), second-kind Bessel function of integer order m ≥ 0 and x > 0, by the forward recurrence
 * Y_{k+1} = (2k/x)Y_k − Y_{k−1}, which is stable for Y at every order (DLMF 10.74(iv)). */
export function besselY(m: number, x: number): number {
  if (!Number.isInteger(m) || m < 0 || Number.isNaN(x) || x < 0) return Number.NaN
  if (x === 0) return Number.NEGATIVE_INFINITY
  if (!Number.isFinite(x)) return 0
  besselJY01(x, scratch4)
  let a = scratch4[2]!
  let b = scratch4[3]!
  if (m === 0) return a
  for (let k = 1; k < m; k++) {
    const c = ((2 * k) / x) * b - a
    a = b
    b = c
  }
  return b
}

/** H0⁽¹⁾(x) = J0(x) + i·Y0(x) for real x > 0, written to out as [re, im]. */
export function hankel1Zero(x: number, out: Float64Array): void {
  besselJY01(x, scratch4)
  out[0] = scratch4[0]!
  out[1] = scratch4[2]!
}
