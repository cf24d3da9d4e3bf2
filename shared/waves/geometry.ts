// Geometry the wave models need from a blueprint's sites: a least-squares circle through a ring's
// sites (Kåsa's algebraic fit, I. Kåsa, IEEE Trans. Instrum. Meas. 25, 8 (1976), refined by
// Gauss–Newton on the geometric distances) and the axis, length and spacing of a chain.
import { InputError } from '../errors'

export type Point = readonly [number, number]

export interface CircleFit {
  center: [number, number]
  radius_nm: number
  /** RMS of the sites' distances from the fitted circle, nm */
  rms_nm: number
  /** largest |distance − radius| over the sites, nm */
  max_nm: number
}

/** Solves the 3 × 3 system A·x = b (row-major) by Cramer's rule; null when singular. */
function solve3(A: readonly number[], b: readonly number[]): [number, number, number] | null {
  const [a, b1, c, d, e, f, g, h, i] = A as [number, number, number, number, number, number, number, number, number]
  const det = a * (e * i - f * h) - b1 * (d * i - f * g) + c * (d * h - e * g)
  const scale = Math.abs(a * e * i) + Math.abs(b1 * f * g) + Math.abs(c * d * h) + Math.abs(c * e * g) + Math.abs(b1 * d * i) + Math.abs(a * f * h)
  if (!(Math.abs(det) > 1e-13 * scale)) return null
  const [u, v, w] = b as [number, number, number]
  const x = (u * (e * i - f * h) - b1 * (v * i - f * w) + c * (v * h - e * w)) / det
  const y = (a * (v * i - f * w) - u * (d * i - f * g) + c * (d * w - v * g)) / det
  const z = (a * (e * w - v * h) - b1 * (d * w - v * g) + u * (d * h - e * g)) / det
  return [x, y, z]
}

function checkPoints(points: readonly Point[], field: string, min: number): void {
  if (!Array.isArray(points) || points.length < min) throw new InputError(field, `needs at least ${min} sites (got ${points?.length ?? 0})`)
  points.forEach((p, k) => {
    if (!Number.isFinite(p[0]) || !Number.isFinite(p[1])) throw new InputError(`${field}[${k}]`, 'must be two finite numbers [x, y] in nm')
  })
}

function geometricCost(points: readonly Point[], cx: number, cy: number, R: number): number {
  let s = 0
  for (const [x, y] of points) s += (Math.hypot(x - cx, y - cy) - R) ** 2
  return s
}

/**
 * Least-squares circle through ≥ 3 points: minimises Σ(|pᵢ − c| − R)². Kåsa's linear fit of
 * x² + y² + Dx + Ey + F = 0 gives the start (exact for points on a circle); Gauss–Newton with
 * step halving then minimises the geometric distances, which Kåsa's fit biases for short arcs.
 */
