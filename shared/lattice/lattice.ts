// Registered lattice: site (i, j, b) = origin + i·a1 + j·a2 + basis[b]. Nearest-site lookup through
// fractional coordinates in a Lagrange–Gauss reduced basis (closest point of a 2-D lattice).
import { InputError } from '../errors'
import { type Surface, getSiteType, resolveSurface } from './surfaces'
import { type Vec2, isFiniteVec, rotate } from './vec'

export interface Lattice {
  a1: Vec2
  a2: Vec2
  origin: Vec2
  /** Offsets of the sites in one cell relative to origin; absent means one site at the origin. */
  basis?: Vec2[]
}

export interface LatticeSite { i: number, j: number, b: number, x: number, y: number }
export interface NearestSite extends LatticeSite { distance: number }

/** Precomputed form of a lattice: inverse cell and a reduced basis with its unimodular map. */
export interface CompiledLattice {
  a1x: number
  a1y: number
  a2x: number
  a2y: number
  ox: number
  oy: number
  /** Inverse of [a1 a2]: u = i11·dx + i12·dy, v = i21·dx + i22·dy. */
  i11: number
  i12: number
  i21: number
  i22: number
  /** Reduced basis r1 = U00·a1 + U10·a2, r2 = U01·a1 + U11·a2 and the inverse of [r1 r2]. */
  r1x: number
  r1y: number
  r2x: number
  r2y: number
  ri11: number
  ri12: number
  ri21: number
  ri22: number
  U00: number
  U01: number
  U10: number
  U11: number
  basis: Float64Array
  nb: number
}

const cache = new WeakMap<Lattice, CompiledLattice>()

/** Lattices are treated as immutable values: the compiled form is cached per object. */
export function compileLattice(lat: Lattice): CompiledLattice {
  const hit = cache.get(lat)
  if (hit) return hit
  const { a1, a2, origin } = lat
  if (!isFiniteVec(a1)) throw new InputError('a1', 'a1 must be two finite numbers')
  if (!isFiniteVec(a2)) throw new InputError('a2', 'a2 must be two finite numbers')
  if (!isFiniteVec(origin)) throw new InputError('origin', 'origin must be two finite numbers')
  const det = a1[0] * a2[1] - a1[1] * a2[0]
  const scale2 = (a1[0] ** 2 + a1[1] ** 2) * (a2[0] ** 2 + a2[1] ** 2)
  if (!(Math.abs(det) > 1e-9 * Math.sqrt(scale2)) || scale2 === 0) throw new InputError('a2', 'a1 and a2 are parallel or zero')
  const basisIn = lat.basis && lat.basis.length > 0 ? lat.basis : [[0, 0] as Vec2]
  const basis = new Float64Array(basisIn.length * 2)
  basisIn.forEach((b, k) => {
    if (!isFiniteVec(b)) throw new InputError(`basis[${k}]`, 'basis offsets must be two finite numbers')
    basis[2 * k] = b[0]
    basis[2 * k + 1] = b[1]
  })
  // Lagrange–Gauss reduction; U tracks the columns so reduced indices map back to (i, j).
  let r1: Vec2 = [a1[0], a1[1]]
  let r2: Vec2 = [a2[0], a2[1]]
  let U = [1, 0, 0, 1] // [U00, U01, U10, U11]
  for (let it = 0; it < 100; it++) {
    if (r1[0] ** 2 + r1[1] ** 2 > r2[0] ** 2 + r2[1] ** 2) {
      ;[r1, r2] = [r2, r1]
      U = [U[1]!, U[0]!, U[3]!, U[2]!]
    }
    const m = Math.round((r1[0] * r2[0] + r1[1] * r2[1]) / (r1[0] ** 2 + r1[1] ** 2))
    if (m === 0) break
    r2 = [r2[0] - m * r1[0], r2[1] - m * r1[1]]
    U = [U[0]!, U[1]! - m * U[0]!, U[2]!, U[3]! - m * U[2]!]
  }
  const rdet = r1[0] * r2[1] - r1[1] * r2[0]
  const c: CompiledLattice = {
    a1x: a1[0], a1y: a1[1], a2x: a2[0], a2y: a2[1], ox: origin[0], oy: origin[1],
    i11: a2[1] / det, i12: -a2[0] / det, i21: -a1[1] / det, i22: a1[0] / det,
    r1x: r1[0], r1y: r1[1], r2x: r2[0], r2y: r2[1],
    ri11: r2[1] / rdet, ri12: -r2[0] / rdet, ri21: -r1[1] / rdet, ri22: r1[0] / rdet,
    U00: U[0]!, U01: U[1]!, U10: U[2]!, U11: U[3]!,
    basis, nb: basisIn.length,
  }
  cache.set(lat, c)
  return c
}

export function siteAt(lat: Lattice, i: number, j: number, b = 0): Vec2 {
  const s = lat.basis?.[b] ?? [0, 0]
  return [lat.origin[0] + i * lat.a1[0] + j * lat.a2[0] + s[0], lat.origin[1] + i * lat.a1[1] + j * lat.a2[1] + s[1]]
}

