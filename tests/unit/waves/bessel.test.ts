import { describe, expect, it } from 'vitest'
import * as BESSEL from 'bessel'
import { besselJ, besselY, besselJY01, ASYMPTOTIC_MIN_X } from '../../../shared/waves/bessel'
import { besselJZero, besselJZeros } from '../../../shared/waves/bessel-zeros'
import { besselJHighPrec, besselY0HighPrec, besselY1HighPrec } from './highprec'

// Abramowitz & Stegun, Handbook of Mathematical Functions, Table 9.5; NIST DLMF §10.21.
// Rows m = 0…5, columns n = 1…5.
const AS_TABLE_9_5 = [
  [2.4048255577, 5.5200781103, 8.6537279129, 11.7915344390, 14.9309177085],
  [3.8317059702, 7.0155866698, 10.1734681351, 13.3236919363, 16.4706300509],
  [5.1356223018, 8.4172441404, 11.6198411721, 14.7959517824, 17.9598194950],
  [6.3801618959, 9.7610231300, 13.0152007217, 16.2234661603, 19.4094152264],
  [7.5883424345, 11.0647094885, 14.3725366716, 17.6159660498, 20.8269329570],
  [8.7714838160, 12.3386041975, 15.7001740797, 18.9801338752, 22.2177998966],
]

describe('Bessel functions against published values', () => {
  it('matches the values of A&S Tables 9.1/9.2 and DLMF', () => {
    // A&S Tables 9.1 (J) and 9.2 (Y); DLMF. 16-digit values; our claim is ≲ 1e-15 absolute.
    const cases: [number, number, number, number][] = [
      [0, 1, besselJ(0, 1), 0.7651976865579666],
      [1, 1, besselJ(1, 1), 0.4400505857449335],
      [2, 1, besselJ(2, 1), 0.1149034849319005],
      [0, 1, besselY(0, 1), 0.08825696421567696],
      [1, 1, besselY(1, 1), -0.7812128213002887],
      [0, 2, besselJ(0, 2), 0.2238907791412357],
      [0, 5, besselJ(0, 5), -0.1775967713143383],
      [1, 5, besselJ(1, 5), -0.3275791375914652],
      [0, 10, besselJ(0, 10), -0.2459357644513483],
    ]
    for (const [, , got, want] of cases) expect(Math.abs(got - want)).toBeLessThan(1e-15)
  })

  it('finds the zeros j_{m,n} of A&S Table 9.5 (m = 0…5, n = 1…5) to 1e-9', () => {
    for (let m = 0; m <= 5; m++) {
      const z = besselJZeros(m, { count: 5 })
      for (let n = 1; n <= 5; n++) expect(Math.abs(z[n - 1]! - AS_TABLE_9_5[m]![n - 1]!)).toBeLessThan(1e-9)
      expect(besselJZero(m, 3)).toBe(z[2])
    }
  })

  it('zeros are roots of J_m to machine precision and interlace (DLMF 10.21.2)', () => {
    for (const m of [0, 1, 7, 20, 45]) {
      const z = besselJZeros(m, { below: 120 })
      const next = besselJZeros(m + 1, { below: 120 })
      for (const j of z) expect(Math.abs(besselJ(m, j))).toBeLessThan(1e-14)
      // j_{m,n} < j_{m+1,n} < j_{m,n+1}
      for (let n = 0; n + 1 < z.length && n < next.length; n++) {
        expect(next[n]!).toBeGreaterThan(z[n]!)
        expect(next[n]!).toBeLessThan(z[n + 1]!)
      }
      // brute force: count sign changes of J_m on a grid of step 0.01 (zeros are > 3 apart)
      let count = 0
      let prev = besselJ(m, 1e-3)
      for (let x = 0.01; x <= 120; x += 0.01) {
        const v = besselJ(m, x)
        if ((v > 0) !== (prev > 0) && v !== 0) count++
        prev = v
      }
      expect(z.length).toBe(count)
    }
  })
})

