import { describe, expect, it } from 'vitest'
import * as BESSEL from 'bessel'
import {
  BLACK_DOT, ScatteringAtEnergy, amplitudeFromPhaseShift, cleanLdosRatio, scatteringMap, scatteringSpectrum, waveNumber,
  type Complex,
} from '../../../shared/waves/scattering'
import { cleanDos2D_per_eVnm2 } from '../../../shared/waves/constants'
import { integrate } from './quadrature'

// Cu(111) surface state, E0 = −0.44 eV, m* = 0.38 (Crommie, Lutz, Eigler 1993,
// from memory); ħ²/(2m_e) = 0.0380998 eV·nm² (CODATA, derived).
const E0 = -0.44
const M = 0.38
const P = 0.0380998 / M // ħ²/(2m*), eV·nm²

/** H0⁽¹⁾(x) = J0 + iY0 from the npm `bessel` package (independent of the code under test). */
function h0pkg(x: number): Complex {
  return { re: BESSEL.besselj(x, 0), im: BESSEL.bessely(x, 0) }
}
const mul = (a: Complex, b: Complex): Complex => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re })
const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im })
const div = (a: Complex, b: Complex): Complex => {
  const d = b.re * b.re + b.im * b.im
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d }
}

function xyOf(pts: [number, number][]): Float64Array {
  return Float64Array.from(pts.flat())
}

describe('scatterer amplitude', () => {
  it('follows ½(e^{2iδ0} − 1): black dot −½, hard elastic δ0 = π/2 gives −1 (Heller, Crommie, Lutz, Eigler, Nature 369, 464 (1994))', () => {
    expect(BLACK_DOT).toEqual({ re: -0.5, im: 0 })
    const hard = amplitudeFromPhaseShift({ re: Math.PI / 2, im: 0 })
    expect(hard.re).toBeCloseTo(-1, 15)
    expect(hard.im).toBeCloseTo(0, 15)
    const nearBlack = amplitudeFromPhaseShift({ re: 0.3, im: 20 })
    expect(nearBlack.re).toBeCloseTo(-0.5, 15)
    expect(nearBlack.im).toBeCloseTo(0, 15)
  })
})

describe('clean surface', () => {
  it('has the constant 2-D DOS m*/(2πħ²) without scatterers, and 0 below E0', () => {
    const k = waveNumber(0, 0, E0, M)
    const sys = new ScatteringAtEnergy(new Float64Array(0), k, BLACK_DOT)
    const map = scatteringMap(sys, 4, [-1, 1, -1, 1])
    for (const v of map) expect(v).toBe(1)
    // ρ∞ in absolute units: m*/(2πħ²) = 1/(4π·ħ²/2m*) (free 2-D electron gas, textbook)
    expect(cleanDos2D_per_eVnm2(M)).toBeCloseTo(1 / (4 * Math.PI * P), 5)
    const s = scatteringSpectrum(new Float64Array(0), [0, 0], [-0.6, -0.45, -0.43, 0.2], { E0_eV: E0, m_eff: M, hwhm_eV: 0, a: BLACK_DOT })
    expect(Array.from(s)).toEqual([0, 0, 1, 1])
  })

  it('with broadening Γ is the Lorentzian-smeared step ½ + atan((E − E0)/Γ)/π', () => {
    // ∫_{E0}^∞ L_Γ(E − E′) dE′ = ½ + atan((E − E0)/Γ)/π (closed form of the convolution)
    const g = 0.03
    const E = [-0.7, -0.5, -0.44, -0.4, 0, 0.5]
    const s = scatteringSpectrum(new Float64Array(0), [0, 0], E, { E0_eV: E0, m_eff: M, hwhm_eV: g, a: BLACK_DOT })
    E.forEach((e, i) => expect(s[i]!).toBeCloseTo(0.5 + Math.atan((e - E0) / g) / Math.PI, 13))
  })
})

