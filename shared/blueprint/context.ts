// The site lattice a blueprint snaps to: one site type of a surface in the ideal frame
// (surface atom at 0, a1 along +x), with its geometry (covering radius, site separation).
import { InputError } from '../errors'
import { type Lattice, idealLattice, pointInPolygon } from '../lattice/lattice'
import { siteSetGeometry } from '../lattice/cell'
import { type SiteType, type Surface, getSiteType, resolveSurface } from '../lattice/surfaces'
import type { Bounds } from './schema'

export interface SiteContext {
  surface: Surface
  site: SiteType
  lattice: Lattice
  /** Covering radius of the site set: the largest possible snap distance. */
  coveringRadius_nm: number
  minSeparation_nm: number
}

export function siteContext(surface: string | Surface, siteType?: string): SiteContext {
  const s = resolveSurface(surface)
  const st = getSiteType(s, siteType)
  const lattice = idealLattice(s, st.name)
  const g = siteSetGeometry(lattice)
  return { surface: s, site: st, lattice, coveringRadius_nm: g.coveringRadius_nm, minSeparation_nm: g.minSeparation_nm }
}

/** Default minimum spacing between blueprint atoms: 2 × the substrate nearest-neighbour distance (common practice). */
export function defaultMinSpacing(surface: Surface): number {
  return 2 * surface.nn_nm
}

export function checkFinite(v: unknown, field: string, what = 'a finite number'): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new InputError(field, `${field.split('.').pop()} must be ${what}`)
  return v
}

export function checkInt(v: unknown, field: string, min?: number): number {
  if (typeof v !== 'number' || !Number.isInteger(v)) throw new InputError(field, `${field.split('.').pop()} must be a whole number`)
  if (min !== undefined && v < min) throw new InputError(field, `${field.split('.').pop()} must be at least ${min}`)
  return v
}

export function checkVec(v: unknown, field: string): [number, number] {
  if (!Array.isArray(v) || v.length !== 2 || !Number.isFinite(v[0]) || !Number.isFinite(v[1])) throw new InputError(field, `${field.split('.').pop()} must be a point [x, y] of finite numbers (nm)`)
  return [v[0] as number, v[1] as number]
}

export function insideBounds(x: number, y: number, bounds: Bounds, tol = 1e-9): boolean {
  if (!Array.isArray(bounds)) {
    const x0 = Math.min(bounds.x0, bounds.x1), x1 = Math.max(bounds.x0, bounds.x1)
    const y0 = Math.min(bounds.y0, bounds.y1), y1 = Math.max(bounds.y0, bounds.y1)
    return x >= x0 - tol && x <= x1 + tol && y >= y0 - tol && y <= y1 + tol
  }
  return pointInPolygon(x, y, bounds, tol)
}

export function validateBounds(bounds: Bounds, field = 'bounds'): void {
  if (Array.isArray(bounds)) {
    if (bounds.length < 3) throw new InputError(field, 'bounds polygon needs at least 3 vertices')
    bounds.forEach((p, k) => checkVec(p, `${field}[${k}]`))
  }
  else {
    for (const k of ['x0', 'y0', 'x1', 'y1'] as const) checkFinite(bounds[k], `${field}.${k}`)
  }
}
