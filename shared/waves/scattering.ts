// s-wave multiple scattering of surface-state electrons by point adatoms (Heller, Crommie, Lutz,
// Eigler, Nature 369, 464 (1994); Fiete & Heller, Rev. Mod. Phys. 75, 933 (2003)).
//
// Free 2-D Green's function G0(r, r′; E) = −(i m*/2ħ²)·H0⁽¹⁾(k|r − r′|), k = √((E − E0)/(ħ²/2m*)).
// Each adatom scatters the m = 0 partial wave with amplitude a = ½(e^{2iδ0} − 1), i.e. t-matrix
// t = (2iħ²/m*)·a, so that t·G0 = a·H0⁽¹⁾. With h_i(r) = H0⁽¹⁾(k|r − R_i|) and the matrix
// M = I − a·H̃ (H̃_ij = H0⁽¹⁾(k|R_i − R_j|) for i ≠ j, 0 on the diagonal), the full Green's function is
//   G(r, r) = G0(r, r) + G0-prefactor · a · hᵀ M⁻¹ h        (T = t(I − aH̃)⁻¹, symmetric)
// and the LDOS ρ = −Im G/π. Normalisation used throughout: ρ / ρ∞ with ρ∞ = m* / (2πħ²), the
// clean-surface DOS per spin, so that
//   ρ(r, E)/ρ∞ = ρ_clean(E)/ρ∞ + Re(a · hᵀ M⁻¹ h)
// which tends to 1 far from the scatterers above the band bottom (without broadening).
//
// Broadening Γ (HWHM): the Green's functions are taken at the complex energy E + iΓ (k in the
// first quadrant). For the clean part this is exactly a Lorentzian convolution of the step:
// ρ_clean/ρ∞ = 1 − (2/π)·arg k = ½ + atan((E − E0)/Γ)/π.
// Below the band bottom without broadening (E ≤ E0, Γ = 0) the surface state has no states: the
// LDOS is set to 0 (the constant-δ0 model would otherwise give a spurious evanescent K0 term).
// Complex numbers live in split Float64Arrays, not mathjs Complex objects: the solver alone is
// ≈ 100× faster that way (complex-lu.ts), and a 128² map makes 1.6 million Hankel calls.
import { hankel1Zero } from './bessel'
import { hankel1ZeroComplex } from './hankel-complex'
import { kineticPrefactor_eVnm2 } from './constants'
import { luFactor, luInverse, luSolve } from './complex-lu'

/** Distances below this (nm) are clamped: the point-scatterer model's log singularity at the
 * adatom itself carries no meaning inside the atom. */
export const MIN_DISTANCE_nm = 0.02

export interface Complex { re: number, im: number }

/** a = ½(e^{2iδ0} − 1) for a complex phase shift δ0 (radians). δ0 = π/2: a = −1 (hard elastic). */
export function amplitudeFromPhaseShift(delta0: Complex): Complex {
  const mag = Math.exp(-2 * delta0.im)
  return { re: 0.5 * (mag * Math.cos(2 * delta0.re) - 1), im: 0.5 * mag * Math.sin(2 * delta0.re) }
}

/** The "black dot" of Heller et al.: Im δ0 → ∞, e^{2iδ0} → 0, a = −½ (fully absorbing). */
export const BLACK_DOT: Complex = { re: -0.5, im: 0 }

/** k (1/nm) at complex energy E + iΓ: principal √((E − E0 + iΓ)/(ħ²/2m*)), Re k ≥ 0, Im k ≥ 0. */
export function waveNumber(E_eV: number, hwhm_eV: number, E0_eV: number, m_eff: number): Complex {
  const pref = kineticPrefactor_eVnm2(m_eff)
  const zr = (E_eV - E0_eV) / pref
  const zi = hwhm_eV / pref
  const mod = Math.hypot(zr, zi)
  const re = Math.sqrt(Math.max(0, (mod + zr) / 2))
  const im = Math.sqrt(Math.max(0, (mod - zr) / 2))
  return { re, im }
}

/** Whether the model has states at this k: false only for Γ = 0 at or below the band bottom. */
export function propagates(k: Complex): boolean {
  return k.re > 0
}

/** ρ_clean/ρ∞ = 1 − (2/π)·arg k (from Im H0⁽¹⁾ at r → 0); 1 above E0 without broadening. */
export function cleanLdosRatio(k: Complex): number {
  if (!propagates(k)) return 0
  return 1 - (2 / Math.PI) * Math.atan2(k.im, k.re)
}

/** H0⁽¹⁾(k·d) into out[o], out[o+1] (d clamped at MIN_DISTANCE_nm). */
export function hankelAt(k: Complex, d_nm: number, out: Float64Array): void {
  const d = d_nm < MIN_DISTANCE_nm ? MIN_DISTANCE_nm : d_nm
  if (k.im === 0) hankel1Zero(k.re * d, out)
  else hankel1ZeroComplex(k.re * d, k.im * d, out)
}

const h2 = new Float64Array(2)

/** M = I − a·H̃ (row-major, split re/im) for scatterers at xy = [x0, y0, x1, y1, …]. */
export function scatteringMatrix(xy: Float64Array, k: Complex, a: Complex): { n: number, re: Float64Array, im: Float64Array } {
  const n = xy.length / 2
  const re = new Float64Array(n * n)
  const im = new Float64Array(n * n)
  for (let i = 0; i < n; i++) {
    re[i * n + i] = 1
    for (let j = i + 1; j < n; j++) {
      hankelAt(k, Math.hypot(xy[2 * i]! - xy[2 * j]!, xy[2 * i + 1]! - xy[2 * j + 1]!), h2)
      const vr = -(a.re * h2[0]! - a.im * h2[1]!)
      const vi = -(a.re * h2[1]! + a.im * h2[0]!)
      re[i * n + j] = vr
      im[i * n + j] = vi
      re[j * n + i] = vr
      im[j * n + i] = vi
    }
  }
  return { n, re, im }
}

