// Surface library: fcc (111), (100), (110) surface cells built from the cubic lattice constant
// (standard crystallography: nn = a/√2; (111) hexagonal, (100) square, (110) a/√2 × a).
import { InputError } from '../errors'
import { type Vec2, angleDeg, cross, isFiniteVec, norm, rotate } from './vec'

export type Face = '111' | '100' | '110' | 'custom'

export interface SiteType {
  name: string
  /** Basis offsets (u, v) in cell-fractional coordinates: position = u·a1 + v·a2. */
  offsets_frac: Vec2[]
  /** The same offsets in nm in the ideal frame. */
  offsets_nm: Vec2[]
  description: string
}

export interface DragDirection {
  name: string
  angle_deg: number
  /** Unit vector in the ideal frame. */
  unit: Vec2
  /** The shortest lattice vector along this direction, as (di, dj). */
  lattice: [number, number]
  step_nm: number
}

export interface Surface {
  id: string
  element: string | null
  face: Face
  /** Bulk cubic lattice constant (nm); null for a custom cell. */
  a_nm: number | null
  source: string
  /** Surface cell vectors in the ideal frame (a1 along +x), nm. */
  a1: Vec2
  a2: Vec2
  /** Nearest-neighbour distance of the substrate atoms (shortest lattice vector), nm. */
  nn_nm: number
  cellArea_nm2: number
  sites: SiteType[]
  defaultSite: string
  directions: DragDirection[]
  /** Rotation that maps each site lattice onto itself about one of its sites: 60°, 90° or 180°. */
  symmetry_deg: number
}

const AM = 'Ashcroft & Mermin, Solid State Physics (1976), Table 4.3'

/** Cubic lattice constants in Å at room temperature, Ashcroft & Mermin Table 4.3. */
export const FCC_LATTICE_CONSTANTS_A: Record<string, number> = {
  Cu: 3.61, Ag: 4.09, Au: 4.08, Pt: 3.92, Ni: 3.52, Pd: 3.89,
}

const SITE_FRACTIONS: Record<Exclude<Face, 'custom'>, { name: string, frac: Vec2[], description: string }[]> = {
  // Convention of the ideal frame: the second-layer atom lies under (1/3, 2/3), which makes that
  // the hcp hollow; the fcc hollow (2/3, 1/3) lies over a third-layer atom. The two hollows are
  // a/√6 apart. Marks alone cannot tell the two apart; the user's choice of site type does.
  111: [
    { name: 'fcc', frac: [[2 / 3, 1 / 3]], description: 'threefold hollow over a third-layer atom' },
    { name: 'hcp', frac: [[1 / 3, 2 / 3]], description: 'threefold hollow over a second-layer atom' },
    { name: 'top', frac: [[0, 0]], description: 'on top of a surface atom' },
    { name: 'bridge', frac: [[0.5, 0], [0, 0.5], [0.5, 0.5]], description: 'between two surface atoms (3 per cell)' },
  ],
  100: [
    { name: 'hollow', frac: [[0.5, 0.5]], description: 'fourfold hollow' },
    { name: 'top', frac: [[0, 0]], description: 'on top of a surface atom' },
    { name: 'bridge', frac: [[0.5, 0], [0, 0.5]], description: 'between two surface atoms (2 per cell)' },
  ],
  // a1 runs along the close-packed rows (a/√2), a2 across them (a).
  110: [
    { name: 'hollow', frac: [[0.5, 0.5]], description: 'hollow between two rows, over a second-layer atom' },
    { name: 'top', frac: [[0, 0]], description: 'on top of a surface atom' },
    { name: 'short-bridge', frac: [[0.5, 0]], description: 'between neighbours along a row' },
    { name: 'long-bridge', frac: [[0, 0.5]], description: 'between neighbouring rows' },
  ],
}

function toNm(a1: Vec2, a2: Vec2, f: Vec2): Vec2 {
  return [f[0] * a1[0] + f[1] * a2[0], f[0] * a1[1] + f[1] * a2[1]]
}

