// Least-squares refinement of a lattice fit x ≈ t + M·p(i, j, b) with integer index assignment:
// rigid (orthogonal Procrustes / Kabsch in 2-D) or affine (linear least squares in 6 parameters).
import { type Lattice, compileLattice } from './lattice'

export interface Model { m11: number, m12: number, m21: number, m22: number, tx: number, ty: number }

export interface Assignment {
  i: Int32Array
  j: Int32Array
  b: Int32Array
  /** Ideal-frame site positions (relative to the type's site (0, 0, 0)). */
  px: Float64Array
  py: Float64Array
  residual: Float64Array
}

export function rigidModel(theta_rad: number, s: number, tx: number, ty: number): Model {
  const c = Math.cos(theta_rad) * s
  const sn = Math.sin(theta_rad) * s
  return { m11: c, m12: -sn, m21: sn, m22: c, tx, ty }
}

/** Nearest ideal site for every mark under the model: p = M⁻¹(x − t), then the lattice's closest point. */
export function assign(marks: Float64Array, model: Model, ideal: Lattice, out?: Assignment): Assignment {
  const n = marks.length >> 1
  const a: Assignment = out ?? { i: new Int32Array(n), j: new Int32Array(n), b: new Int32Array(n), px: new Float64Array(n), py: new Float64Array(n), residual: new Float64Array(n) }
  const c = compileLattice(ideal)
  const det = model.m11 * model.m22 - model.m12 * model.m21
  const n11 = model.m22 / det, n12 = -model.m12 / det, n21 = -model.m21 / det, n22 = model.m11 / det
  for (let k = 0; k < n; k++) {
    const dx = marks[2 * k]! - model.tx
    const dy = marks[2 * k + 1]! - model.ty
    const qx = n11 * dx + n12 * dy
    const qy = n21 * dx + n22 * dy
    let best = Infinity
    for (let b = 0; b < c.nb; b++) {
      const ex = qx - c.basis[2 * b]!
      const ey = qy - c.basis[2 * b + 1]!
      const p0 = Math.round(c.ri11 * ex + c.ri12 * ey)
      const q0 = Math.round(c.ri21 * ex + c.ri22 * ey)
      for (let dp = -1; dp <= 1; dp++) {
        for (let dq = -1; dq <= 1; dq++) {
          const p = p0 + dp, q = q0 + dq
          const sx = p * c.r1x + q * c.r2x + c.basis[2 * b]!
          const sy = p * c.r1y + q * c.r2y + c.basis[2 * b + 1]!
          // Residual measured in the scan frame, where the noise lives.
          const rx = dx - (model.m11 * sx + model.m12 * sy)
          const ry = dy - (model.m21 * sx + model.m22 * sy)
          const d2 = rx * rx + ry * ry
          if (d2 < best) {
            best = d2
            a.i[k] = c.U00 * p + c.U01 * q
            a.j[k] = c.U10 * p + c.U11 * q
            a.b[k] = b
            a.px[k] = sx
            a.py[k] = sy
          }
        }
      }
    }
    a.residual[k] = Math.sqrt(best)
  }
  return a
}

/** Refit the model to the marks flagged in `use`; affine when asked and well posed, else rigid at fixed scale. */
export function refit(marks: Float64Array, a: Assignment, use: Uint8Array, current: Model, affine: boolean): { model: Model, affine: boolean } {
  const n = marks.length >> 1
  let cnt = 0, mx = 0, my = 0, mpx = 0, mpy = 0
  for (let k = 0; k < n; k++) {
    if (!use[k]) continue
    cnt++
    mx += marks[2 * k]!
    my += marks[2 * k + 1]!
    mpx += a.px[k]!
    mpy += a.py[k]!
  }
  if (cnt === 0) return { model: current, affine: false }
  mx /= cnt
  my /= cnt
  mpx /= cnt
  mpy /= cnt
  let spp11 = 0, spp12 = 0, spp22 = 0, h11 = 0, h12 = 0, h21 = 0, h22 = 0
  for (let k = 0; k < n; k++) {
    if (!use[k]) continue
    const px = a.px[k]! - mpx, py = a.py[k]! - mpy
    const x = marks[2 * k]! - mx, y = marks[2 * k + 1]! - my
    spp11 += px * px
    spp12 += px * py
    spp22 += py * py
    // h_ab = Σ x_a·p_b
    h11 += x * px
    h12 += x * py
    h21 += y * px
    h22 += y * py
  }
  const tr = spp11 + spp22
  const det = spp11 * spp22 - spp12 * spp12
  // Affine needs ≥ 6 marks spanning both directions (collinear marks leave M undetermined).
  if (affine && cnt >= 6 && det > 1e-3 * tr * tr / 4) {
    const i11 = spp22 / det, i12 = -spp12 / det, i22 = spp11 / det
    const m11 = h11 * i11 + h12 * i12, m12 = h11 * i12 + h12 * i22
    const m21 = h21 * i11 + h22 * i12, m22 = h21 * i12 + h22 * i22
    return { model: { m11, m12, m21, m22, tx: mx - m11 * mpx - m12 * mpy, ty: my - m21 * mpx - m22 * mpy }, affine: true }
  }
  // Kabsch: θ = atan2(Σ p×x, Σ p·x); with no spread only the translation is determined.
  let theta = Math.atan2(current.m21 - current.m12, current.m11 + current.m22)
  if (tr > 1e-12) theta = Math.atan2(h21 - h12, h11 + h22)
  const c = Math.cos(theta), s = Math.sin(theta)
  return { model: { m11: c, m12: -s, m21: s, m22: c, tx: mx - c * mpx + s * mpy, ty: my - s * mpx - c * mpy }, affine: false }
}

/** Robust inlier threshold: 5 σ from the median residual of a 2-D Gaussian (median = 1.1774 σ), clamped. */
export function inlierThreshold(residual: Float64Array, active: Uint8Array, floor_nm: number, cap_nm: number): number {
  const r: number[] = []
  for (let k = 0; k < residual.length; k++) if (active[k]) r.push(residual[k]!)
  if (r.length === 0) return cap_nm
  r.sort((p, q) => p - q)
  const med = r[(r.length - 1) >> 1]!
  return Math.min(cap_nm, Math.max(floor_nm, 5 * med / 1.1774))
}