describe('Bessel functions against independent computations', () => {
  it('J_m agrees with a 70-digit power series (A&S 9.1.10) to 1e-15 over x ≤ 50, m ≤ 144', () => {
    // Independent reference: tests/unit/waves/highprec.ts (BigInt series, exact rational x = k/8).
    // Absolute 1e-15 everywhere; relative 1e-13 where m > x, where J_m is monotone and can be
    // tiny (1e-45 here), so an absolute bound alone would say nothing.
    for (const m of [0, 1, 2, 3, 5, 8, 13, 21, 34, 55, 89, 144]) {
      for (let k = 1; k <= 400; k += 13) {
        const ref = besselJHighPrec(m, BigInt(k), 8n)
        const got = besselJ(m, k / 8)
        expect(Math.abs(got - ref)).toBeLessThan(1e-15)
        if (m > k / 8 && Math.abs(ref) > 1e-45) expect(Math.abs(got - ref) / Math.abs(ref)).toBeLessThan(1e-13)
      }
    }
  })

  it('Y0 and Y1 agree with their 70-digit power series (A&S 9.1.13, 9.1.11) to 1.2e-15 relative to max(1, |Y|)', () => {
    for (let k = 1; k <= 400; k += 11) {
      const x = k / 8
      const y0 = besselY0HighPrec(BigInt(k), 8n)
      const y1 = besselY1HighPrec(BigInt(k), 8n)
      expect(Math.abs(besselY(0, x) - y0) / Math.max(1, Math.abs(y0))).toBeLessThan(1.2e-15)
      expect(Math.abs(besselY(1, x) - y1) / Math.max(1, Math.abs(y1))).toBeLessThan(1.2e-15)
    }
  })

  it('agrees with the npm `bessel` package (SheetJS 1.0.2) over a grid of x and m', () => {
    // That package uses single-precision-era rational approximations (Numerical Recipes style),
    // good to ≈ 1e-8; the tolerance reflects its accuracy, not ours.
    for (let m = 0; m <= 12; m++) {
      for (let x = 0.3; x < 60; x += 0.7) {
        expect(Math.abs(besselJ(m, x) - BESSEL.besselj(x, m))).toBeLessThan(2e-7)
        const y = besselY(m, x)
        if (Math.abs(y) < 1e3) expect(Math.abs(y - BESSEL.bessely(x, m)) / Math.max(1, Math.abs(y))).toBeLessThan(2e-7)
      }
    }
  })

  it('satisfies the Wronskian J_{m+1}Y_m − J_m Y_{m+1} = 2/(πx) (DLMF 10.5.2)', () => {
    for (const x of [0.01, 0.7, 3.3, 11, 24.9, 25, 31.4, 80, 400]) {
      for (const m of [0, 1, 4, 10]) {
        const w = besselJ(m + 1, x) * besselY(m, x) - besselJ(m, x) * besselY(m + 1, x)
        const scale = Math.max(1, Math.abs(besselJ(m, x) * besselY(m + 1, x)))
        expect(Math.abs(w - 2 / (Math.PI * x)) / scale).toBeLessThan(2e-14)
      }
    }
  })

  it('satisfies the sum rule J0² + 2Σ J_k² = 1 (DLMF 10.23.3, n = 0)', () => {
    for (const x of [0.5, 7.25, 19.9, 26, 60]) {
      let s = besselJ(0, x) ** 2
      for (let k = 1; k < x + 60; k++) s += 2 * besselJ(k, x) ** 2
      expect(Math.abs(s - 1)).toBeLessThan(1e-14)
    }
  })

  it('is continuous across the switch to the asymptotic expansion at x = 25', () => {
    // J0' = −J1 and Y0' = −Y1 (DLMF 10.6.3): a step of h moves the value by about −h·J1.
    const lo = new Float64Array(4)
    const hi = new Float64Array(4)
    const h = 1e-9
    besselJY01(ASYMPTOTIC_MIN_X - h, lo)
    besselJY01(ASYMPTOTIC_MIN_X, hi)
    expect(Math.abs(hi[0]! - lo[0]! + h * hi[1]!)).toBeLessThan(5e-16)
    expect(Math.abs(hi[2]! - lo[2]! + h * hi[3]!)).toBeLessThan(5e-16)
  })

  it('handles the edges: x = 0, negative x for J, invalid orders', () => {
    expect(besselJ(0, 0)).toBe(1)
    expect(besselJ(3, 0)).toBe(0)
    expect(besselY(0, 0)).toBe(Number.NEGATIVE_INFINITY)
    // J_m(−x) = (−1)^m J_m(x) (DLMF 10.4.1)
    expect(besselJ(3, -2.5)).toBeCloseTo(-besselJ(3, 2.5), 15)
    expect(besselJ(2, -2.5)).toBeCloseTo(besselJ(2, 2.5), 15)
    expect(Number.isNaN(besselJ(1.5, 1))).toBe(true)
    expect(Number.isNaN(besselY(0, -1))).toBe(true)
  })
})
