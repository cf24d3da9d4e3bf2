import { InputError } from '#shared/errors'
import { getSiteType, getSurface } from '#shared/lattice/surfaces'

/** A lattice placed by hand: checked for a usable cell, with its rotation reported like a fit's. */
export function handLattice(body: { surface: string, site: string, a1: [number, number], a2: [number, number], origin: [number, number], basis?: [number, number][] }) {
  const surface = getSurface(body.surface)
  const site = getSiteType(surface, body.site)
  const cross = body.a1[0] * body.a2[1] - body.a1[1] * body.a2[0]
  const l1 = Math.hypot(...body.a1), l2 = Math.hypot(...body.a2)
  if (!(l1 > 1e-6)) throw new InputError('a1', 'a1 has zero length')
  if (!(l2 > 1e-6)) throw new InputError('a2', 'a2 has zero length')
  // Relative test (|sin| of the angle between them): typed-in vectors that are parallel up to rounding count as parallel.
  if (!(Math.abs(cross) > 1e-3 * l1 * l2)) throw new InputError('a2', 'a1 and a2 must not be parallel: the two cell vectors must span the plane')
  return {
    surface: surface.id, site: site.name, a1: body.a1, a2: body.a2, origin: body.origin,
    ...(body.basis && body.basis.length > 1 && { basis: body.basis }),
    rotation_deg: Math.atan2(body.a1[1], body.a1[0]) * 180 / Math.PI,
    residual_nm: null, outliers: [],
  }
}

/** The same lattice with its origin moved by whole lattice vectors to the site nearest `near`. */
export function anchorOrigin<T extends { a1: [number, number], a2: [number, number], origin: [number, number] }>(fit: T, near: [number, number]): T {
  const { a1, a2, origin } = fit
  const det = a1[0] * a2[1] - a1[1] * a2[0]
  if (!(Math.abs(det) > 1e-12)) return fit
  const dx = near[0] - origin[0], dy = near[1] - origin[1]
  const i = Math.round((dx * a2[1] - dy * a2[0]) / det)
  const j = Math.round((a1[0] * dy - a1[1] * dx) / det)
  return { ...fit, origin: [origin[0] + i * a1[0] + j * a2[0], origin[1] + i * a1[1] + j * a2[1]] }
}
