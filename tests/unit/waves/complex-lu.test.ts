import { describe, expect, it } from 'vitest'
import * as math from 'mathjs'
import { luFactor, luInverse, luSolve } from '../../../shared/waves/complex-lu'

/** Park–Miller minimal standard generator, fixed seed: synthetic test matrices only. */
function rng(seed: number) {
  let s = seed
  return () => (s = (s * 16807) % 2147483647) / 2147483647 - 0.5
}

describe('complex LU with partial pivoting', () => {
  it('solves A·x = b like mathjs.lusolve (independent general-purpose library)', () => {
    for (const n of [1, 2, 7, 30]) {
      const r = rng(11 + n)
      const ar = Float64Array.from({ length: n * n }, r)
      const ai = Float64Array.from({ length: n * n }, r)
      const br = Float64Array.from({ length: n }, r)
      const bi = Float64Array.from({ length: n }, r)
      const A = math.matrix(Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => math.complex(ar[i * n + j]!, ai[i * n + j]!))))
      const b = math.matrix(Array.from({ length: n }, (_, i) => [math.complex(br[i]!, bi[i]!)]))
      const x = math.lusolve(A, b) as math.Matrix
      const fr = ar.slice()
      const fi = ai.slice()
      const piv = new Int32Array(n)
      expect(luFactor(n, fr, fi, piv)).toBe(true)
      const xr = br.slice()
      const xi = bi.slice()
      luSolve(n, fr, fi, piv, xr, xi)
      for (let i = 0; i < n; i++) {
        const c = x.get([i, 0]) as math.Complex
        expect(Math.abs(c.re - xr[i]!)).toBeLessThan(1e-10)
        expect(Math.abs(c.im - xi[i]!)).toBeLessThan(1e-10)
      }
      // and the inverse: A·A⁻¹ = I
      const inv = luInverse(n, fr, fi, piv)
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          let sr = 0
          let si = 0
          for (let k = 0; k < n; k++) {
            sr += ar[i * n + k]! * inv.re[k * n + j]! - ai[i * n + k]! * inv.im[k * n + j]!
            si += ar[i * n + k]! * inv.im[k * n + j]! + ai[i * n + k]! * inv.re[k * n + j]!
          }
          expect(Math.abs(sr - (i === j ? 1 : 0))).toBeLessThan(1e-10)
          expect(Math.abs(si)).toBeLessThan(1e-10)
        }
      }
    }
  })

  it('pivots (zero leading entry) and reports a singular matrix', () => {
    // [[0, 1], [1, 0]]·x = [2, 3] → x = [3, 2]: fails without a row swap
    const ar = Float64Array.from([0, 1, 1, 0])
    const ai = new Float64Array(4)
    const piv = new Int32Array(2)
    expect(luFactor(2, ar, ai, piv)).toBe(true)
    const br = Float64Array.from([2, 3])
    const bi = new Float64Array(2)
    luSolve(2, ar, ai, piv, br, bi)
    expect(Array.from(br)).toEqual([3, 2])
    expect(luFactor(2, Float64Array.from([1, 2, 2, 4]), new Float64Array(4), piv)).toBe(false)
  })
})
