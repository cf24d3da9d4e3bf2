// Ideal target points of each shape before snapping: N points on a circle (θ_k = φ0 + 2πk/N),
// N points at equal arc length on an ellipse, lattice walks for chains, points at equal spacing
// along a polygon outline, and artificial-lattice points (triangular, square, honeycomb, Lieb,
// kagome at nearest-neighbour distance D) clipped to a region.
import { InputError } from '../errors'
import { type Lattice, sitesInPolygon } from '../lattice/lattice'
import type { Vec2 } from '../lattice/vec'
import { type SiteContext, checkFinite, checkInt, checkVec, insideBounds, validateBounds } from './context'
import type { Bounds, ChainShape, EllipseShape, PatchKind, PatchShape, PolygonShape, RingShape, Shape, SitesShape } from './schema'

/** A point to snap (nm, ideal frame) or an exact site. */
export type Target = { kind: 'point', p: Vec2 } | { kind: 'site', i: number, j: number, b: number }

export interface TargetOptions {
  minSpacing_nm: number
  bounds?: Bounds
  /** Field prefix for errors, e.g. 'shapes[2].'. */
  prefix?: string
  maxSites?: number
}

function ringTargets(s: RingShape, o: TargetOptions, f: string): Target[] {
  const c = checkVec(s.center, `${f}center`)
  const R = checkFinite(s.radius_nm, `${f}radius_nm`)
  const n = checkInt(s.n, `${f}n`)
  if (n < 3) throw new InputError(`${f}n`, `a ring needs at least 3 atoms (got ${n})`)
  if (n > (o.maxSites ?? 100_000)) throw new InputError(`${f}n`, `at most ${o.maxSites ?? 100_000} atoms per shape`)
  if (!(R > 0)) throw new InputError(`${f}radius_nm`, 'radius_nm must be greater than 0')
  const phase = (s.phase_deg === undefined ? 0 : checkFinite(s.phase_deg, `${f}phase_deg`)) * Math.PI / 180
  const chord = 2 * R * Math.sin(Math.PI / n)
  if (chord < o.minSpacing_nm) {
    const rMin = o.minSpacing_nm / (2 * Math.sin(Math.PI / n))
    throw new InputError(`${f}radius_nm`, `radius ${R.toFixed(3)} nm is too small for ${n} atoms: neighbours would be ${chord.toFixed(3)} nm apart, below the ${o.minSpacing_nm.toFixed(3)} nm minimum spacing (needs radius ≥ ${rMin.toFixed(3)} nm)`)
  }
  return Array.from({ length: n }, (_, k) => {
    const a = phase + 2 * Math.PI * k / n
    return { kind: 'point' as const, p: [c[0] + R * Math.cos(a), c[1] + R * Math.sin(a)] as Vec2 }
  })
}

function ellipseTargets(s: EllipseShape, o: TargetOptions, f: string): Target[] {
  const c = checkVec(s.center, `${f}center`)
  const A = checkFinite(s.semi_a_nm, `${f}semi_a_nm`)
  const B = checkFinite(s.semi_b_nm, `${f}semi_b_nm`)
  const n = checkInt(s.n, `${f}n`)
  if (!(A > 0)) throw new InputError(`${f}semi_a_nm`, 'semi_a_nm must be greater than 0')
  if (!(B > 0)) throw new InputError(`${f}semi_b_nm`, 'semi_b_nm must be greater than 0')
  if (n < 3) throw new InputError(`${f}n`, `an ellipse needs at least 3 atoms (got ${n})`)
  if (n > (o.maxSites ?? 100_000)) throw new InputError(`${f}n`, `at most ${o.maxSites ?? 100_000} atoms per shape`)
  const ang = (s.angle_deg === undefined ? 0 : checkFinite(s.angle_deg, `${f}angle_deg`)) * Math.PI / 180
  // Equal arc length: tabulate s(t) on a fine grid and invert by linear interpolation.
  const M = Math.max(4096, 8 * n)
  const cum = new Float64Array(M + 1)
  for (let k = 1; k <= M; k++) {
    const t0 = 2 * Math.PI * (k - 1) / M, t1 = 2 * Math.PI * k / M
    cum[k] = cum[k - 1]! + Math.hypot(A * (Math.cos(t1) - Math.cos(t0)), B * (Math.sin(t1) - Math.sin(t0)))
  }
  const L = cum[M]!
  const pts: Vec2[] = []
  let seg = 0
  for (let k = 0; k < n; k++) {
    const target = L * k / n
    while (seg < M - 1 && cum[seg + 1]! < target) seg++
    const t = 2 * Math.PI * (seg + (target - cum[seg]!) / Math.max(1e-300, cum[seg + 1]! - cum[seg]!)) / M
    const ex = A * Math.cos(t), ey = B * Math.sin(t)
    pts.push([c[0] + ex * Math.cos(ang) - ey * Math.sin(ang), c[1] + ex * Math.sin(ang) + ey * Math.cos(ang)])
  }
  let minChord = Infinity
  for (let k = 0; k < n; k++) {
    const p = pts[k]!, q = pts[(k + 1) % n]!
    minChord = Math.min(minChord, Math.hypot(p[0] - q[0], p[1] - q[1]))
  }
  if (minChord < o.minSpacing_nm) throw new InputError(`${f}n`, `${n} atoms on this ellipse would be ${minChord.toFixed(3)} nm apart, below the ${o.minSpacing_nm.toFixed(3)} nm minimum spacing`)
  return pts.map(p => ({ kind: 'point' as const, p }))
}