function makeSiteType(name: string, a1: Vec2, a2: Vec2, frac: Vec2[], description: string): SiteType {
  return { name, offsets_frac: frac.map(f => [f[0], f[1]] as Vec2), offsets_nm: frac.map(f => toNm(a1, a2, f)), description }
}

/** Rotational symmetry of the Bravais lattice spanned by a1, a2 (after reduction). */
function latticeSymmetry(a1: Vec2, a2: Vec2): number {
  const l1 = norm(a1)
  const l2 = norm(a2)
  const c = (a1[0] * a2[0] + a1[1] * a2[1]) / (l1 * l2)
  const tol = 1e-9
  if (Math.abs(l1 - l2) < tol * l1 && Math.abs(Math.abs(c) - 0.5) < tol) return 60
  if (Math.abs(l1 - l2) < tol * l1 && Math.abs(c) < tol) return 90
  return 180
}

/** Drag directions: the shortest lattice vectors among ±a1, ±a2, ±(a1+a2), ±(a1−a2) no longer than the longer of a1, a2. */
function dragDirections(a1: Vec2, a2: Vec2): DragDirection[] {
  const cands: [number, number][] = [[1, 0], [0, 1], [1, 1], [1, -1]]
  const limit = Math.max(norm(a1), norm(a2)) * (1 + 1e-9)
  const out: DragDirection[] = []
  for (const [di, dj] of cands) {
    const v: Vec2 = [di * a1[0] + dj * a2[0], di * a1[1] + dj * a2[1]]
    const l = norm(v)
    if (l > limit) continue
    for (const s of [1, -1]) {
      const unit: Vec2 = [s * v[0] / l, s * v[1] / l]
      const angle = angleDeg(unit)
      out.push({ name: '', angle_deg: angle, unit, lattice: [s * di + 0, s * dj + 0], step_nm: l })
    }
  }
  // Counter-clockwise from +x so indices are stable and neighbouring indices are neighbouring directions.
  out.sort((p, q) => ((p.angle_deg + 360 + 1e-9) % 360) - ((q.angle_deg + 360 + 1e-9) % 360))
  for (const d of out) {
    d.name = `${Math.round(((d.angle_deg % 360) + 360) % 360)}°`
  }
  return out
}

function buildSurface(id: string, element: string | null, face: Face, a_nm: number | null, source: string,
  a1: Vec2, a2: Vec2, sites: SiteType[], defaultSite: string): Surface {
  const directions = dragDirections(a1, a2)
  if (face === '110') {
    for (const d of directions) d.name = `${d.name} ${Math.abs(d.unit[0]) > 0.5 ? 'along rows' : 'across rows'}`
  }
  return {
    id, element, face, a_nm, source, a1, a2,
    nn_nm: Math.min(...directions.map(d => d.step_nm)),
    cellArea_nm2: Math.abs(cross(a1, a2)),
    sites, defaultSite, directions,
    symmetry_deg: latticeSymmetry(a1, a2),
  }
}

function fccSurface(element: string, face: Exclude<Face, 'custom'>): Surface {
  const a_A = FCC_LATTICE_CONSTANTS_A[element]!
  const a_nm = a_A / 10
  const d = a_nm / Math.SQRT2
  const a1: Vec2 = [d, 0]
  const a2: Vec2 = face === '111' ? [-d / 2, d * Math.sqrt(3) / 2] : face === '100' ? [0, d] : [0, a_nm]
  const sites = SITE_FRACTIONS[face].map(s => makeSiteType(s.name, a1, a2, s.frac, s.description))
  const source = `${AM}: ${element} a = ${a_A.toFixed(2)} Å (room temperature); (${face}) cell derived from it`
  return buildSurface(`${element}(${face})`, element, face, a_nm, source, a1, a2, sites, face === '111' ? 'fcc' : 'hollow')
}

export const SURFACES: readonly Surface[] = Object.keys(FCC_LATTICE_CONSTANTS_A)
  .flatMap(el => (['111', '100', '110'] as const).map(face => fccSurface(el, face)))