/** Fractional coordinates (u, v) with p − origin = u·a1 + v·a2 (basis ignored). */
export function toFractional(lat: Lattice, p: Vec2): Vec2 {
  const c = compileLattice(lat)
  const dx = p[0] - c.ox
  const dy = p[1] - c.oy
  return [c.i11 * dx + c.i12 * dy, c.i21 * dx + c.i22 * dy]
}

const scratch = { i: 0, j: 0, b: 0, x: 0, y: 0, d2: 0 }

/**
 * Closest site to (px, py) in O(nb): for each basis point the closest Bravais point lies among the
 * corners of the reduced cell around the rounded fractional coordinates; the 3×3 neighbourhood is
 * checked so that the answer is exact for any reduced basis. Writes into `scratch`.
 */
function nearestInto(c: CompiledLattice, px: number, py: number): void {
  let best = Infinity
  for (let b = 0; b < c.nb; b++) {
    const dx = px - c.ox - c.basis[2 * b]!
    const dy = py - c.oy - c.basis[2 * b + 1]!
    const p0 = Math.round(c.ri11 * dx + c.ri12 * dy)
    const q0 = Math.round(c.ri21 * dx + c.ri22 * dy)
    for (let dp = -1; dp <= 1; dp++) {
      for (let dq = -1; dq <= 1; dq++) {
        const p = p0 + dp
        const q = q0 + dq
        const ex = dx - p * c.r1x - q * c.r2x
        const ey = dy - p * c.r1y - q * c.r2y
        const d2 = ex * ex + ey * ey
        if (d2 < best) {
          best = d2
          scratch.i = c.U00 * p + c.U01 * q
          scratch.j = c.U10 * p + c.U11 * q
          scratch.b = b
          scratch.x = px - ex
          scratch.y = py - ey
        }
      }
    }
  }
  scratch.d2 = best
}

export function nearestSite(lat: Lattice, p: Vec2): NearestSite {
  nearestInto(compileLattice(lat), p[0], p[1])
  return { i: scratch.i + 0, j: scratch.j + 0, b: scratch.b, x: scratch.x, y: scratch.y, distance: Math.sqrt(scratch.d2) }
}

export interface NearestSites { i: Int32Array, j: Int32Array, b: Int32Array, x: Float64Array, y: Float64Array, distance: Float64Array }

/** Batch form over interleaved coordinates [x0, y0, x1, y1, …]. */
export function nearestSites(lat: Lattice, xy: Float64Array): NearestSites {
  const c = compileLattice(lat)
  const n = xy.length >> 1
  const out: NearestSites = { i: new Int32Array(n), j: new Int32Array(n), b: new Int32Array(n), x: new Float64Array(n), y: new Float64Array(n), distance: new Float64Array(n) }
  for (let k = 0; k < n; k++) {
    nearestInto(c, xy[2 * k]!, xy[2 * k + 1]!)
    out.i[k] = scratch.i
    out.j[k] = scratch.j
    out.b[k] = scratch.b
    out.x[k] = scratch.x
    out.y[k] = scratch.y
    out.distance[k] = Math.sqrt(scratch.d2)
  }
  return out
}

export interface Rect { x0: number, y0: number, x1: number, y1: number }

/** Crossing-number test; points within tol of an edge count as inside (closed region). */
export function pointInPolygon(x: number, y: number, poly: Vec2[], tol = 1e-9): boolean {
  let inside = false
  for (let k = 0, m = poly.length - 1; k < poly.length; m = k++) {
    const [xk, yk] = poly[k]!
    const [xm, ym] = poly[m]!
    const ex = xm - xk
    const ey = ym - yk
    const len2 = ex * ex + ey * ey
    const t = len2 > 0 ? Math.max(0, Math.min(1, ((x - xk) * ex + (y - yk) * ey) / len2)) : 0
    if ((x - xk - t * ex) ** 2 + (y - yk - t * ey) ** 2 <= tol * tol) return true
    if ((yk > y) !== (ym > y) && x < xk + (y - yk) * ex / ey) inside = !inside
  }
  return inside
}

export function polygonBounds(poly: Vec2[]): Rect {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity
  for (const [x, y] of poly) {
    x0 = Math.min(x0, x)
    y0 = Math.min(y0, y)
    x1 = Math.max(x1, x)
    y1 = Math.max(y1, y)
  }
  return { x0, y0, x1, y1 }
}

function validatePolygon(poly: Vec2[], field: string): void {
  if (!Array.isArray(poly) || poly.length < 3) throw new InputError(field, 'a region needs at least 3 vertices')
  poly.forEach((p, k) => {
    if (!isFiniteVec(p)) throw new InputError(`${field}[${k}]`, 'each vertex must be two finite numbers [x, y] in nm')
  })
}