function siteOf(v: unknown, nb: number, field: string): { i: number, j: number, b: number } {
  if (!Array.isArray(v) || (v.length !== 2 && v.length !== 3)) throw new InputError(field, 'a site is [i, j] or [i, j, b]')
  const i = checkInt(v[0], `${field}[0]`)
  const j = checkInt(v[1], `${field}[1]`)
  const b = v.length === 3 ? checkInt(v[2], `${field}[2]`, 0) : 0
  if (b >= nb) throw new InputError(`${field}[2]`, `b must be below ${nb} for this site type`)
  return { i, j, b }
}

function chainTargets(s: ChainShape, ctx: SiteContext, o: TargetOptions, f: string): Target[] {
  const start = siteOf(s.start, ctx.site.offsets_nm.length, `${f}start`)
  const dirs = ctx.surface.directions
  const di = checkInt(s.direction, `${f}direction`, 0)
  if (di >= dirs.length) throw new InputError(`${f}direction`, `direction must be 0…${dirs.length - 1} on ${ctx.surface.id} (${dirs.map((d, k) => `${k}: ${d.name}`).join(', ')})`)
  const count = checkInt(s.count, `${f}count`, 1)
  const step = s.step === undefined ? 1 : checkInt(s.step, `${f}step`, 1)
  if (count > (o.maxSites ?? 100_000)) throw new InputError(`${f}count`, `at most ${o.maxSites ?? 100_000} atoms per shape`)
  const [li, lj] = dirs[di]!.lattice
  const out: Target[] = []
  for (let k = 0; k < count; k++) {
    const t = { kind: 'site' as const, i: start.i + k * step * li, j: start.j + k * step * lj, b: start.b }
    if (o.bounds) {
      const off = ctx.site.offsets_nm[t.b]!
      const x = t.i * ctx.surface.a1[0] + t.j * ctx.surface.a2[0] + off[0]
      const y = t.i * ctx.surface.a1[1] + t.j * ctx.surface.a2[1] + off[1]
      if (!insideBounds(x, y, o.bounds)) {
        if (k === 0) throw new InputError(`${f}start`, 'the chain starts outside the scan bounds')
        throw new InputError(`${f}count`, `the chain leaves the scan bounds after ${k} of ${count} atoms`)
      }
    }
    out.push(t)
  }
  return out
}

function polygonTargets(s: PolygonShape, ctx: SiteContext, o: TargetOptions, f: string): Target[] {
  if (!Array.isArray(s.vertices) || s.vertices.length < 3) throw new InputError(`${f}vertices`, 'a polygon needs at least 3 vertices')
  const v = s.vertices.map((p, k) => checkVec(p, `${f}vertices[${k}]`))
  const steps = checkFinite(s.spacing_steps, `${f}spacing_steps`)
  if (!(steps > 0)) throw new InputError(`${f}spacing_steps`, 'spacing_steps must be greater than 0')
  const spacing = steps * ctx.surface.nn_nm
  const out: Target[] = []
  for (let k = 0; k < v.length; k++) {
    const p = v[k]!, q = v[(k + 1) % v.length]!
    const len = Math.hypot(q[0] - p[0], q[1] - p[1])
    const m = Math.max(1, Math.round(len / spacing))
    if (out.length + m > (o.maxSites ?? 100_000)) throw new InputError(`${f}spacing_steps`, `the outline would hold more than ${o.maxSites ?? 100_000} atoms`)
    for (let t = 0; t < m; t++) out.push({ kind: 'point', p: [p[0] + (q[0] - p[0]) * t / m, p[1] + (q[1] - p[1]) * t / m] })
  }
  return out
}

