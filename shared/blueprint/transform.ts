// Copy / rotate / translate a shape by lattice symmetry: rotation by k × the surface's symmetry
// angle (60° on (111), 90° on (100), 180° on (110)) about a site, translation by i·a1 + j·a2.
// Both map a Bravais site set onto itself, so index-given shapes stay on sites exactly.
import { InputError } from '../errors'
import { nearestSite } from '../lattice/lattice'
import type { Surface } from '../lattice/surfaces'
import { type Vec2, rotateAbout } from '../lattice/vec'
import { type SiteContext, checkInt, siteContext } from './context'
import type { Shape, SiteIndex } from './schema'

export interface ShapeTransform {
  /** Number of symmetry steps (may be negative). */
  rotateBy?: number
  /** Pivot site [i, j] or [i, j, b]; default [0, 0, 0]. */
  about?: SiteIndex
  /** Lattice translation [di, dj]. */
  translateBy?: [number, number]
}

export function transformShape(shape: Shape, surface: string | Surface, siteType: string | undefined, t: ShapeTransform): Shape {
  const ctx = siteContext(surface, siteType)
  const k = t.rotateBy === undefined ? 0 : checkInt(t.rotateBy, 'rotateBy')
  const angle = k * ctx.surface.symmetry_deg
  const about = t.about ?? [0, 0, 0]
  if (!Array.isArray(about) || about.length < 2 || about.length > 3) throw new InputError('about', 'about must be a site [i, j] or [i, j, b]')
  const ai = checkInt(about[0], 'about[0]'), aj = checkInt(about[1], 'about[1]')
  const ab = about.length === 3 ? checkInt(about[2], 'about[2]', 0) : 0
  if (ab >= ctx.site.offsets_nm.length) throw new InputError('about[2]', `b must be below ${ctx.site.offsets_nm.length} for this site type`)
  const tr = t.translateBy ?? [0, 0]
  if (!Array.isArray(tr) || tr.length !== 2) throw new InputError('translateBy', 'translateBy must be a lattice vector [di, dj]')
  const di = checkInt(tr[0], 'translateBy[0]'), dj = checkInt(tr[1], 'translateBy[1]')
  const { a1, a2 } = ctx.surface
  const pivot = sitePos(ctx, ai, aj, ab)
  const shift: Vec2 = [di * a1[0] + dj * a2[0], di * a1[1] + dj * a2[1]]
  const map = (p: Vec2): Vec2 => {
    const r = rotateAbout(p, pivot, angle)
    return [r[0] + shift[0], r[1] + shift[1]]
  }
  const mapSite = (s: SiteIndex): [number, number, number] => {
    const p = map(sitePos(ctx, s[0], s[1], s[2] ?? 0))
    const hit = nearestSite(ctx.lattice, p)
    if (hit.distance > 1e-6) throw new InputError('rotateBy', `rotating by ${angle}° about this site does not map ${ctx.site.name} sites onto ${ctx.site.name} sites`)
    return [hit.i, hit.j, hit.b]
  }
  switch (shape.type) {
    case 'ring': return { ...shape, center: map(shape.center), phase_deg: (shape.phase_deg ?? 0) + angle }
    case 'ellipse': return { ...shape, center: map(shape.center), angle_deg: (shape.angle_deg ?? 0) + angle }
    case 'polygon': return { ...shape, vertices: shape.vertices.map(map) }
    case 'patch': return { ...shape, region: shape.region.map(map), origin: map(shape.origin ?? ctx.site.offsets_nm[0]!), angle_deg: (shape.angle_deg ?? 0) + angle }
    case 'sites': return { ...shape, sites: shape.sites.map(mapSite) }
    case 'chain': {
      const dirs = ctx.surface.directions
      const d = dirs[shape.direction]
      if (!d) throw new InputError('direction', `direction must be 0…${dirs.length - 1}`)
      const u = rotateAbout(d.unit, [0, 0], angle)
      const nd = dirs.findIndex(x => Math.hypot(x.unit[0] - u[0], x.unit[1] - u[1]) < 1e-9)
      if (nd < 0) throw new InputError('rotateBy', `rotating by ${angle}° does not map drag directions onto drag directions`)
      return { ...shape, start: mapSite(shape.start), direction: nd }
    }
  }
}

function sitePos(ctx: SiteContext, i: number, j: number, b: number): Vec2 {
  const off = ctx.site.offsets_nm[b]
  if (!off) throw new InputError('sites', `b must be below ${ctx.site.offsets_nm.length} for this site type`)
  const { a1, a2 } = ctx.surface
  return [i * a1[0] + j * a2[0] + off[0], i * a1[1] + j * a2[1] + off[1]]
}