const BY_ID = new Map(SURFACES.map(s => [s.id.toLowerCase(), s]))

/** Library surface by id, e.g. "Cu(111)" (case-insensitive); InputError(field) when unknown. */
export function getSurface(id: string, field = 'surface'): Surface {
  const s = typeof id === 'string' ? BY_ID.get(id.trim().toLowerCase()) : undefined
  if (!s) throw new InputError(field, `unknown surface "${String(id)}"; choose one of ${SURFACES.map(x => x.id).join(', ')}`)
  return s
}

export function resolveSurface(surface: string | Surface, field = 'surface'): Surface {
  return typeof surface === 'string' ? getSurface(surface, field) : surface
}

/** Site type on a surface (default: the surface's default site); InputError(field) when absent. */
export function getSiteType(surface: Surface, name?: string, field = 'site'): SiteType {
  const want = name ?? surface.defaultSite
  const s = surface.sites.find(x => x.name === want)
  if (!s) throw new InputError(field, `site type "${want}" does not exist on ${surface.id}; choose one of ${surface.sites.map(x => x.name).join(', ')}`)
  return s
}

export interface CustomSurfaceInput {
  a1: Vec2
  a2: Vec2
  /** Adsorption-site offsets in one cell, nm (given in the same frame as a1, a2); default [[0, 0]]. */
  basis?: Vec2[]
  id?: string
  source?: string
}

/**
 * A user-defined surface cell. The input is rotated so that a1 lies along +x (the ideal frame).
 * Site types: 'top' at the cell corner and 'site' with the given basis.
 */
export function customSurface(input: CustomSurfaceInput): Surface {
  if (!isFiniteVec(input.a1)) throw new InputError('a1', 'a1 must be two finite numbers [x, y] in nm')
  if (!isFiniteVec(input.a2)) throw new InputError('a2', 'a2 must be two finite numbers [x, y] in nm')
  const l1 = norm(input.a1)
  const l2 = norm(input.a2)
  if (!(l1 > 1e-6)) throw new InputError('a1', 'a1 has zero length')
  if (!(l2 > 1e-6)) throw new InputError('a2', 'a2 has zero length')
  if (Math.abs(cross(input.a1, input.a2)) < 1e-6 * l1 * l2) throw new InputError('a2', 'a2 is parallel to a1: the two cell vectors must span the plane')
  const basisIn = input.basis ?? [[0, 0]]
  if (!Array.isArray(basisIn) || basisIn.length === 0) throw new InputError('basis', 'basis must list at least one offset [x, y] in nm')
  basisIn.forEach((b, k) => {
    if (!isFiniteVec(b)) throw new InputError(`basis[${k}]`, 'each basis offset must be two finite numbers [x, y] in nm')
  })
  const turn = -angleDeg(input.a1)
  const a1 = rotate(input.a1, turn)
  a1[1] = 0
  const a2 = rotate(input.a2, turn)
  const det = cross(a1, a2)
  const basisNm = basisIn.map(b => rotate(b, turn))
  const frac = basisNm.map(p => [(p[0] * a2[1] - p[1] * a2[0]) / det, (a1[0] * p[1] - a1[1] * p[0]) / det] as Vec2)
  for (let k = 0; k < frac.length; k++) {
    for (let m = 0; m < k; m++) {
      const du = frac[k]![0] - frac[m]![0]
      const dv = frac[k]![1] - frac[m]![1]
      if (Math.abs(du - Math.round(du)) < 1e-9 && Math.abs(dv - Math.round(dv)) < 1e-9) throw new InputError(`basis[${k}]`, `basis offset ${k} repeats offset ${m} (they differ by a lattice vector)`)
    }
  }
  const sites = [makeSiteType('site', a1, a2, frac, 'custom basis'), makeSiteType('top', a1, a2, [[0, 0]], 'cell corner')]
  return buildSurface(input.id ?? 'custom', null, 'custom', null, input.source ?? 'user-defined cell', a1, a2, sites, 'site')
}
