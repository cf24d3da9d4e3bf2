// Leveling of topographs: least-squares plane z ≈ z0 + dz_dc·c + dz_dr·r (normal equations in
// centred coordinates, accumulated in Float64); line-by-line correction by the median of the
// differences between adjacent scan lines, or by a least-squares polynomial (order 0–3) per line.
// Every function returns a new grid; the input is never modified. Non-finite samples are ignored.
import { InputError } from '../errors'
import { checkGrid } from './grid'
import { solveSmall } from './linalg'
import { medianInPlace } from './select'
import type { Grid, GridLike } from './types'

/** z ≈ z0 + dz_dc·c + dz_dr·r, with c the column and r the row index (pixel units). */
export interface Plane { z0: number, dz_dc: number, dz_dr: number }

export function fitPlane(grid: GridLike): Plane {
  checkGrid(grid)
  const { width: w, height: h, data } = grid
  const cc = (w - 1) / 2
  const rc = (h - 1) / 2
  let n = 0, su = 0, sv = 0, suu = 0, svv = 0, suv = 0, sz = 0, suz = 0, svz = 0
  for (let r = 0; r < h; r++) {
    const v = r - rc
    // Per-row partial sums keep the Float64 accumulation error at the level of one row.
    let rn = 0, ru = 0, ruu = 0, rz = 0, ruz = 0
    const base = r * w
    for (let c = 0; c < w; c++) {
      const z = data[base + c]!
      if (!Number.isFinite(z)) continue
      const u = c - cc
      rn++
      ru += u
      ruu += u * u
      rz += z
      ruz += u * z
    }
    n += rn
    su += ru
    sv += v * rn
    suu += ruu
    svv += v * v * rn
    suv += v * ru
    sz += rz
    suz += ruz
    svz += v * rz
  }
  if (n < 3) throw new InputError('data', 'a plane needs at least 3 finite samples')
  const A = Float64Array.of(n, su, sv, su, suu, suv, sv, suv, svv)
  const x = solveSmall(3, A, Float64Array.of(sz, suz, svz))
  if (!x) throw new InputError('data', 'the finite samples all lie on one line: no plane can be fitted')
  const [m, bu, bv] = [x[0]!, x[1]!, x[2]!]
  return { z0: m - bu * cc - bv * rc, dz_dc: bu, dz_dr: bv }
}

/** The grid minus its least-squares plane, and the plane that was removed. */
export function subtractPlane(grid: GridLike): { grid: Grid, plane: Plane } {
  const plane = fitPlane(grid)
  const { width: w, height: h, data } = grid
  const out = new Float32Array(w * h)
  for (let r = 0; r < h; r++) {
    const rowLevel = plane.z0 + plane.dz_dr * r
    const base = r * w
    for (let c = 0; c < w; c++) out[base + c] = data[base + c]! - (rowLevel + plane.dz_dc * c)
  }
  return { grid: { width: w, height: h, data: out }, plane }
}

/**
 * Removes a constant offset per scan line: line r is shifted by the median over columns of
 * (z[r][c] − z[r−1][c]), accumulated from the top line, which stays as it is. The median ignores
 * the few columns where an adatom or step crosses, unlike the mean.
 */
export function levelLinesMedianDiff(grid: GridLike): { grid: Grid, offsets: Float64Array } {
  checkGrid(grid)
  const { width: w, height: h, data } = grid
  const out = new Float32Array(w * h)
  const offsets = new Float64Array(h)
  const diffs = new Float64Array(w)
  for (let c = 0; c < w; c++) out[c] = data[c]!
  let offset = 0
  for (let r = 1; r < h; r++) {
    const base = r * w
    let m = 0
    for (let c = 0; c < w; c++) {
      const d = data[base + c]! - data[base - w + c]!
      if (Number.isFinite(d)) diffs[m++] = d
    }
    // A line with no finite pair keeps the previous line's offset.
    if (m > 0) offset += medianInPlace(diffs.subarray(0, m))
    offsets[r] = offset
    for (let c = 0; c < w; c++) out[base + c] = data[base + c]! - offset
  }
  return { grid: { width: w, height: h, data: out }, offsets }
}

