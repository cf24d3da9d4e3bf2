// Leveling: exact planes and polynomials must vanish (closed form); least-squares coefficients are
// compared with a QR solution from mathjs (an independent linear-algebra library); the median of
// line differences must remove per-line offsets exactly when adatoms cover under half a line.
import { multiply, qr, transpose, usolve } from 'mathjs'
import { describe, expect, it } from 'vitest'
import { fitPlane, levelLinesMedian, levelLinesMedianDiff, levelLinesPolynomial, subtractPlane } from '../../../shared/scan/level'
import { mulberry32, normalGenerator, syntheticScan } from '../../../shared/scan/synthetic'

/** Float32 unit roundoff 2⁻²⁴ (IEEE 754 binary32). */
const U32 = 2 ** -24

function leastSquaresQr(A: number[][], b: number[]): number[] {
  const { Q, R } = qr(A) as unknown as { Q: number[][], R: number[][] }
  const n = A[0]!.length
  const Qtb = multiply(transpose(Q), b) as number[]
  const Rn = R.slice(0, n).map(row => row.slice(0, n))
  return (usolve(Rn, Qtb.slice(0, n)) as number[][]).map(r => r[0]!)
}

describe('plane fit', () => {
  it('recovers an exact plane to 1e-9 relative in Float64', () => {
    const w = 257, h = 193
    const data = new Float64Array(w * h)
    for (let r = 0; r < h; r++) for (let c = 0; c < w; c++) data[r * w + c] = 3.25 + 0.0123 * c - 0.0456 * r
    const p = fitPlane({ width: w, height: h, data })
    expect(Math.abs(p.z0 - 3.25) / 3.25).toBeLessThan(1e-9)
    expect(Math.abs(p.dz_dc - 0.0123) / 0.0123).toBeLessThan(1e-9)
    expect(Math.abs(p.dz_dr + 0.0456) / 0.0456).toBeLessThan(1e-9)
  })

  it('leaves a Float32 tilted plane within the rounding bound 5u·max|z|', () => {
    // Bound (derived): the Float32 input carries errors ε ≤ u·max|z|; the fitted plane moves by
    // P·ε, where the plane projection has ‖P‖∞ ≤ 1 + 1.5 + 1.5 on a full grid; so the residual
    // ε − P·ε is at most 5u·max|z| (Float64 arithmetic adds far less).
    const w = 300, h = 211
    const data = new Float32Array(w * h)
    let maxAbs = 0
    for (let r = 0; r < h; r++) {
      for (let c = 0; c < w; c++) {
        data[r * w + c] = 12.5 - 0.031 * c + 0.017 * r
        maxAbs = Math.max(maxAbs, Math.abs(data[r * w + c]!))
      }
    }
    const copy = data.slice()
    const { grid } = subtractPlane({ width: w, height: h, data })
    let worst = 0
    for (const v of grid.data) worst = Math.max(worst, Math.abs(v))
    expect(worst).toBeLessThanOrEqual(5 * U32 * maxAbs)
    expect(data.every((v, i) => v === copy[i])).toBe(true) // non-destructive
  })

  it('matches a QR least-squares solution (mathjs) on noisy data', () => {
    const w = 23, h = 17
    const normal = normalGenerator(mulberry32(5))
    const data = Array.from({ length: w * h }, (_, i) => 0.4 + 0.02 * (i % w) - 0.01 * Math.floor(i / w) + 0.05 * normal())
    const A = data.map((_, i) => [1, i % w, Math.floor(i / w)])
    const [z0, bc, br] = leastSquaresQr(A, data)
    const p = fitPlane({ width: w, height: h, data })
    expect(p.z0).toBeCloseTo(z0!, 10)
    expect(p.dz_dc).toBeCloseTo(bc!, 10)
    expect(p.dz_dr).toBeCloseTo(br!, 10)
  })
})

describe('line leveling', () => {
  it('removes per-line offsets exactly by the median of line differences', () => {
    // Adatoms on a flat background (cover < 50 % of every line) plus a random offset per line.
    const s = syntheticScan({ width: 256, height: 128, pixel_nm: 0.1, density_per_nm2: 0.05, fwhm_nm: 0.8, height_nm: 0.1, seed: 3 })
    const clean = s.data.slice()
    const normal = normalGenerator(mulberry32(9))
    const offsets = Array.from({ length: s.height }, () => 0.5 * normal())
    const shifted = s.data.map((v, i) => v + offsets[Math.floor(i / s.width)]!)
    const out = levelLinesMedianDiff({ width: s.width, height: s.height, data: shifted })
    // Line 0 is the reference: every line ends up with line 0's offset.
    let worst = 0
    for (let i = 0; i < clean.length; i++) worst = Math.max(worst, Math.abs(out.grid.data[i]! - (clean[i]! + offsets[0]!)))
    // Roundings to Float32 of the input sample, of the two offsets and of the output, each at
    // most u·M with M the largest magnitude involved: bound 4u·M.
    const M = Math.max(...offsets.map(Math.abs)) + Math.max(...clean)
    expect(worst).toBeLessThanOrEqual(4 * U32 * M)
    expect(out.offsets[5]).toBeCloseTo(offsets[5]! - offsets[0]!, 5)
  })

  it('line medians remove constant offsets of a flat scan', () => {
    const w = 9, h = 4
    const data = Float32Array.from({ length: w * h }, (_, i) => Math.floor(i / w) * 10 + (i % w === 4 ? 3 : 0))
    const out = levelLinesMedian({ width: w, height: h, data }).data
    expect(Array.from(out)).toEqual(Array.from({ length: w * h }, (_, i) => (i % w === 4 ? 3 : 0)))
  })

  it('a polynomial of order k per line removes every line polynomial of degree ≤ k', () => {
    const w = 64, h = 8
    const rnd = mulberry32(11)
    for (let order = 0; order <= 3; order++) {
      const data = new Float64Array(w * h)
      for (let r = 0; r < h; r++) {
        const coef = Array.from({ length: order + 1 }, () => rnd() - 0.5)
        for (let c = 0; c < w; c++) data[r * w + c] = coef.reduce((s, a, k) => s + a * (c / 10) ** k, 0)
      }
      const out = levelLinesPolynomial({ width: w, height: h, data }, order).data
      for (const v of out) expect(Math.abs(v)).toBeLessThan(1e-6)
    }
  })

  it('per-line polynomial residuals match a QR least-squares fit (mathjs)', () => {
    const w = 40
    const normal = normalGenerator(mulberry32(12))
    const row = Array.from({ length: w }, (_, c) => 0.3 - 0.002 * c + 1e-4 * c * c + 0.01 * normal())
    const A = row.map((_, c) => [1, c, c * c, c * c * c])
    const coef = leastSquaresQr(A, row)
    const want = row.map((z, c) => z - (coef[0]! + coef[1]! * c + coef[2]! * c * c + coef[3]! * c * c * c))
    const got = levelLinesPolynomial({ width: w, height: 1, data: row }, 3).data
    got.forEach((v, c) => expect(v).toBeCloseTo(want[c]!, 6))
  })

  it('names a bad order and a size mismatch', () => {
    expect(() => levelLinesPolynomial({ width: 2, height: 1, data: [1, 2] }, 4)).toThrow(/order must be 0, 1, 2 or 3/)
    expect(() => fitPlane({ width: 3, height: 3, data: [1, 2] })).toThrow(/data holds 2 values but width × height = 3 × 3 = 9/)
  })
})