describe('single scatterer against the closed form', () => {
  // One scatterer at R: T = t, so G(r, r) = G0(r, r) + G0(r, R)·t·G0(R, r) and
  //   δρ(r) = −(1/π)·Im[t·G0(r − R)²].
  // With G0 = −(i m*/2ħ²)·H0⁽¹⁾(k|r − R|) and t = (2iħ²/m*)·a (so that t·G0 = a·H0⁽¹⁾):
  //   t·G0² = −(i m*/2ħ²)·a·H0⁽¹⁾², hence δρ = (m*/(2πħ²))·Re(a·H0⁽¹⁾²) = ρ∞·Re(a·H0⁽¹⁾(k|r − R|)²).
  // Far away H0⁽¹⁾² ≈ (2/(πkr))·(−i)e^{2ikr}: the black dot gives δρ/ρ∞ ≈ −sin(2kr)/(πkr), the
  // 1/r Friedel-like decay of a 2-D point defect.
  const R0: [number, number] = [0.3, -0.2]
  for (const [label, a] of [['black dot', BLACK_DOT], ['hard elastic δ0 = π/2', amplitudeFromPhaseShift({ re: Math.PI / 2, im: 0 })],
    ['complex δ0 = 0.7 + 0.4i', amplitudeFromPhaseShift({ re: 0.7, im: 0.4 })]] as const) {
    it(`matches ρ∞·(1 + Re(a·H0⁽¹⁾²)) for the ${label} (H0 from the npm bessel package)`, () => {
      for (const E of [-0.3, 0, 0.25]) {
        const k = waveNumber(E, 0, E0, M)
        expect(k.re).toBeCloseTo(Math.sqrt((E - E0) / P), 4)
        const sys = new ScatteringAtEnergy(xyOf([R0]), k, a)
        for (const [x, y] of [[1, 1], [-2.5, 0.4], [0.3, 4], [7, -6]] as const) {
          const d = Math.hypot(x - R0[0], y - R0[1])
          const h = h0pkg(k.re * d)
          const want = 1 + mul(a, mul(h, h)).re
          expect(Math.abs(sys.ldosRatio(x, y) - want)).toBeLessThan(2e-7)
        }
      }
    })
  }

  it('decays like −sin(2kr)/(πkr) far from a black dot', () => {
    const k = waveNumber(0, 0, E0, M)
    const sys = new ScatteringAtEnergy(xyOf([[0, 0]]), k, BLACK_DOT)
    for (const r of [20, 35.5, 60]) {
      const kr = k.re * r
      // next order of Hankel's expansion is O((kr)^-2): allow 1/(kr)²
      expect(Math.abs(sys.ldosRatio(r, 0) - 1 + Math.sin(2 * kr) / (Math.PI * kr))).toBeLessThan(1 / (kr * kr))
    }
  })

  it('with broadening equals the Lorentzian convolution of the sharp result (complex energy E + iΓ)', () => {
    // The scattered part F(E) = a·H0⁽¹⁾(k(E)d)² is analytic in the upper half E-plane and → 0 there,
    // so Re F(E + iΓ) = ∫ Re F(E′) L_Γ(E − E′) dE′ (Poisson integral). Below E0 the sharp model
    // continues as k = iκ, H0⁽¹⁾(iκd) = −(2i/π)K0(κd) (DLMF 10.27.8). The right side is integrated
    // numerically with J0, Y0, K0 from the npm bessel package, in s with E′ − E0 = ±s² so that the
    // √ and log² behaviour at the band bottom is smooth.
    const g = 0.05
    const d = 1.3
    const a = BLACK_DOT
    const sharp = (eps: number): number => {
      if (eps > 0) {
        const h = h0pkg(Math.sqrt(eps / P) * d)
        return mul(a, mul(h, h)).re
      }
      const K = BESSEL.besselk(Math.sqrt(-eps / P) * d, 0)
      return a.re * (-(4 / (Math.PI * Math.PI)) * K * K)
    }
    const lor = (x: number) => g / (Math.PI * (x * x + g * g))
    for (const E of [-0.5, -0.42, -0.2, 0.1]) {
      const above = integrate(s => 2 * s * sharp(s * s) * lor(E - (E0 + s * s)), 1e-12, 18, 900, 12)
      const below = integrate(s => 2 * s * sharp(-s * s) * lor(E - (E0 - s * s)), 1e-12, 2, 200, 12)
      const want = above + below
      const k = waveNumber(E, g, E0, M)
      const sys = new ScatteringAtEnergy(xyOf([[0, 0]]), k, a)
      const got = sys.ldosRatio(d, 0) - cleanLdosRatio(k)
      // the values are 0.03–0.07; measured agreement ≈ 2e-7 (the package's accuracy and the
      // truncated tail beyond 18² eV, whose oscillation largely cancels)
      expect(Math.abs(got - want)).toBeLessThan(1e-6)
    }
  })
})