/** Subtracts each scan line's own median (a robust order-0 line correction). */
export function levelLinesMedian(grid: GridLike): Grid {
  checkGrid(grid)
  const { width: w, height: h, data } = grid
  const out = new Float32Array(w * h)
  const row = new Float64Array(w)
  for (let r = 0; r < h; r++) {
    const base = r * w
    let m = 0
    for (let c = 0; c < w; c++) {
      const z = data[base + c]!
      if (Number.isFinite(z)) row[m++] = z
    }
    const med = m > 0 ? medianInPlace(row.subarray(0, m)) : 0
    for (let c = 0; c < w; c++) out[base + c] = data[base + c]! - med
  }
  return { width: w, height: h, data: out }
}

/**
 * Fits z(t) = Σ_k a_k·t^k (k ≤ order, t = column mapped onto [−1, 1] for conditioning) to each
 * scan line by least squares and subtracts it. Order 0 removes the line mean, 1 a tilt per line,
 * 2–3 the bow of a piezo scanner.
 */
export function levelLinesPolynomial(grid: GridLike, order: number): Grid {
  checkGrid(grid)
  if (!Number.isInteger(order) || order < 0 || order > 3) throw new InputError('order', 'order must be 0, 1, 2 or 3')
  const { width: w, height: h, data } = grid
  const n = Math.min(order + 1, w)
  // Powers of t for every column, shared by all lines.
  const pow = new Float64Array(n * w)
  for (let c = 0; c < w; c++) {
    const t = w > 1 ? (2 * c) / (w - 1) - 1 : 0
    let p = 1
    for (let k = 0; k < n; k++) {
      pow[k * w + c] = p
      p *= t
    }
  }
  const fullA = normalMatrix(pow, n, w, null)
  const out = new Float32Array(w * h)
  const rhs = new Float64Array(n)
  const finite = new Uint8Array(w)
  for (let r = 0; r < h; r++) {
    const base = r * w
    let allFinite = true
    for (let c = 0; c < w; c++) {
      const ok = Number.isFinite(data[base + c]!)
      finite[c] = ok ? 1 : 0
      if (!ok) allFinite = false
    }
    rhs.fill(0)
    for (let k = 0; k < n; k++) {
      let s = 0
      for (let c = 0; c < w; c++) if (finite[c]) s += pow[k * w + c]! * data[base + c]!
      rhs[k] = s
    }
    const A = allFinite ? fullA : normalMatrix(pow, n, w, finite)
    const coef = solveSmall(n, A, rhs) ?? solveSmall(1, A.subarray(0, 1), rhs.subarray(0, 1))
    for (let c = 0; c < w; c++) {
      let fit = 0
      if (coef) for (let k = 0; k < coef.length; k++) fit += coef[k]! * pow[k * w + c]!
      out[base + c] = data[base + c]! - fit
    }
  }
  return { width: w, height: h, data: out }
}

function normalMatrix(pow: Float64Array, n: number, w: number, mask: Uint8Array | null): Float64Array {
  const A = new Float64Array(n * n)
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      let s = 0
      for (let c = 0; c < w; c++) if (!mask || mask[c]) s += pow[i * w + c]! * pow[j * w + c]!
      A[i * n + j] = s
      A[j * n + i] = s
    }
  }
  return A
}

/**
 * In-place leveling of a scratch grid for detection: line offsets by the median of differences to
 * the line above (already corrected, so each median is that line's whole offset), from at most
 * `maxColumns` evenly spaced columns, then the least-squares plane. Saves the two full copies of
 * the non-destructive functions above.
 */
export function levelInPlace(data: Float32Array, w: number, h: number, maxColumns = 1024): void {
  const stride = Math.max(1, Math.ceil(w / maxColumns))
  const diffs = new Float64Array(Math.ceil(w / stride))
  for (let r = 1; r < h; r++) {
    const base = r * w
    let m = 0
    for (let c = 0; c < w; c += stride) diffs[m++] = data[base + c]! - data[base - w + c]!
    const off = medianInPlace(diffs.subarray(0, m))
    for (let c = 0; c < w; c++) data[base + c] = data[base + c]! - off
  }
  if (w * h < 3) return
  const p = fitPlane({ width: w, height: h, data })
  for (let r = 0; r < h; r++) {
    const rowLevel = p.z0 + p.dz_dr * r
    const base = r * w
    for (let c = 0; c < w; c++) data[base + c] = data[base + c]! - (rowLevel + p.dz_dc * c)
  }
}
