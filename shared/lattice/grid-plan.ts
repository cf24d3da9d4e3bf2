// What the site-grid layer draws at a given zoom: single sites when neighbours are at least
// SITE_MIN_PX apart on screen, else lattice rows along the close-packed directions, every k-th row
// (k = 1, 2, 5, 10, 20, …) so that drawn rows stay at least ROW_MIN_PX apart. Work is bounded by
// the screen, not by the scan: a 100 nm scan at full view draws a few hundred lines.
import { compileLattice, type Lattice } from './lattice'

export const SITE_MIN_PX = 7
export const ROW_MIN_PX = 6

export interface Box { x0: number, y0: number, x1: number, y1: number }

export type GridPlan
  = | { mode: 'sites', spacing_px: number }
    | { mode: 'rows', every: number, spacing_px: number }

/** Shortest distance between sites of the (Bravais part of the) lattice, nm. */
export function shortestVector(lat: Lattice): number {
  const c = compileLattice(lat)
  return Math.min(Math.hypot(c.r1x, c.r1y), Math.hypot(c.r2x, c.r2y))
}

export function gridPlan(lat: Lattice, scale_px_per_nm: number, minSeparation_nm?: number): GridPlan {
  const sep = (minSeparation_nm ?? shortestVector(lat)) * scale_px_per_nm
  if (sep >= SITE_MIN_PX) return { mode: 'sites', spacing_px: sep }
  const row = Math.min(...rowFamilies(lat).map(f => f.spacing_nm)) * scale_px_per_nm
  const need = ROW_MIN_PX / row
  let every = 1
  search: for (let p = 1; p < 1e9; p *= 10) {
    for (const m of [1, 2, 5]) {
      if (m * p >= need) {
        every = m * p
        break search
      }
    }
  }
  return { mode: 'rows', every, spacing_px: row * every }
}

/** Calls fn(x, y, b) for every site inside the box (at most `limit`); returns how many it called. */
export function forEachSiteInBox(lat: Lattice, box: Box, fn: (x: number, y: number, b: number) => void, limit = 200_000): number {
  const c = compileLattice(lat)
  let count = 0
  for (let b = 0; b < c.nb; b++) {
    const bx = c.ox + c.basis[2 * b]!, by = c.oy + c.basis[2 * b + 1]!
    let u0 = Infinity, u1 = -Infinity, v0 = Infinity, v1 = -Infinity
    for (const [x, y] of [[box.x0, box.y0], [box.x1, box.y0], [box.x0, box.y1], [box.x1, box.y1]] as const) {
      const u = c.i11 * (x - bx) + c.i12 * (y - by), v = c.i21 * (x - bx) + c.i22 * (y - by)
      u0 = Math.min(u0, u)
      u1 = Math.max(u1, u)
      v0 = Math.min(v0, v)
      v1 = Math.max(v1, v)
    }
    for (let j = Math.floor(v0); j <= Math.ceil(v1); j++) {
      for (let i = Math.floor(u0); i <= Math.ceil(u1); i++) {
        const x = bx + i * c.a1x + j * c.a2x, y = by + i * c.a1y + j * c.a2y
        if (x < box.x0 || x > box.x1 || y < box.y0 || y > box.y1) continue
        if (count >= limit) return count
        fn(x, y, b)
        count++
      }
    }
  }
  return count
}

export interface RowFamily {
  /** Direction of the rows and the step between neighbouring rows (both lattice vectors, nm). */
  d: [number, number]
  e: [number, number]
  /** Perpendicular distance between neighbouring rows, nm. */
  spacing_nm: number
}

/** Row families along a1, a2 and the shorter of a1 ± a2 when it is no longer than both (hexagonal cells). */
export function rowFamilies(lat: Lattice): RowFamily[] {
  const { a1, a2 } = lat
  const l1 = Math.hypot(...a1), l2 = Math.hypot(...a2)
  const area = Math.abs(a1[0] * a2[1] - a1[1] * a2[0])
  const fam = (d: [number, number], e: [number, number]): RowFamily => ({ d, e, spacing_nm: area / Math.hypot(...d) })
  const out = [fam(a1, a2), fam(a2, a1)]
  const p: [number, number] = [a1[0] + a2[0], a1[1] + a2[1]]
  const m: [number, number] = [a1[0] - a2[0], a1[1] - a2[1]]
  const third = Math.hypot(...p) < Math.hypot(...m) ? p : m
  if (Math.hypot(...third) <= Math.max(l1, l2) * (1 + 1e-6)) out.push(fam(third, a2))
  return out
}

/** Segments [x0, y0, x1, y1] of every `every`-th row of each family, clipped to the box. */
export function rowSegments(lat: Lattice, box: Box, every: number, maxPerFamily = 600): number[] {
  const out: number[] = []
  const [ox, oy] = lat.origin
  for (const f of rowFamilies(lat)) {
    const len = Math.hypot(...f.d)
    const nx = -f.d[1] / len, ny = f.d[0] / len
    const step = nx * f.e[0] + ny * f.e[1]
    const base = nx * ox + ny * oy
    let lo = Infinity, hi = -Infinity
    for (const [x, y] of [[box.x0, box.y0], [box.x1, box.y0], [box.x0, box.y1], [box.x1, box.y1]] as const) {
      const m = (nx * x + ny * y - base) / step
      lo = Math.min(lo, m)
      hi = Math.max(hi, m)
    }
    const m0 = Math.ceil(lo / every) * every
    let drawn = 0
    for (let m = m0; m <= hi && drawn < maxPerFamily; m += every, drawn++) {
      const seg = clipLine(ox + m * f.e[0], oy + m * f.e[1], f.d[0] / len, f.d[1] / len, box)
      if (seg) out.push(...seg)
    }
  }
  return out
}

/** The part of the infinite line p + t·u inside the box (Liang–Barsky), or null. */
export function clipLine(px: number, py: number, ux: number, uy: number, box: Box): [number, number, number, number] | null {
  let t0 = -Infinity, t1 = Infinity
  for (const [u, p, lo, hi] of [[ux, px, box.x0, box.x1], [uy, py, box.y0, box.y1]] as const) {
    if (Math.abs(u) < 1e-15) {
      if (p < lo || p > hi) return null
      continue
    }
    const a = (lo - p) / u, b = (hi - p) / u
    t0 = Math.max(t0, Math.min(a, b))
    t1 = Math.min(t1, Math.max(a, b))
  }
  if (!(t1 > t0)) return null
  return [px + t0 * ux, py + t0 * uy, px + t1 * ux, py + t1 * uy]
}

/** Intersection of two boxes, or null when they do not overlap. */
export function intersectBox(a: Box, b: Box): Box | null {
  const r = { x0: Math.max(a.x0, b.x0), y0: Math.max(a.y0, b.y0), x1: Math.min(a.x1, b.x1), y1: Math.min(a.y1, b.y1) }
  return r.x1 > r.x0 && r.y1 > r.y0 ? r : null
}
