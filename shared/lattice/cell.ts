// Geometry of a periodic site set: the covering radius (largest distance from any point to its
// nearest site = largest empty-circle radius, attained at a Delaunay circumcentre) and the
// smallest site separation, both evaluated on a 5 × 5-cell patch of the reduced cell.
import { type Lattice, compileLattice } from './lattice'

export interface SiteSetGeometry {
  /** Covering radius: no point lies further than this from a site (the site cell's circumradius). */
  coveringRadius_nm: number
  /** Smallest distance between two distinct sites. */
  minSeparation_nm: number
}

const cache = new WeakMap<Lattice, SiteSetGeometry>()

export function siteSetGeometry(lat: Lattice): SiteSetGeometry {
  const hit = cache.get(lat)
  if (hit) return hit
  const c = compileLattice(lat)
  const pts: number[] = []
  for (let p = -2; p <= 2; p++) {
    for (let q = -2; q <= 2; q++) {
      for (let b = 0; b < c.nb; b++) pts.push(p * c.r1x + q * c.r2x + c.basis[2 * b]!, p * c.r1y + q * c.r2y + c.basis[2 * b + 1]!)
    }
  }
  const n = pts.length / 2
  let minSep = Infinity
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      const d = Math.hypot(pts[2 * a]! - pts[2 * b]!, pts[2 * a + 1]! - pts[2 * b + 1]!)
      if (d > 1e-12 && d < minSep) minSep = d
    }
  }
  // Circumcentres inside the central reduced cell; keep the empty ones.
  const cx0 = c.basis[0]!
  const cy0 = c.basis[1]!
  let cover = 0
  const reach = 3 * Math.hypot(c.r1x + c.r2x, c.r1y + c.r2y) + 3 * Math.hypot(c.r1x - c.r2x, c.r1y - c.r2y)
  for (let a = 0; a < n; a++) {
    const ax = pts[2 * a]!, ay = pts[2 * a + 1]!
    if (Math.hypot(ax - cx0, ay - cy0) > reach) continue
    for (let b = a + 1; b < n; b++) {
      const bx = pts[2 * b]!, by = pts[2 * b + 1]!
      for (let k = b + 1; k < n; k++) {
        const kx = pts[2 * k]!, ky = pts[2 * k + 1]!
        const d = 2 * (ax * (by - ky) + bx * (ky - ay) + kx * (ay - by))
        if (Math.abs(d) < 1e-18) continue
        const a2 = ax * ax + ay * ay, b2 = bx * bx + by * by, k2 = kx * kx + ky * ky
        const ux = (a2 * (by - ky) + b2 * (ky - ay) + k2 * (ay - by)) / d
        const uy = (a2 * (kx - bx) + b2 * (ax - kx) + k2 * (bx - ax)) / d
        const fu = c.ri11 * ux + c.ri12 * uy
        const fv = c.ri21 * ux + c.ri22 * uy
        if (fu < 0 || fu >= 1 || fv < 0 || fv >= 1) continue
        const r = Math.hypot(ux - ax, uy - ay)
        if (r <= cover) continue
        let empty = true
        for (let m = 0; m < n && empty; m++) {
          if (Math.hypot(ux - pts[2 * m]!, uy - pts[2 * m + 1]!) < r * (1 - 1e-9)) empty = false
        }
        if (empty) cover = r
      }
    }
  }
  const g = { coveringRadius_nm: cover, minSeparation_nm: minSep }
  cache.set(lat, g)
  return g
}
