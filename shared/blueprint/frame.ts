// Blueprint ↔ scan: a lattice fit maps ideal site (i, j, b) to origin + i·a1 + j·a2 + basis[b];
// the way back inverts the affine map A = [a1′ a2′]·[a1 a2]⁻¹ and snaps to the nearest site.
import { InputError } from '../errors'
import { type Lattice, nearestSite } from '../lattice/lattice'
import type { Surface } from '../lattice/surfaces'
import type { Vec2 } from '../lattice/vec'
import { siteContext } from './context'
import type { BlueprintSite } from './expand'

export interface FitFrame { a1: Vec2, a2: Vec2, origin: Vec2, basis?: Vec2[] }

function scanLattice(fit: FitFrame): Lattice {
  const lat: Lattice = { a1: fit.a1, a2: fit.a2, origin: fit.origin }
  if (fit.basis && fit.basis.length > 1) lat.basis = fit.basis
  return lat
}

/** Scan-frame positions (nm) of ideal sites through a lattice-fit result. */
export function toScanFrame(sites: readonly { i: number, j: number, b?: number }[], fit: FitFrame): Vec2[] {
  const nb = fit.basis && fit.basis.length > 1 ? fit.basis.length : 1
  return sites.map((s, k) => {
    const b = s.b ?? 0
    if (!Number.isInteger(s.i) || !Number.isInteger(s.j) || !Number.isInteger(b)) throw new InputError(`sites[${k}]`, 'site indices must be whole numbers')
    if (b < 0 || b >= nb) throw new InputError(`sites[${k}].b`, `b must be below ${nb}: the fit has ${nb} site(s) per cell`)
    const off = nb > 1 ? fit.basis![b]! : [0, 0]
    return [fit.origin[0] + s.i * fit.a1[0] + s.j * fit.a2[0] + off[0]!, fit.origin[1] + s.i * fit.a1[1] + s.j * fit.a2[1] + off[1]!]
  })
}

/**
 * Scan points → nearest fitted site, reported in the ideal frame: (i, j, b), the site's ideal
 * position, `ideal` = the point mapped into the ideal frame, deviation_nm measured in the scan.
 */
export function toIdealFrame(points: readonly Vec2[], fit: FitFrame, surface: string | Surface, siteType?: string): BlueprintSite[] {
  const ctx = siteContext(surface, siteType)
  const { a1, a2 } = ctx.surface
  const off0 = ctx.site.offsets_nm[0]!
  // A maps ideal-frame vectors to scan-frame vectors: A·[a1 a2] = [a1′ a2′].
  const det = a1[0] * a2[1] - a1[1] * a2[0]
  const inv = [a2[1] / det, -a2[0] / det, -a1[1] / det, a1[0] / det]
  const A = [
    fit.a1[0] * inv[0]! + fit.a2[0] * inv[2]!, fit.a1[0] * inv[1]! + fit.a2[0] * inv[3]!,
    fit.a1[1] * inv[0]! + fit.a2[1] * inv[2]!, fit.a1[1] * inv[1]! + fit.a2[1] * inv[3]!,
  ]
  const detA = A[0]! * A[3]! - A[1]! * A[2]!
  if (!(Math.abs(detA) > 1e-12)) throw new InputError('fit', 'the fit cell vectors are parallel or zero')
  const lat = scanLattice(fit)
  if (!lat.basis && ctx.site.offsets_nm.length > 1) {
    lat.basis = ctx.site.offsets_nm.map(o => [A[0]! * (o[0] - off0[0]) + A[1]! * (o[1] - off0[1]), A[2]! * (o[0] - off0[0]) + A[3]! * (o[1] - off0[1])] as Vec2)
  }
  return points.map((p, k) => {
    if (!Array.isArray(p) || !Number.isFinite(p[0]) || !Number.isFinite(p[1])) throw new InputError(`points[${k}]`, 'each point must be two finite numbers [x, y] in nm')
    const s = nearestSite(lat, p)
    const off = ctx.site.offsets_nm[s.b]!
    const dx = p[0] - fit.origin[0], dy = p[1] - fit.origin[1]
    const ideal: Vec2 = [off0[0] + (A[3]! * dx - A[1]! * dy) / detA, off0[1] + (-A[2]! * dx + A[0]! * dy) / detA]
    return { i: s.i, j: s.j, b: s.b, x_nm: s.i * a1[0] + s.j * a2[0] + off[0], y_nm: s.i * a1[1] + s.j * a2[1] + off[1], ideal, deviation_nm: s.distance }
  })
}