export function fitCircle(points: readonly Point[], field = 'sites'): CircleFit {
  checkPoints(points, field, 3)
  const n = points.length
  const [mx, my] = centroid(points)
  // Kåsa in coordinates centred on the mean (better conditioned): rows [u, v, 1], rhs −(u² + v²).
  let suu = 0, suv = 0, svv = 0, su = 0, sv = 0, suz = 0, svz = 0, sz = 0
  for (const [x, y] of points) {
    const u = x - mx, v = y - my, z = -(u * u + v * v)
    suu += u * u; suv += u * v; svv += v * v
    su += u; sv += v
    suz += u * z; svz += v * z; sz += z
  }
  const k = solve3([suu, suv, su, suv, svv, sv, su, sv, n], [suz, svz, sz])
  if (!k) throw new InputError(field, 'the sites lie on a straight line: no circle fits them')
  let cx = -k[0] / 2
  let cy = -k[1] / 2
  const r2 = cx * cx + cy * cy - k[2]
  if (!(r2 > 0)) throw new InputError(field, 'no circle fits these sites')
  let R = Math.sqrt(r2)
  let cost = geometricCost(points, cx + mx, cy + my, R)
  for (let it = 0; it < 100 && cost > 0; it++) {
    // Normal equations JᵀJ·δ = −Jᵀr with r = d − R, ∂r/∂c = −(p − c)/d, ∂r/∂R = −1.
    let a11 = 0, a12 = 0, a13 = 0, a22 = 0, a23 = 0, a33 = 0, g1 = 0, g2 = 0, g3 = 0
    for (const [x, y] of points) {
      const dx = x - mx - cx, dy = y - my - cy
      const d = Math.hypot(dx, dy) || 1e-300
      const j1 = -dx / d, j2 = -dy / d, r = d - R
      a11 += j1 * j1; a12 += j1 * j2; a13 -= j1; a22 += j2 * j2
      a23 -= j2; a33 += 1; g1 += j1 * r; g2 += j2 * r
      g3 -= r
    }
    const step = solve3([a11, a12, a13, a12, a22, a23, a13, a23, a33], [-g1, -g2, -g3])
    if (!step) break
    let t = 1
    let next = cost
    for (; t > 1e-6; t /= 2) {
      next = geometricCost(points, cx + t * step[0] + mx, cy + t * step[1] + my, R + t * step[2])
      if (next <= cost) break
    }
    if (next > cost) break
    cx += t * step[0]; cy += t * step[1]; R += t * step[2]
    const moved = Math.abs(t * step[0]) + Math.abs(t * step[1]) + Math.abs(t * step[2])
    cost = next
    if (moved < 1e-13 * (1 + R)) break
  }
  let max = 0
  for (const [x, y] of points) max = Math.max(max, Math.abs(Math.hypot(x - mx - cx, y - my - cy) - R))
  return { center: [cx + mx, cy + my], radius_nm: R, rms_nm: Math.sqrt(cost / n), max_nm: max }
}

export interface ChainFit {
  /** midpoint between the two end atoms, nm */
  center: [number, number]
  /** unit vector along the chain, from the first atom to the last (x ≥ 0, or +y when vertical) */
  direction: [number, number]
  atoms: number
  /** (distance between the end atoms) / (atoms − 1), nm; null for a single atom */
  spacing_nm: number | null
  /** RMS distance of the atoms from the axis, nm (0 for a straight chain) */
  offAxis_rms_nm: number
  /** the atoms' positions along the axis relative to the centre, sorted, nm */
  along_nm: number[]
}

/** Axis of a chain: the principal direction of the sites (largest eigenvector of the scatter). */
export function fitChain(points: readonly Point[], field = 'sites'): ChainFit {
  checkPoints(points, field, 1)
  const n = points.length
  const [mx, my] = centroid(points)
  if (n === 1) return { center: [mx, my], direction: [1, 0], atoms: 1, spacing_nm: null, offAxis_rms_nm: 0, along_nm: [0] }
  let sxx = 0, sxy = 0, syy = 0
  for (const [x, y] of points) {
    sxx += (x - mx) ** 2; sxy += (x - mx) * (y - my); syy += (y - my) ** 2
  }
  // Angle of the major axis of the 2 × 2 scatter matrix (closed form).
  const angle = 0.5 * Math.atan2(2 * sxy, sxx - syy)
  let ux = Math.cos(angle)
  let uy = Math.sin(angle)
  if (ux < -1e-12 || (Math.abs(ux) <= 1e-12 && uy < 0)) {
    ux = -ux
    uy = -uy
  }
  const t = points.map(([x, y]) => (x - mx) * ux + (y - my) * uy)
  let off = 0
  points.forEach(([x, y]) => {
    off += ((x - mx) * -uy + (y - my) * ux) ** 2
  })
  const lo = Math.min(...t)
  const hi = Math.max(...t)
  const mid = (lo + hi) / 2
  if (!(hi - lo > 1e-9)) throw new InputError(field, 'the chain sites coincide: no direction')
  return {
    center: [mx + mid * ux, my + mid * uy],
    direction: [ux, uy],
    atoms: n,
    spacing_nm: (hi - lo) / (n - 1),
    offAxis_rms_nm: Math.sqrt(off / n),
    along_nm: t.map(v => v - mid).sort((a, b) => a - b),
  }
}

function centroid(points: readonly Point[]): Point {
  let mx = 0
  let my = 0
  for (const [x, y] of points) {
    mx += x / points.length
    my += y / points.length
  }
  return [mx, my]
}
