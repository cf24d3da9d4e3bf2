// Canvas handles of a shape in the ideal frame and what dragging each one does: the move handle
// (centre, start or centroid) translates by whole lattice vectors, so the shape keeps its sites;
// radius and axis handles set lengths and angles; a chain's end handle picks the drag direction
// nearest the pointer and the count from the projection on it; vertex handles move one vertex.
import { nearestSite } from '../lattice/lattice'
import type { Vec2 } from '../lattice/vec'
import type { SiteContext } from './context'
import type { ChainShape, Shape } from './schema'
import { transformShape } from './transform'

export type HandleKind = 'move' | 'radius' | 'axis-a' | 'axis-b' | 'end' | 'vertex'
export interface Handle { kind: HandleKind, index?: number, p: Vec2 }

export function sitePosition(ctx: SiteContext, i: number, j: number, b = 0): Vec2 {
  const off = ctx.site.offsets_nm[b] ?? ctx.site.offsets_nm[0]!
  const { a1, a2 } = ctx.surface
  return [i * a1[0] + j * a2[0] + off[0], i * a1[1] + j * a2[1] + off[1]]
}

const centroid = (pts: readonly Vec2[]): Vec2 => {
  let x = 0, y = 0
  for (const p of pts) { x += p[0]; y += p[1] }
  return pts.length ? [x / pts.length, y / pts.length] : [0, 0]
}

function chainEnd(ctx: SiteContext, s: ChainShape): { start: Vec2, end: Vec2 } {
  const start = sitePosition(ctx, s.start[0], s.start[1], s.start[2] ?? 0)
  const d = ctx.surface.directions[s.direction] ?? ctx.surface.directions[0]!
  const L = (s.count - 1) * (s.step ?? 1) * d.step_nm
  return { start, end: [start[0] + d.unit[0] * L, start[1] + d.unit[1] * L] }
}

export function shapeHandles(shape: Shape, ctx: SiteContext): Handle[] {
  switch (shape.type) {
    case 'ring': {
      const a = (shape.phase_deg ?? 0) * Math.PI / 180
      return [{ kind: 'move', p: shape.center }, { kind: 'radius', p: [shape.center[0] + shape.radius_nm * Math.cos(a), shape.center[1] + shape.radius_nm * Math.sin(a)] }]
    }
    case 'ellipse': {
      const a = (shape.angle_deg ?? 0) * Math.PI / 180
      const [cx, cy] = shape.center
      return [
        { kind: 'move', p: shape.center },
        { kind: 'axis-a', p: [cx + shape.semi_a_nm * Math.cos(a), cy + shape.semi_a_nm * Math.sin(a)] },
        { kind: 'axis-b', p: [cx - shape.semi_b_nm * Math.sin(a), cy + shape.semi_b_nm * Math.cos(a)] },
      ]
    }
    case 'chain': {
      const { start, end } = chainEnd(ctx, shape)
      return shape.count > 1 ? [{ kind: 'move', p: start }, { kind: 'end', p: end }] : [{ kind: 'move', p: start }]
    }
    case 'polygon': return [{ kind: 'move', p: centroid(shape.vertices) }, ...shape.vertices.map((p, index) => ({ kind: 'vertex' as const, index, p }))]
    case 'patch': return [{ kind: 'move', p: centroid(shape.region) }, ...shape.region.map((p, index) => ({ kind: 'vertex' as const, index, p }))]
    case 'sites': return shape.sites.length ? [{ kind: 'move', p: centroid(shape.sites.map(s => sitePosition(ctx, s[0], s[1], s[2] ?? 0))) }] : []
  }
}

/** Chain from a start site towards a point: nearest drag direction, count from the projection. */
export function chainToward(ctx: SiteContext, start: [number, number, number], p: Vec2, step: number): ChainShape {
  const s = sitePosition(ctx, start[0], start[1], start[2])
  const v: Vec2 = [p[0] - s[0], p[1] - s[1]]
  let direction = 0, best = -Infinity
  ctx.surface.directions.forEach((d, k) => {
    const dot = d.unit[0] * v[0] + d.unit[1] * v[1]
    if (dot > best) { best = dot; direction = k }
  })
  const d = ctx.surface.directions[direction]!
  const count = Math.max(1, Math.round(Math.max(0, best) / (step * d.step_nm)) + 1)
  return { type: 'chain', start, direction, count, step }
}

