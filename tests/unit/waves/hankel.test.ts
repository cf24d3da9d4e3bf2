import { describe, expect, it } from 'vitest'
import * as BESSEL from 'bessel'
import { hankel1ZeroComplex } from '../../../shared/waves/hankel-complex'
import { besselJ, besselY } from '../../../shared/waves/bessel'

/** K0(w) = ∫₀^∞ exp(−w cosh t) dt for Re w > 0 (DLMF 10.32.9), trapezoid rule: the integrand
 * decays double-exponentially, so a step of 5e-4 is exact to rounding. */
function k0Quadrature(wr: number, wi: number): [number, number] {
  let sr = 0
  let si = 0
  const h = 5e-4
  for (let t = 0; t < 12; t += h) {
    const c = Math.cosh(t)
    const m = Math.exp(-wr * c)
    if (m < 1e-300) break
    const wt = t === 0 ? 0.5 : 1
    sr += wt * m * Math.cos(-wi * c)
    si += wt * m * Math.sin(-wi * c)
  }
  return [sr * h, si * h]
}

describe('H0⁽¹⁾(z) for complex z, Im z ≥ 0', () => {
  const out = new Float64Array(2)

  it('reduces to J0(x) + i·Y0(x) on the real axis (DLMF 10.4.3)', () => {
    for (let x = 0.05; x < 40; x += 0.37) {
      hankel1ZeroComplex(x, 1e-15, out) // just off the axis: takes the complex code path
      expect(Math.abs(out[0]! - besselJ(0, x))).toBeLessThan(5e-14)
      expect(Math.abs(out[1]! - besselY(0, x))).toBeLessThan(5e-14)
      // and the npm `bessel` package (≈ 1e-8 accurate) as a second, independent check
      expect(Math.abs(out[0]! - BESSEL.besselj(x, 0))).toBeLessThan(2e-7)
      expect(Math.abs(out[1]! - BESSEL.bessely(x, 0))).toBeLessThan(2e-7)
    }
  })

  it('equals (2/(iπ))·K0(−iz) (DLMF 10.27.8) with K0 from its integral, to 5e-13 absolute', () => {
    for (let zr = 0; zr <= 30; zr += 1.5) {
      for (let zi = 0.25; zi <= 16; zi += 0.75) {
        hankel1ZeroComplex(zr, zi, out)
        const [kr, ki] = k0Quadrature(zi, -zr) // w = −iz = zi − i·zr
        // (2/(iπ))·K = −(2i/π)·K
        expect(Math.abs(out[0]! - (2 / Math.PI) * ki)).toBeLessThan(5e-13)
        expect(Math.abs(out[1]! + (2 / Math.PI) * kr)).toBeLessThan(5e-13)
      }
    }
  })

  it('on the imaginary axis is −(2i/π)·K0(y), checked against the npm `bessel` package', () => {
    for (const y of [0.3, 1, 2.5, 7.9, 8.1, 15]) {
      hankel1ZeroComplex(0, y, out)
      const k = BESSEL.besselk(y, 0)
      expect(Math.abs(out[0]!)).toBeLessThan(1e-13)
      expect(Math.abs(out[1]! + (2 / Math.PI) * k) / Math.max(1e-6, (2 / Math.PI) * k)).toBeLessThan(1e-6)
    }
  })
})