/** Artificial lattice with nearest-neighbour distance D (nm) in its own frame. */
export function artificialLattice(kind: PatchKind, D: number): { a1: Vec2, a2: Vec2, basis: Vec2[] } {
  const h = Math.sqrt(3) / 2
  switch (kind) {
    case 'triangular': return { a1: [D, 0], a2: [D / 2, D * h], basis: [[0, 0]] }
    case 'square': return { a1: [D, 0], a2: [0, D], basis: [[0, 0]] }
    // Two sites per cell of constant √3·D, the second at (a1 + a2)/3: each has 3 neighbours at D.
    case 'honeycomb': return { a1: [Math.sqrt(3) * D, 0], a2: [Math.sqrt(3) * D / 2, Math.sqrt(3) * D * h], basis: [[0, 0], [Math.sqrt(3) * D / 2, D / 2]] }
    // Square cell 2D: corner plus the two edge midpoints.
    case 'lieb': return { a1: [2 * D, 0], a2: [0, 2 * D], basis: [[0, 0], [D, 0], [0, D]] }
    // Triangular cell 2D: corner plus the midpoints of a1 and a2.
    case 'kagome': return { a1: [2 * D, 0], a2: [D, 2 * D * h], basis: [[0, 0], [D, 0], [D / 2, D * h]] }
  }
}

function patchTargets(s: PatchShape, ctx: SiteContext, o: TargetOptions, f: string): Target[] {
  const kinds: PatchKind[] = ['triangular', 'square', 'honeycomb', 'lieb', 'kagome']
  if (!kinds.includes(s.kind)) throw new InputError(`${f}kind`, `kind must be one of ${kinds.join(', ')}`)
  const spacing = checkFinite(s.spacing, `${f}spacing`)
  if (!(spacing > 0)) throw new InputError(`${f}spacing`, 'spacing must be greater than 0')
  if (!Array.isArray(s.region) || s.region.length < 3) throw new InputError(`${f}region`, 'a region needs at least 3 vertices')
  const region = s.region.map((p, k) => checkVec(p, `${f}region[${k}]`))
  // Default origin: site (0, 0, 0) of the chosen type, so commensurate patches sit on sites.
  const origin = s.origin === undefined ? ctx.site.offsets_nm[0]! : checkVec(s.origin, `${f}origin`)
  const ang = (s.angle_deg === undefined ? 0 : checkFinite(s.angle_deg, `${f}angle_deg`)) * Math.PI / 180
  const art = artificialLattice(s.kind, spacing * ctx.surface.nn_nm)
  const rot = (p: Vec2): Vec2 => [p[0] * Math.cos(ang) - p[1] * Math.sin(ang), p[0] * Math.sin(ang) + p[1] * Math.cos(ang)]
  const lat: Lattice = { a1: rot(art.a1), a2: rot(art.a2), origin, basis: art.basis.map(rot) }
  const pts = sitesInPolygon(lat, region, { limit: o.maxSites ?? 100_000, field: `${f}region` })
  return pts.map(p => ({ kind: 'point' as const, p: [p.x, p.y] as Vec2 }))
}

function sitesTargets(s: SitesShape, ctx: SiteContext, o: TargetOptions, f: string): Target[] {
  if (!Array.isArray(s.sites)) throw new InputError(`${f}sites`, 'sites must be a list of [i, j] or [i, j, b]')
  if (s.sites.length > (o.maxSites ?? 100_000)) throw new InputError(`${f}sites`, `at most ${o.maxSites ?? 100_000} sites per shape`)
  return s.sites.map((v, k) => ({ kind: 'site' as const, ...siteOf(v, ctx.site.offsets_nm.length, `${f}sites[${k}]`) }))
}

export function shapeTargets(shape: Shape, ctx: SiteContext, o: TargetOptions): Target[] {
  const f = o.prefix ?? ''
  if (o.bounds) validateBounds(o.bounds)
  if (!shape || typeof shape !== 'object') throw new InputError(f ? f.slice(0, -1) : 'shape', 'a shape must be an object with a type')
  switch (shape.type) {
    case 'ring': return ringTargets(shape, o, f)
    case 'ellipse': return ellipseTargets(shape, o, f)
    case 'chain': return chainTargets(shape, ctx, o, f)
    case 'polygon': return polygonTargets(shape, ctx, o, f)
    case 'patch': return patchTargets(shape, ctx, o, f)
    case 'sites': return sitesTargets(shape, ctx, o, f)
    default: throw new InputError(`${f}type`, `unknown shape type "${String((shape as { type?: unknown }).type)}"; use ring, ellipse, chain, polygon, patch or sites`)
  }
}
