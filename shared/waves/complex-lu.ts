// Dense complex LU factorisation with partial pivoting (Golub & Van Loan, Matrix Computations,
// Alg. 3.4.1), on row-major split real/imaginary Float64Arrays.
// Why own code: mathjs.lusolve on a 100 × 100 complex system takes a median 78 ms here against
// 0.77 ms for this routine (tests/bench/waves.bench.ts), and a spectrum needs one solve per energy.

/** In-place A = P·L·U; piv[k] is the row swapped with row k at step k. Returns false if singular. */
export function luFactor(n: number, ar: Float64Array, ai: Float64Array, piv: Int32Array): boolean {
  for (let k = 0; k < n; k++) {
    let p = k
    let best = -1
    for (let i = k; i < n; i++) {
      const m = ar[i * n + k]! * ar[i * n + k]! + ai[i * n + k]! * ai[i * n + k]!
      if (m > best) {
        best = m
        p = i
      }
    }
    piv[k] = p
    if (!(best > 0)) return false
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const a = k * n + j
        const b = p * n + j
        let t = ar[a]!
        ar[a] = ar[b]!
        ar[b] = t
        t = ai[a]!
        ai[a] = ai[b]!
        ai[b] = t
      }
    }
    const dr = ar[k * n + k]!
    const di = ai[k * n + k]!
    const dd = dr * dr + di * di
    const invr = dr / dd
    const invi = -di / dd
    for (let i = k + 1; i < n; i++) {
      const ik = i * n + k
      const xr = ar[ik]!
      const xi = ai[ik]!
      const lr = xr * invr - xi * invi
      const li = xr * invi + xi * invr
      ar[ik] = lr
      ai[ik] = li
      if (lr === 0 && li === 0) continue
      const ri = i * n
      const rk = k * n
      for (let j = k + 1; j < n; j++) {
        const ur = ar[rk + j]!
        const ui = ai[rk + j]!
        ar[ri + j] = ar[ri + j]! - (lr * ur - li * ui)
        ai[ri + j] = ai[ri + j]! - (lr * ui + li * ur)
      }
    }
  }
  return true
}

/** Solves A·x = b in place (b becomes x) with the factors from luFactor. */
export function luSolve(n: number, ar: Float64Array, ai: Float64Array, piv: Int32Array, br: Float64Array, bi: Float64Array): void {
  for (let k = 0; k < n; k++) {
    const p = piv[k]!
    if (p !== k) {
      let t = br[k]!
      br[k] = br[p]!
      br[p] = t
      t = bi[k]!
      bi[k] = bi[p]!
      bi[p] = t
    }
  }
  for (let i = 1; i < n; i++) {
    let sr = br[i]!
    let si = bi[i]!
    const ri = i * n
    for (let j = 0; j < i; j++) {
      const lr = ar[ri + j]!
      const li = ai[ri + j]!
      sr -= lr * br[j]! - li * bi[j]!
      si -= lr * bi[j]! + li * br[j]!
    }
    br[i] = sr
    bi[i] = si
  }
  for (let i = n - 1; i >= 0; i--) {
    let sr = br[i]!
    let si = bi[i]!
    const ri = i * n
    for (let j = i + 1; j < n; j++) {
      const ur = ar[ri + j]!
      const ui = ai[ri + j]!
      sr -= ur * br[j]! - ui * bi[j]!
      si -= ur * bi[j]! + ui * br[j]!
    }
    const dr = ar[ri + i]!
    const di = ai[ri + i]!
    const dd = dr * dr + di * di
    br[i] = (sr * dr + si * di) / dd
    bi[i] = (si * dr - sr * di) / dd
  }
}

/** Inverse of a factored matrix, row-major, by solving for the unit vectors. */
export function luInverse(n: number, ar: Float64Array, ai: Float64Array, piv: Int32Array): { re: Float64Array, im: Float64Array } {
  const re = new Float64Array(n * n)
  const im = new Float64Array(n * n)
  const br = new Float64Array(n)
  const bi = new Float64Array(n)
  for (let c = 0; c < n; c++) {
    br.fill(0)
    bi.fill(0)
    br[c] = 1
    luSolve(n, ar, ai, piv, br, bi)
    for (let r = 0; r < n; r++) {
      re[r * n + c] = br[r]!
      im[r * n + c] = bi[r]!
    }
  }
  return { re, im }
}
