// Least-squares fit of z = B + A·exp(−(x−x0)²/2sx² − (y−y0)²/2sy²) with known widths sx, sy to the
// samples inside the ellipse ((x−xc)/sx)² + ((y−yc)/sy)² ≤ ρ² around a start point, by
// Gauss–Newton iteration (Nocedal & Wright, Numerical Optimization, §10.3), the 4 × 4 normal
// equations solved by Cholesky factorisation. Grid units (samples). Neighbouring peaks, when
// given, are subtracted from the window first so their tails do not pull the centre over.

export interface GaussFit { x0: number, y0: number, A: number, B: number }

/** Reusable scratch space, so fitting thousands of peaks allocates (almost) nothing per peak. */
export class GaussFitter {
  private ci = new Int32Array(256)
  private ri = new Int32Array(256)
  private zs = new Float64Array(256)
  private ex = new Float64Array(64)
  private ey = new Float64Array(64)
  private readonly M = new Float64Array(16)
  private readonly v = new Float64Array(4)
  private readonly ix2: number
  private readonly iy2: number
  private readonly rx: number
  private readonly ry: number

  constructor(
    private readonly data: Float32Array,
    private readonly w: number,
    private readonly h: number,
    sx: number,
    sy: number,
    private readonly rho = 2.5,
  ) {
    this.ix2 = 1 / (sx * sx)
    this.iy2 = 1 / (sy * sy)
    this.rx = Math.floor(rho * sx)
    this.ry = Math.floor(rho * sy)
    const cap = (2 * this.rx + 1) * (2 * this.ry + 1)
    this.ci = new Int32Array(cap)
    this.ri = new Int32Array(cap)
    this.zs = new Float64Array(cap)
    this.ex = new Float64Array(2 * this.rx + 1)
    this.ey = new Float64Array(2 * this.ry + 1)
  }

