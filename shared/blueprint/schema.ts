// Blueprint shapes (discriminated union on `type`): structural validation with zod; the geometric
// rules (ring too small, chain out of bounds, …) live in expand.ts and throw InputError by field.
// A blueprint lives in the ideal frame of its surface: surface atom at 0, a1 along +x, nm.
import { z } from 'zod'
import { InputError } from '../errors'
import { issueField } from '../lattice/schema'

const num = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be a finite number`)
const int = (what: string) => z.number({ error: `${what} must be a number` }).int(`${what} must be a whole number`)
const pos = (what: string) => num(what).refine(v => v > 0, `${what} must be greater than 0`)

export const Vec = z.tuple([num('x (nm)'), num('y (nm)')], { error: 'expected a point [x, y] in nm' })
export const SiteIndex = z.union([
  z.tuple([int('i'), int('j')]),
  z.tuple([int('i'), int('j'), int('b').min(0, 'b must be ≥ 0')]),
], { error: 'expected a site [i, j] or [i, j, b]' })

export const RingShape = z.object({
  type: z.literal('ring'),
  center: Vec,
  radius_nm: pos('radius_nm'),
  n: int('n'),
  /** Polar angle of the first atom, degrees; default 0. */
  phase_deg: num('phase_deg').optional(),
})

export const EllipseShape = z.object({
  type: z.literal('ellipse'),
  center: Vec,
  semi_a_nm: pos('semi_a_nm'),
  semi_b_nm: pos('semi_b_nm'),
  angle_deg: num('angle_deg').default(0),
  n: int('n'),
})

export const ChainShape = z.object({
  type: z.literal('chain'),
  start: SiteIndex,
  /** Index into the surface's drag directions (counter-clockwise from +x). */
  direction: int('direction').min(0, 'direction must be ≥ 0'),
  count: int('count').min(1, 'a chain needs at least 1 atom'),
  /** Lattice steps along the direction between neighbouring atoms. */
  step: int('step').min(1, 'step must be at least 1').default(1),
})

export const PolygonShape = z.object({
  type: z.literal('polygon'),
  vertices: z.array(Vec).min(3, 'a polygon needs at least 3 vertices'),
  /** Spacing of atoms along the outline in substrate nearest-neighbour distances. */
  spacing_steps: pos('spacing_steps'),
})

export const PatchKind = z.enum(['triangular', 'square', 'honeycomb', 'lieb', 'kagome'])

export const PatchShape = z.object({
  type: z.literal('patch'),
  kind: PatchKind,
  /** Nearest-neighbour distance of the artificial lattice in substrate nearest-neighbour distances. */
  spacing: pos('spacing'),
  region: z.array(Vec).min(3, 'a region needs at least 3 vertices'),
  /** A point of the artificial lattice, nm; default: site (0, 0, 0) of the chosen type. */
  origin: Vec.optional(),
  angle_deg: num('angle_deg').optional(),
})

export const SitesShape = z.object({
  type: z.literal('sites'),
  sites: z.array(SiteIndex),
})

export const Shape = z.discriminatedUnion('type', [RingShape, EllipseShape, ChainShape, PolygonShape, PatchShape, SitesShape])

export const BoundsRect = z.object({ x0: num('x0'), y0: num('y0'), x1: num('x1'), y1: num('y1') })

export const BlueprintInput = z.object({
  surface: z.string().min(1, 'surface must not be empty'),
  site: z.string().min(1).optional(),
  shapes: z.array(Shape).min(1, 'a blueprint needs at least one shape'),
  minSpacing_nm: pos('minSpacing_nm').optional(),
  bounds: z.union([BoundsRect, z.array(Vec).min(3)]).optional(),
})

export type Vec2 = z.infer<typeof Vec>
export type SiteIndex = z.infer<typeof SiteIndex>
export type RingShape = z.input<typeof RingShape>
export type EllipseShape = z.input<typeof EllipseShape>
export type ChainShape = z.input<typeof ChainShape>
export type PolygonShape = z.input<typeof PolygonShape>
export type PatchKind = z.infer<typeof PatchKind>
export type PatchShape = z.input<typeof PatchShape>
export type SitesShape = z.input<typeof SitesShape>
export type Shape = RingShape | EllipseShape | ChainShape | PolygonShape | PatchShape | SitesShape
export type BoundsRect = z.infer<typeof BoundsRect>
/** A box or a closed polygon in the blueprint's frame. */
export type Bounds = BoundsRect | Vec2[]
export type BlueprintInput = z.input<typeof BlueprintInput>

/** Parse a request body; throws InputError naming the first bad field (e.g. 'shapes[2].radius_nm'). */
export function parseBlueprintInput(body: unknown): z.output<typeof BlueprintInput> {
  const r = BlueprintInput.safeParse(body)
  if (!r.success) {
    const issue = r.error.issues[0]!
    throw new InputError(issueField(issue.path), issue.message)
  }
  return r.data
}
