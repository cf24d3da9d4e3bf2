// Shape expansion: ideal target points snapped to the nearest site of the chosen type (closest
// lattice point; the snap distance is at most the site set's covering radius), deduplicated.
import { InputError } from '../errors'
import { nearestSite } from '../lattice/lattice'
import type { Surface } from '../lattice/surfaces'
import type { Vec2 } from '../lattice/vec'
import { type SiteContext, checkFinite, defaultMinSpacing, siteContext } from './context'
import type { Bounds, Shape } from './schema'
import { shapeTargets } from './targets'

export interface BlueprintSite {
  i: number
  j: number
  b: number
  /** Site position in the ideal frame, nm. */
  x_nm: number
  y_nm: number
  /** The unsnapped target point (equal to the site for index-given shapes). */
  ideal: Vec2
  /** Distance from the target point to the site, nm. */
  deviation_nm: number
}

export interface ExpandOptions {
  /** Minimum spacing used by shape validation (ring chord); default 2 × nearest-neighbour distance. */
  minSpacing_nm?: number
  /** When given, chains must stay inside (same frame as the blueprint). */
  bounds?: Bounds
  /** Field prefix for errors. */
  prefix?: string
  /** Largest number of sites a shape may produce; default 100 000. */
  maxSites?: number
}

export const siteKey = (i: number, j: number, b: number) => `${i},${j},${b}`

function snapAll(shape: Shape, ctx: SiteContext, opts: ExpandOptions): BlueprintSite[] {
  const minSpacing = opts.minSpacing_nm === undefined ? defaultMinSpacing(ctx.surface) : checkFinite(opts.minSpacing_nm, 'minSpacing_nm')
  if (!(minSpacing >= 0)) throw new InputError('minSpacing_nm', 'minSpacing_nm must not be negative')
  const targets = shapeTargets(shape, ctx, { minSpacing_nm: minSpacing, bounds: opts.bounds, prefix: opts.prefix, maxSites: opts.maxSites })
  const { a1, a2 } = ctx.surface
  const offs = ctx.site.offsets_nm
  return targets.map((t) => {
    if (t.kind === 'site') {
      const off = offs[t.b]!
      const x = t.i * a1[0] + t.j * a2[0] + off[0]
      const y = t.i * a1[1] + t.j * a2[1] + off[1]
      return { i: t.i, j: t.j, b: t.b, x_nm: x, y_nm: y, ideal: [x, y] as Vec2, deviation_nm: 0 }
    }
    const s = nearestSite(ctx.lattice, t.p)
    return { i: s.i, j: s.j, b: s.b, x_nm: s.x, y_nm: s.y, ideal: t.p, deviation_nm: s.distance }
  })
}

/** Snapped, deduplicated sites of one shape in the blueprint's ideal frame. */
export function expandShape(shape: Shape, surface: string | Surface, siteType?: string, opts: ExpandOptions = {}): BlueprintSite[] {
  const ctx = siteContext(surface, siteType)
  const seen = new Set<string>()
  return snapAll(shape, ctx, opts).filter((s) => {
    const k = siteKey(s.i, s.j, s.b)
    if (seen.has(k)) return false
    seen.add(k)
    return true
  })
}

export interface BlueprintDuplicate {
  /** The shape and target whose site was already taken. */
  shape: number
  target: number
  site: [number, number, number]
  /** Where the site was first produced. */
  firstShape: number
}

export interface ExpandedBlueprint {
  sites: (BlueprintSite & { shape: number })[]
  /** Targets that snapped onto a site already in the blueprint (same or earlier shape). */
  duplicates: BlueprintDuplicate[]
  perShape: { count: number, targets: number, maxDeviation_nm: number }[]
  maxDeviation_nm: number
  /** Upper bound for any snap distance on this site set (covering radius). */
  coveringRadius_nm: number
}

/** All shapes' sites, first occurrence kept; errors name the shape, e.g. 'shapes[1].radius_nm'. */
export function expandBlueprint(shapes: Shape[], surface: string | Surface, siteType?: string, opts: Omit<ExpandOptions, 'prefix'> = {}): ExpandedBlueprint {
  if (!Array.isArray(shapes) || shapes.length === 0) throw new InputError('shapes', 'a blueprint needs at least one shape')
  const ctx = siteContext(surface, siteType)
  const first = new Map<string, number>()
  const out: ExpandedBlueprint = { sites: [], duplicates: [], perShape: [], maxDeviation_nm: 0, coveringRadius_nm: ctx.coveringRadius_nm }
  const cap = opts.maxSites ?? 100_000
  shapes.forEach((shape, k) => {
    const snapped = snapAll(shape, ctx, { ...opts, prefix: `shapes[${k}].` })
    let count = 0, maxDev = 0
    snapped.forEach((s, t) => {
      const key = siteKey(s.i, s.j, s.b)
      const prev = first.get(key)
      maxDev = Math.max(maxDev, s.deviation_nm)
      if (prev !== undefined) {
        out.duplicates.push({ shape: k, target: t, site: [s.i, s.j, s.b], firstShape: prev })
        return
      }
      first.set(key, k)
      out.sites.push({ ...s, shape: k })
      count++
    })
    if (out.sites.length > cap) throw new InputError(`shapes[${k}]`, `the blueprint would hold more than ${cap} sites`)
    out.perShape.push({ count, targets: snapped.length, maxDeviation_nm: maxDev })
    out.maxDeviation_nm = Math.max(out.maxDeviation_nm, maxDev)
  })
  if (out.sites.length === 0) throw new InputError('shapes', 'the blueprint has no sites')
  return out
}