describe('two scatterers against the closed form', () => {
  it('matches Q = (h1² + h2² + 2a·h12·h1·h2)/(1 − a²h12²)', () => {
    // M = [[1, −a h12], [−a h12, 1]], M⁻¹ = [[1, a h12], [a h12, 1]]/(1 − a²h12²), Q = hᵀM⁻¹h
    const pts: [number, number][] = [[0, 0], [1.7, 0.4]]
    const a = amplitudeFromPhaseShift({ re: 1.1, im: 0.2 })
    const k = waveNumber(-0.1, 0, E0, M)
    const sys = new ScatteringAtEnergy(xyOf(pts), k, a)
    const h12 = h0pkg(k.re * Math.hypot(1.7, 0.4))
    for (const [x, y] of [[0.5, 2], [-3, -1], [0.85, 0.2]] as const) {
      const h1 = h0pkg(k.re * Math.hypot(x, y))
      const h2 = h0pkg(k.re * Math.hypot(x - 1.7, y - 0.4))
      const num = add(add(mul(h1, h1), mul(h2, h2)), mul({ re: 2 * a.re, im: 2 * a.im }, mul(h12, mul(h1, h2))))
      const den = add({ re: 1, im: 0 }, mul({ re: -1, im: 0 }, mul(mul(a, a), mul(h12, h12))))
      const want = 1 + mul(a, div(num, den)).re
      expect(Math.abs(sys.ldosRatio(x, y) - want)).toBeLessThan(1e-6)
    }
    // the spectrum path (one LU solve per energy) gives the same number as the inverse
    const s = scatteringSpectrum(xyOf(pts), [0.5, 2], [-0.1], { E0_eV: E0, m_eff: M, hwhm_eV: 0, a })
    expect(s[0]!).toBeCloseTo(sys.ldosRatio(0.5, 2), 12)
  })
})

describe('a perfect ring', () => {
  const N = 48
  const R = 7.13 // the published 48-atom ring (Crommie, Lutz, Eigler, Science 262, 218 (1993))
  const ring: [number, number][] = Array.from({ length: N }, (_, i) => [R * Math.cos((2 * Math.PI * i) / N), R * Math.sin((2 * Math.PI * i) / N)])

  it('has a C_48-symmetric LDOS to 1e-9 (with and without broadening)', () => {
    for (const g of [0, 0.02]) {
      const sys = new ScatteringAtEnergy(xyOf(ring), waveNumber(-0.3, g, E0, M), BLACK_DOT)
      for (const [x, y] of [[1.234, 0.567], [3.9, -2.2], [6.5, 1.1], [8.8, 0.4]]) {
        const v = sys.ldosRatio(x!, y!)
        for (const q of [1, 5, 17, 31]) {
          const t = (2 * Math.PI * q) / N
          const w = sys.ldosRatio(x! * Math.cos(t) - y! * Math.sin(t), x! * Math.sin(t) + y! * Math.cos(t))
          expect(Math.abs(w - v)).toBeLessThan(1e-9 * Math.max(1, Math.abs(v)))
        }
        // mirror symmetry across the x axis (an atom sits on it)
        expect(Math.abs(sys.ldosRatio(x!, -y!) - v)).toBeLessThan(1e-9 * Math.max(1, Math.abs(v)))
      }
    }
  })

  it('gives a map that is symmetric under 90° rotation of the pixel grid', () => {
    const sys = new ScatteringAtEnergy(xyOf(ring), waveNumber(0, 0.01, E0, M), BLACK_DOT)
    const px = 24
    const map = scatteringMap(sys, px, [-9, 9, -9, 9])
    // (x, y) → (−y, x): pixel (c, r) → (px−1−r, c)
    for (let r = 0; r < px; r++) {
      for (let c = 0; c < px; c++) expect(Math.abs(map[c * px + (px - 1 - r)]! - map[r * px + c]!)).toBeLessThan(1e-9)
    }
  })
})