function sitesInBox(lat: Lattice, box: Rect, accept: (x: number, y: number) => boolean, limit: number, field: string): LatticeSite[] {
  const c = compileLattice(lat)
  const out: LatticeSite[] = []
  const corners: Vec2[] = [[box.x0, box.y0], [box.x1, box.y0], [box.x0, box.y1], [box.x1, box.y1]]
  // Rough count first, so an absurd region fails fast instead of exhausting memory.
  const cellArea = Math.abs(c.a1x * c.a2y - c.a1y * c.a2x)
  if (((box.x1 - box.x0) * (box.y1 - box.y0) / cellArea) * c.nb > 4 * limit) throw new InputError(field, `region holds more than ${limit} sites`)
  for (let b = 0; b < c.nb; b++) {
    const bx = c.basis[2 * b]!
    const by = c.basis[2 * b + 1]!
    let u0 = Infinity, u1 = -Infinity, v0 = Infinity, v1 = -Infinity
    for (const [x, y] of corners) {
      const dx = x - c.ox - bx
      const dy = y - c.oy - by
      const u = c.i11 * dx + c.i12 * dy
      const v = c.i21 * dx + c.i22 * dy
      u0 = Math.min(u0, u)
      u1 = Math.max(u1, u)
      v0 = Math.min(v0, v)
      v1 = Math.max(v1, v)
    }
    for (let j = Math.floor(v0) - 1; j <= Math.ceil(v1) + 1; j++) {
      for (let i = Math.floor(u0) - 1; i <= Math.ceil(u1) + 1; i++) {
        const x = c.ox + i * c.a1x + j * c.a2x + bx
        const y = c.oy + i * c.a1y + j * c.a2y + by
        if (accept(x, y)) {
          if (out.length >= limit) throw new InputError(field, `region holds more than ${limit} sites`)
          out.push({ i: i + 0, j: j + 0, b, x, y })
        }
      }
    }
  }
  return out
}

/** All sites inside a closed polygon (vertices in nm, either orientation). */
export function sitesInPolygon(lat: Lattice, polygon: Vec2[], opts: { limit?: number, field?: string } = {}): LatticeSite[] {
  const field = opts.field ?? 'region'
  validatePolygon(polygon, field)
  const box = polygonBounds(polygon)
  const tol = 1e-9 * Math.max(1, box.x1 - box.x0, box.y1 - box.y0)
  return sitesInBox(lat, box, (x, y) => x >= box.x0 - tol && x <= box.x1 + tol && y >= box.y0 - tol && y <= box.y1 + tol && pointInPolygon(x, y, polygon, tol), opts.limit ?? 1_000_000, field)
}

/** All sites with x0 ≤ x ≤ x1 and y0 ≤ y ≤ y1. */
export function sitesInRect(lat: Lattice, rect: Rect, opts: { limit?: number, field?: string } = {}): LatticeSite[] {
  const field = opts.field ?? 'region'
  for (const k of ['x0', 'y0', 'x1', 'y1'] as const) {
    if (!Number.isFinite(rect[k])) throw new InputError(`${field}.${k}`, `${k} must be a finite number (nm)`)
  }
  const box = { x0: Math.min(rect.x0, rect.x1), y0: Math.min(rect.y0, rect.y1), x1: Math.max(rect.x0, rect.x1), y1: Math.max(rect.y0, rect.y1) }
  const tol = 1e-9 * Math.max(1, box.x1 - box.x0, box.y1 - box.y0)
  return sitesInBox(lat, box, (x, y) => x >= box.x0 - tol && x <= box.x1 + tol && y >= box.y0 - tol && y <= box.y1 + tol, opts.limit ?? 1_000_000, field)
}

/**
 * The sites of one type on a library or custom surface, placed in a scan: the ideal-frame origin
 * (a surface atom) goes to `origin`, the cell is turned by rotation_deg. Site (i, j, b) then sits at
 * the image of the ideal i·a1 + j·a2 + offset[b]; lattice.origin is site (0, 0, 0) of the type.
 */
export function latticeFromSurface(surface: string | Surface, siteType?: string, opts: { origin?: Vec2, rotation_deg?: number } = {}): Lattice {
  const s = resolveSurface(surface)
  const st = getSiteType(s, siteType)
  const rot = opts.rotation_deg ?? 0
  const o = opts.origin ?? [0, 0]
  if (!Number.isFinite(rot)) throw new InputError('rotation_deg', 'rotation_deg must be a finite number')
  if (!isFiniteVec(o)) throw new InputError('origin', 'origin must be two finite numbers [x, y] in nm')
  const off0 = st.offsets_nm[0]!
  const r0 = rotate(off0, rot)
  const lat: Lattice = { a1: rotate(s.a1, rot), a2: rotate(s.a2, rot), origin: [o[0] + r0[0], o[1] + r0[1]] }
  if (st.offsets_nm.length > 1) lat.basis = st.offsets_nm.map(b => rotate([b[0] - off0[0], b[1] - off0[1]], rot))
  return lat
}

/** The blueprint's own frame: ideal surface cell, surface atom at 0, a1 along +x. */
export function idealLattice(surface: string | Surface, siteType?: string): Lattice {
  return latticeFromSurface(surface, siteType)
}