  /**
   * Fits the peak near (xStart, yStart), the window centred on the nearest sample. neighbours:
   * flat [x, y, A, x, y, A, …] of nNeighbours peaks to subtract from the window first.
   */
  fit(xStart: number, yStart: number, neighbours: Float64Array = NONE, nNeighbours = 0, iterations = 8): GaussFit | null {
    const { data, w, h, rho, ix2, iy2, rx, ry, ci, ri, zs, ex, ey } = this
    const cx = Math.round(xStart), cy = Math.round(yStart)
    const c0 = cx - rx, r0 = cy - ry
    const nx = 2 * rx + 1, ny = 2 * ry + 1
    // The window is chosen once, around the start, so every iteration sees the same samples.
    let n = 0
    for (let r = Math.max(0, r0); r <= Math.min(h - 1, cy + ry); r++) {
      for (let c = Math.max(0, c0); c <= Math.min(w - 1, cx + rx); c++) {
        const u = c - cx, v = r - cy
        if (u * u * ix2 + v * v * iy2 > rho * rho) continue
        ci[n] = c - c0
        ri[n] = r - r0
        zs[n] = data[r * w + c]!
        n++
      }
    }
    if (n < 6) return null
    for (let k = 0; k < nNeighbours; k++) {
      const qx = neighbours[3 * k]!, qy = neighbours[3 * k + 1]!, qa = neighbours[3 * k + 2]!
      fillGauss(ex, nx, c0 - qx, ix2)
      fillGauss(ey, ny, r0 - qy, iy2)
      for (let i = 0; i < n; i++) zs[i]! -= qa * ex[ci[i]!]! * ey[ri[i]!]!
    }
    let x0 = xStart, y0 = yStart
    // Linear least squares for A and B at the start centre.
    fillGauss(ex, nx, c0 - x0, ix2)
    fillGauss(ey, ny, r0 - y0, iy2)
    let sg = 0, sgg = 0, sz = 0, sgz = 0
    for (let i = 0; i < n; i++) {
      const g = ex[ci[i]!]! * ey[ri[i]!]!
      sg += g
      sgg += g * g
      sz += zs[i]!
      sgz += g * zs[i]!
    }
    const det = n * sgg - sg * sg
    if (!(det > 0)) return null
    let A = (n * sgz - sg * sz) / det
    let B = (sz - A * sg) / n
    const { M, v } = this
    for (let it = 0; it < iterations; it++) {
      fillGauss(ex, nx, c0 - x0, ix2)
      fillGauss(ey, ny, r0 - y0, iy2)
      let a00 = 0, a01 = 0, a02 = 0, a03 = 0, a11 = 0, a12 = 0, a13 = 0, a22 = 0, a23 = 0, a33 = 0
      let b0 = 0, b1 = 0, b2 = 0, b3 = 0
      for (let i = 0; i < n; i++) {
        const dx = c0 + ci[i]! - x0, dy = r0 + ri[i]! - y0
        const g = ex[ci[i]!]! * ey[ri[i]!]!
        const res = zs[i]! - (B + A * g)
        const j2 = A * g * dx * ix2, j3 = A * g * dy * iy2
        a00 += 1
        a01 += g
        a02 += j2
        a03 += j3
        a11 += g * g
        a12 += g * j2
        a13 += g * j3
        a22 += j2 * j2
        a23 += j2 * j3
        a33 += j3 * j3
        b0 += res
        b1 += g * res
        b2 += j2 * res
        b3 += j3 * res
      }
      M[0] = a00
      M[1] = a01
      M[2] = a02
      M[3] = a03
      M[5] = a11
      M[6] = a12
      M[7] = a13
      M[10] = a22
      M[11] = a23
      M[15] = a33
      v[0] = b0
      v[1] = b1
      v[2] = b2
      v[3] = b3
      if (!cholesky4Solve(M, v)) return null
      B += v[0]!
      A += v[1]!
      x0 += v[2]!
      y0 += v[3]!
      // A fit that runs off its window or turns into a dip is no adatom fit: caller falls back.
      if (!(A > 0) || Math.abs(x0 - xStart) > 1 || Math.abs(y0 - yStart) > 1) return null
      if (Math.abs(v[2]!) < 1e-3 && Math.abs(v[3]!) < 1e-3) break
    }
    return { x0, y0, A, B }
  }
}

const NONE = new Float64Array(0)

// out[i] = exp(−(i + offset)²·inv2/2): one axis of a separable Gaussian.
function fillGauss(out: Float64Array, n: number, offset: number, inv2: number) {
  for (let i = 0; i < n; i++) {
    const d = i + offset
    out[i] = Math.exp(-0.5 * d * d * inv2)
  }
}

/**
 * Solves M·x = v in place (x returned in v) for a symmetric positive definite 4 × 4 M given by
 * its upper triangle (row-major); false when M is not positive definite.
 */
export function cholesky4Solve(M: Float64Array, v: Float64Array): boolean {
  // Factor M = Lᵀ·L with L upper triangular, stored over M's upper triangle.
  for (let i = 0; i < 4; i++) {
    let d = M[i * 4 + i]!
    for (let k = 0; k < i; k++) d -= M[k * 4 + i]! ** 2
    if (!(d > 1e-300)) return false
    const l = Math.sqrt(d)
    M[i * 4 + i] = l
    for (let j = i + 1; j < 4; j++) {
      let s = M[i * 4 + j]!
      for (let k = 0; k < i; k++) s -= M[k * 4 + i]! * M[k * 4 + j]!
      M[i * 4 + j] = s / l
    }
  }
  for (let i = 0; i < 4; i++) {
    let s = v[i]!
    for (let k = 0; k < i; k++) s -= M[k * 4 + i]! * v[k]!
    v[i] = s / M[i * 4 + i]!
  }
  for (let i = 3; i >= 0; i--) {
    let s = v[i]!
    for (let k = i + 1; k < 4; k++) s -= M[i * 4 + k]! * v[k]!
    v[i] = s / M[i * 4 + i]!
  }
  return true
}
