// Small dense solver for normal equations: Gaussian elimination with partial pivoting
// (Golub & Van Loan, Matrix Computations, §3.4). Systems here are at most 4 × 4.

/** Solves A·x = b for a row-major n × n matrix. Returns null when A is (numerically) singular. */
export function solveSmall(n: number, A: Float64Array, b: Float64Array): Float64Array | null {
  const M = Float64Array.from(A)
  const x = Float64Array.from(b)
  let scale = 0
  for (let i = 0; i < n * n; i++) scale = Math.max(scale, Math.abs(M[i]!))
  if (scale === 0) return null
  for (let col = 0; col < n; col++) {
    let piv = col
    for (let r = col + 1; r < n; r++) if (Math.abs(M[r * n + col]!) > Math.abs(M[piv * n + col]!)) piv = r
    if (Math.abs(M[piv * n + col]!) <= scale * 1e-13) return null
    if (piv !== col) {
      for (let c = 0; c < n; c++) {
        const t = M[col * n + c]!
        M[col * n + c] = M[piv * n + c]!
        M[piv * n + c] = t
      }
      const t = x[col]!
      x[col] = x[piv]!
      x[piv] = t
    }
    const d = M[col * n + col]!
    for (let r = col + 1; r < n; r++) {
      const f = M[r * n + col]! / d
      if (f === 0) continue
      for (let c = col; c < n; c++) M[r * n + c] = M[r * n + c]! - f * M[col * n + c]!
      x[r] = x[r]! - f * x[col]!
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = x[r]!
    for (let c = r + 1; c < n; c++) s -= M[r * n + c]! * x[c]!
    x[r] = s / M[r * n + r]!
  }
  return x
}