/** The shape after dragging one of its non-move handles to the ideal-frame point p. */
export function dragHandle(shape: Shape, handle: Pick<Handle, 'kind' | 'index'>, p: Vec2, ctx: SiteContext): Shape {
  if (shape.type === 'ring' && handle.kind === 'radius') {
    const dx = p[0] - shape.center[0], dy = p[1] - shape.center[1]
    return { ...shape, radius_nm: Math.max(1e-3, Math.hypot(dx, dy)), phase_deg: Math.atan2(dy, dx) * 180 / Math.PI }
  }
  if (shape.type === 'ellipse' && handle.kind === 'axis-a') {
    const dx = p[0] - shape.center[0], dy = p[1] - shape.center[1]
    return { ...shape, semi_a_nm: Math.max(1e-3, Math.hypot(dx, dy)), angle_deg: Math.atan2(dy, dx) * 180 / Math.PI }
  }
  if (shape.type === 'ellipse' && handle.kind === 'axis-b') {
    const a = (shape.angle_deg ?? 0) * Math.PI / 180
    const proj = -(p[0] - shape.center[0]) * Math.sin(a) + (p[1] - shape.center[1]) * Math.cos(a)
    return { ...shape, semi_b_nm: Math.max(1e-3, Math.abs(proj)) }
  }
  if (shape.type === 'chain' && handle.kind === 'end') {
    const start: [number, number, number] = [shape.start[0], shape.start[1], shape.start[2] ?? 0]
    return chainToward(ctx, start, p, shape.step ?? 1)
  }
  if (handle.kind === 'vertex' && handle.index !== undefined) {
    if (shape.type === 'polygon') return { ...shape, vertices: shape.vertices.map((v, k) => k === handle.index ? p : v) }
    if (shape.type === 'patch') return { ...shape, region: shape.region.map((v, k) => k === handle.index ? p : v) }
  }
  return shape
}

/** The whole lattice vector (di, dj) nearest an ideal-frame displacement. */
export function latticeStep(ctx: SiteContext, delta: Vec2): [number, number] {
  const { a1, a2 } = ctx.surface
  const det = a1[0] * a2[1] - a1[1] * a2[0]
  const u = (delta[0] * a2[1] - delta[1] * a2[0]) / det
  const v = (a1[0] * delta[1] - a1[1] * delta[0]) / det
  return [Math.round(u) + 0, Math.round(v) + 0]
}

/** Translates a shape by the lattice vector nearest `delta` (ideal frame). */
export function moveByLattice(shape: Shape, delta: Vec2, ctx: SiteContext): Shape {
  const step = latticeStep(ctx, delta)
  if (step[0] === 0 && step[1] === 0) return shape
  return transformShape(shape, ctx.surface, ctx.site.name, { translateBy: step })
}

/** The site of the context's type nearest p, as [i, j, b] (the pivot for symmetry rotations). */
export function pivotSite(ctx: SiteContext, p: Vec2): [number, number, number] {
  const s = nearestSite(ctx.lattice, p)
  return [s.i, s.j, s.b]
}

/** The outline of a shape as polylines in the ideal frame (closed ones repeat their first point). */
export function shapeOutline(shape: Shape, ctx: SiteContext, segments = 96): Vec2[][] {
  const loop = (f: (t: number) => Vec2) => [Array.from({ length: segments + 1 }, (_, k) => f(2 * Math.PI * k / segments))]
  switch (shape.type) {
    case 'ring': return loop(t => [shape.center[0] + shape.radius_nm * Math.cos(t), shape.center[1] + shape.radius_nm * Math.sin(t)])
    case 'ellipse': {
      const a = (shape.angle_deg ?? 0) * Math.PI / 180
      return loop((t) => {
        const x = shape.semi_a_nm * Math.cos(t), y = shape.semi_b_nm * Math.sin(t)
        return [shape.center[0] + x * Math.cos(a) - y * Math.sin(a), shape.center[1] + x * Math.sin(a) + y * Math.cos(a)]
      })
    }
    case 'chain': {
      const { start, end } = chainEnd(ctx, shape)
      return [[start, end]]
    }
    case 'polygon': return [[...shape.vertices, shape.vertices[0]!]]
    case 'patch': return [[...shape.region, shape.region[0]!]]
    case 'sites': return []
  }
}