/** Fills h_i = H0⁽¹⁾(k|p − R_i|) for one point p. */
function fillH(xy: Float64Array, k: Complex, px: number, py: number, hr: Float64Array, hi: Float64Array): void {
  const n = hr.length
  for (let i = 0; i < n; i++) {
    hankelAt(k, Math.hypot(px - xy[2 * i]!, py - xy[2 * i + 1]!), h2)
    hr[i] = h2[0]!
    hi[i] = h2[1]!
  }
}

export class SingularSystemError extends Error {}

/**
 * Prepared system at one energy: W = M⁻¹ (symmetric, since H̃ is), for evaluating
 * ρ/ρ∞ = clean + Re(a·hᵀWh) at many points with a symmetric quadratic form (n(n+1)/2 products).
 */
export class ScatteringAtEnergy {
  readonly n: number
  readonly clean: number
  private readonly wr: Float64Array
  private readonly wi: Float64Array
  private readonly hr: Float64Array
  private readonly hi: Float64Array

  constructor(private readonly xy: Float64Array, private readonly k: Complex, private readonly a: Complex) {
    this.n = xy.length / 2
    this.clean = cleanLdosRatio(k)
    this.hr = new Float64Array(this.n)
    this.hi = new Float64Array(this.n)
    if (this.n === 0 || !propagates(k)) {
      this.wr = new Float64Array(0)
      this.wi = new Float64Array(0)
      return
    }
    const M = scatteringMatrix(xy, k, a)
    const piv = new Int32Array(this.n)
    if (!luFactor(this.n, M.re, M.im, piv)) throw new SingularSystemError('the multiple-scattering matrix is singular')
    const inv = luInverse(this.n, M.re, M.im, piv)
    this.wr = inv.re
    this.wi = inv.im
  }

  /** ρ/ρ∞ at (x, y), nm. */
  ldosRatio(x: number, y: number): number {
    if (!propagates(this.k)) return 0
    const n = this.n
    if (n === 0) return this.clean
    const { hr, hi, wr, wi } = this
    fillH(this.xy, this.k, x, y, hr, hi)
    let qr = 0
    let qi = 0
    for (let i = 0; i < n; i++) {
      const row = i * n
      // u = W_ii h_i + 2 Σ_{j>i} W_ij h_j
      let ur = wr[row + i]! * hr[i]! - wi[row + i]! * hi[i]!
      let ui = wr[row + i]! * hi[i]! + wi[row + i]! * hr[i]!
      let sr = 0
      let si = 0
      for (let j = i + 1; j < n; j++) {
        const ar = wr[row + j]!
        const ai = wi[row + j]!
        const br = hr[j]!
        const bi = hi[j]!
        sr += ar * br - ai * bi
        si += ar * bi + ai * br
      }
      ur += 2 * sr
      ui += 2 * si
      qr += hr[i]! * ur - hi[i]! * ui
      qi += hr[i]! * ui + hi[i]! * ur
    }
    return this.clean + (this.a.re * qr - this.a.im * qi)
  }
}

/** Map of ρ/ρ∞ on a px × px grid over extent [xmin, xmax, ymin, ymax]; row r, column c at
 * (xmin + (c+½)Δx, ymin + (r+½)Δy), row-major. */
export function scatteringMap(sys: ScatteringAtEnergy, px: number, extent: readonly [number, number, number, number]): Float64Array {
  const [x0, x1, y0, y1] = extent
  const dx = (x1 - x0) / px
  const dy = (y1 - y0) / px
  const out = new Float64Array(px * px)
  for (let r = 0; r < px; r++) {
    const y = y0 + (r + 0.5) * dy
    for (let c = 0; c < px; c++) out[r * px + c] = sys.ldosRatio(x0 + (c + 0.5) * dx, y)
  }
  return out
}

/** ρ/ρ∞ at one point for each energy: per energy one LU of M and one solve M·x = h, then
 * Re(a·hᵀx) (cheaper than an inverse when only one point is wanted). */
export function scatteringSpectrum(xy: Float64Array, point: readonly [number, number], energies_eV: ArrayLike<number>,
  p: { E0_eV: number, m_eff: number, hwhm_eV: number, a: Complex }): Float64Array {
  const n = xy.length / 2
  const out = new Float64Array(energies_eV.length)
  const hr = new Float64Array(n)
  const hi = new Float64Array(n)
  const xr = new Float64Array(n)
  const xi = new Float64Array(n)
  const piv = new Int32Array(n)
  for (let e = 0; e < out.length; e++) {
    const k = waveNumber(energies_eV[e]!, p.hwhm_eV, p.E0_eV, p.m_eff)
    if (!propagates(k)) {
      out[e] = 0
      continue
    }
    const clean = cleanLdosRatio(k)
    if (n === 0) {
      out[e] = clean
      continue
    }
    const M = scatteringMatrix(xy, k, p.a)
    if (!luFactor(n, M.re, M.im, piv)) throw new SingularSystemError(`the multiple-scattering matrix is singular at E = ${energies_eV[e]} eV`)
    fillH(xy, k, point[0], point[1], hr, hi)
    xr.set(hr)
    xi.set(hi)
    luSolve(n, M.re, M.im, piv, xr, xi)
    let qr = 0
    let qi = 0
    for (let i = 0; i < n; i++) {
      qr += hr[i]! * xr[i]! - hi[i]! * xi[i]!
      qi += hr[i]! * xi[i]! + hi[i]! * xr[i]!
    }
    out[e] = clean + (p.a.re * qr - p.a.im * qi)
  }
  return out
}
