import { InputError } from '#shared/errors'
import { getSiteType, getSurface } from '#shared/lattice/surfaces'

/** A lattice placed by hand: checked for a usable cell, with its rotation reported like a fit's. */
export function handLattice(body: { surface: string, site: string, a1: [number, number], a2: [number, number], origin: [number, number], basis?: [number, number][] }) {
  const surface = getSurface(body.surface)
  const site = getSiteType(surface, body.site)
  const cross = body.a1[0] * body.a2[1] - body.a1[1] * body.a2[0]
  if (!(Math.abs(cross) > 1e-9)) throw new InputError('a2', 'a1 and a2 must not be parallel')
  return {
    surface: surface.id, site: site.name, a1: body.a1, a2: body.a2, origin: body.origin,
    ...(body.basis && body.basis.length > 1 && { basis: body.basis }),
    rotation_deg: Math.atan2(body.a1[1], body.a1[0]) * 180 / Math.PI,
    residual_nm: null, outliers: [],
  }
}
