import { describe, expect, it } from 'vitest'
import { artificialLattice, expandBlueprint, expandShape } from '../../../shared/blueprint'
import { getSurface, idealLattice, siteAt } from '../../../shared/lattice'
import { expectInputError, windingInside } from '../lattice/helpers'

// Covering radius (circumradius of the site cell) of the single-site sets, closed forms from the
// cell geometry: hexagonal d/√3, square d/√2, rectangular √(d² + a²)/2.
const cases = [
  { id: 'Cu(111)', site: 'fcc', cover: (d: number) => d / Math.sqrt(3) },
  { id: 'Ag(100)', site: 'hollow', cover: (d: number) => d / Math.SQRT2 },
  { id: 'Pt(110)', site: 'top', cover: (d: number) => Math.hypot(d, d * Math.SQRT2) / 2 },
]

/** Brute force: the smallest distance from p to any site of the type with |i|, |j| ≤ R around the origin. */
function bruteNearest(id: string, site: string, p: [number, number], R = 70) {
  const lat = idealLattice(id, site)
  let best = Infinity
  const nb = lat.basis?.length ?? 1
  for (let i = -R; i <= R; i++) for (let j = -R; j <= R; j++) for (let b = 0; b < nb; b++) {
    const [x, y] = siteAt(lat, i, j, b)
    best = Math.min(best, Math.hypot(x - p[0], y - p[1]))
  }
  return best
}

describe('ring', () => {
  for (const c of cases) {
    it(`N atoms on radius R snap to the nearest sites with max deviation ≤ the site-cell circumradius (${c.id} ${c.site})`, () => {
      const d = getSurface(c.id).nn_nm
      for (const [n, R] of [[12, 2.1], [24, 4.4], [48, 7.13], [7, 1.5]] as const) {
        const sites = expandShape({ type: 'ring', center: [0.31, -0.17], radius_nm: R, n }, c.id, c.site)
        expect(sites).toHaveLength(n)
        for (const s of sites) {
          expect(s.deviation_nm).toBeCloseTo(Math.hypot(s.x_nm - s.ideal[0], s.y_nm - s.ideal[1]), 12)
          expect(Math.hypot(s.ideal[0] - 0.31, s.ideal[1] + 0.17)).toBeCloseTo(R, 12)
          expect(s.deviation_nm).toBeLessThanOrEqual(c.cover(d) + 1e-12)
        }
        // Nearest indeed: the snap distance equals a brute-force scan over sites (first 8 atoms).
        for (const s of sites.slice(0, 8)) expect(s.deviation_nm).toBeCloseTo(bruteNearest(c.id, c.site, s.ideal), 12)
      }
    })
  }

  it('the 48-atom, 7.13 nm ring on Cu(111) (Crommie, Lutz, Eigler, Science 1993) gives 48 distinct sites', () => {
    const sites = expandShape({ type: 'ring', center: [0, 0], radius_nm: 7.13, n: 48 }, 'Cu(111)', 'fcc')
    expect(new Set(sites.map(s => `${s.i},${s.j}`)).size).toBe(48)
  })

  it('rejects n < 3 and a radius too small for n atoms at the minimum spacing (chord 2R·sin(π/n))', () => {
    expectInputError(() => expandShape({ type: 'ring', center: [0, 0], radius_nm: 3, n: 2 }, 'Cu(111)'), 'n')
    // Default minimum spacing 2·nn = 0.5105 nm: R ≥ 0.5105 / (2 sin(π/48)) = 3.905 nm (derived).
    const rMin = 2 * getSurface('Cu(111)').nn_nm / (2 * Math.sin(Math.PI / 48))
    const msg = expectInputError(() => expandShape({ type: 'ring', center: [0, 0], radius_nm: rMin - 0.01, n: 48 }, 'Cu(111)'), 'radius_nm')
    expect(msg).toContain(rMin.toFixed(3))
    expect(expandShape({ type: 'ring', center: [0, 0], radius_nm: rMin + 0.01, n: 48 }, 'Cu(111)')).toHaveLength(48)
    expectInputError(() => expandShape({ type: 'ring', center: [0, 0], radius_nm: 1, n: 6 }, 'Cu(111)', 'fcc', { minSpacing_nm: 1.2 }), 'radius_nm')
    expectInputError(() => expandShape({ type: 'ring', center: [0, Number.NaN], radius_nm: 3, n: 6 }, 'Cu(111)'), 'center')
  })
})

describe('ellipse, chain, polygon, patch, sites', () => {
  it('an ellipse with equal semi-axes is the ring (equal arc length = equal angle on a circle)', () => {
    const e = expandShape({ type: 'ellipse', center: [0.2, 0.1], semi_a_nm: 3.3, semi_b_nm: 3.3, angle_deg: 0, n: 20 }, 'Ag(111)')
    const r = expandShape({ type: 'ring', center: [0.2, 0.1], radius_nm: 3.3, n: 20 }, 'Ag(111)')
    expect(e.map(s => [s.i, s.j])).toEqual(r.map(s => [s.i, s.j]))
  })

  it('ellipse points lie on the ellipse at equal arc-length spacing', () => {
    const [A, B, ang] = [5, 2.5, 30 * Math.PI / 180]
    const sites = expandShape({ type: 'ellipse', center: [0, 0], semi_a_nm: A, semi_b_nm: B, angle_deg: 30, n: 40 }, 'Cu(111)')
    const chords: number[] = []
    sites.forEach((s, k) => {
      const x = s.ideal[0] * Math.cos(ang) + s.ideal[1] * Math.sin(ang)
      const y = -s.ideal[0] * Math.sin(ang) + s.ideal[1] * Math.cos(ang)
      expect((x / A) ** 2 + (y / B) ** 2).toBeCloseTo(1, 6)
      const q = sites[(k + 1) % sites.length]!.ideal
      chords.push(Math.hypot(q[0] - s.ideal[0], q[1] - s.ideal[1]))
    })
    // Perimeter by Ramanujan's second approximation, π(a+b)(1 + 3h/(10 + √(4 − 3h))).
    const h = ((A - B) / (A + B)) ** 2
    const P = Math.PI * (A + B) * (1 + 3 * h / (10 + Math.sqrt(4 - 3 * h)))
    expect(chords.reduce((p, q) => p + q, 0)).toBeCloseTo(P, 1)
    expect(Math.max(...chords) - Math.min(...chords)).toBeLessThan(0.01)
  })

  it('chain: count sites, step × nearest-neighbour spacing along the chosen close-packed direction', () => {
    const s = getSurface('Cu(111)')
    for (let dir = 0; dir < 6; dir++) {
      const sites = expandShape({ type: 'chain', start: [2, -1], direction: dir, count: 9, step: 3 }, s, 'fcc')
      expect(sites).toHaveLength(9)
      for (let k = 1; k < 9; k++) {
        const dx = sites[k]!.x_nm - sites[k - 1]!.x_nm, dy = sites[k]!.y_nm - sites[k - 1]!.y_nm
        expect(Math.hypot(dx, dy)).toBeCloseTo(3 * s.nn_nm, 12)
        const turn = Math.atan2(dy, dx) * 180 / Math.PI - s.directions[dir]!.angle_deg
        expect(Math.abs(((turn % 360) + 540) % 360 - 180)).toBeLessThan(1e-9)
      }
    }
  })

  it('chain: leaving the scan bounds, starting outside, or an unknown direction are InputErrors', () => {
    const bounds = { x0: -2, y0: -2, x1: 2, y1: 2 }
    expectInputError(() => expandShape({ type: 'chain', start: [0, 0], direction: 0, count: 30, step: 1 }, 'Cu(111)', 'fcc', { bounds }), 'count')
    expectInputError(() => expandShape({ type: 'chain', start: [40, 0], direction: 0, count: 3, step: 1 }, 'Cu(111)', 'fcc', { bounds }), 'start')
    expectInputError(() => expandShape({ type: 'chain', start: [0, 0], direction: 6, count: 3, step: 1 }, 'Cu(111)'), 'direction')
    expectInputError(() => expandShape({ type: 'chain', start: [0, 0], direction: 4, count: 3, step: 1 }, 'Cu(100)'), 'direction')
    expectInputError(() => expandShape({ type: 'chain', start: [0.5, 0], direction: 0, count: 3, step: 1 }, 'Cu(111)'), 'start[0]')
    expect(expandShape({ type: 'chain', start: [0, 0], direction: 0, count: 7, step: 1 }, 'Cu(111)', 'fcc', { bounds })).toHaveLength(7)
  })

  it('polygon outline: sites within the covering radius of the outline, one per spacing', () => {
    const d = getSurface('Ag(100)').nn_nm
    const L = 20 * d
    const sites = expandShape({ type: 'polygon', vertices: [[0.1, 0.1], [0.1 + L, 0.1], [0.1 + L, 0.1 + L], [0.1, 0.1 + L]], spacing_steps: 2 }, 'Ag(100)', 'hollow')
    expect(sites).toHaveLength(40)
    for (const s of sites) expect(s.deviation_nm).toBeLessThanOrEqual(d / Math.SQRT2 + 1e-12)
  })

  it('patch: triangular lattice of spacing 3 on Cu(111) from the default origin (site 0, 0) lands exactly on sites; count ≈ area/(√3/2·D²)', () => {
    const d = getSurface('Cu(111)').nn_nm
    const region: [number, number][] = [[-5.03, -4.97], [5.01, -5.02], [4.98, 5.04], [-4.96, 5.02]]
    const sites = expandShape({ type: 'patch', kind: 'triangular', spacing: 3, region }, 'Cu(111)', 'fcc')
    for (const s of sites) expect(s.deviation_nm).toBeLessThan(1e-9)
    const D = 3 * d
    const expected = 100.4 / (Math.sqrt(3) / 2 * D * D)
    // Boundary term: perimeter × (cell diameter) / cell area.
    expect(Math.abs(sites.length - expected)).toBeLessThan(40 * 2 * D / (Math.sqrt(3) / 2 * D * D))
    for (const s of sites) expect(windingInside(s.ideal[0], s.ideal[1], region)).toBe(true)
  })

  it('artificial lattices have nearest-neighbour distance D and the textbook coordination numbers', () => {
    // Coordination: triangular 6, square 4, honeycomb 3, Lieb 4 (corner) and 2 (edge), kagome 4.
    const expected: Record<string, number[]> = { triangular: [6], square: [4], honeycomb: [3, 3], lieb: [4, 2, 2], kagome: [4, 4, 4] }
    for (const kind of ['triangular', 'square', 'honeycomb', 'lieb', 'kagome'] as const) {
      const D = 0.77
      const art = artificialLattice(kind, D)
      const pts: [number, number][] = []
      for (let i = -3; i <= 3; i++) for (let j = -3; j <= 3; j++) for (const b of art.basis) pts.push([i * art.a1[0] + j * art.a2[0] + b[0], i * art.a1[1] + j * art.a2[1] + b[1]])
      art.basis.forEach((b, k) => {
        const ds = pts.map(p => Math.hypot(p[0] - b[0], p[1] - b[1])).filter(x => x > 1e-9)
        const nn = Math.min(...ds)
        expect(nn).toBeCloseTo(D, 12)
        expect(ds.filter(x => Math.abs(x - D) < 1e-9)).toHaveLength(expected[kind]![k]!)
      })
    }
  })

  it('patch snaps every artificial point within the covering radius; honeycomb on Ag(100)', () => {
    const d = getSurface('Ag(100)').nn_nm
    const sites = expandShape({ type: 'patch', kind: 'honeycomb', spacing: 4, region: [[-4, -4], [4, -4], [4, 4], [-4, 4]], angle_deg: 15, origin: [0.3, 0.2] }, 'Ag(100)', 'hollow')
    // Honeycomb density: 2 sites per cell of area (3√3/2)·D².
    const D = 4 * d
    const expected = 64 * 2 / (1.5 * Math.sqrt(3) * D * D)
    expect(Math.abs(sites.length - expected)).toBeLessThan(32 * Math.sqrt(3) * D * 2 / (1.5 * Math.sqrt(3) * D * D))
    for (const s of sites) expect(s.deviation_nm).toBeLessThanOrEqual(d / Math.SQRT2 + 1e-12)
  })

  it('sites by index: exact positions, duplicates removed, b checked against the site type', () => {
    const s = getSurface('Pt(111)')
    const sites = expandShape({ type: 'sites', sites: [[1, 2], [1, 2, 0], [-3, 4], [1, 2]] }, s, 'fcc')
    expect(sites.map(x => [x.i, x.j, x.b])).toEqual([[1, 2, 0], [-3, 4, 0]])
    const off = s.sites.find(x => x.name === 'fcc')!.offsets_nm[0]!
    expect(sites[0]!.x_nm).toBeCloseTo(s.a1[0] + 2 * s.a2[0] + off[0], 12)
    expect(sites[0]!.deviation_nm).toBe(0)
    expectInputError(() => expandShape({ type: 'sites', sites: [[0, 0, 1]] }, s, 'fcc'), 'sites[0][2]')
    expect(expandShape({ type: 'sites', sites: [[0, 0, 2]] }, s, 'bridge')).toHaveLength(1)
  })
})

describe('expandBlueprint', () => {
  it('deduplicates across shapes and reports each duplicate with the shape that had the site first', () => {
    const out = expandBlueprint([
      { type: 'chain', start: [0, 0], direction: 0, count: 5, step: 2 },
      { type: 'chain', start: [4, 0], direction: 2, count: 3, step: 2 },
      { type: 'sites', sites: [[8, 0], [20, 20]] },
    ], 'Cu(111)', 'fcc')
    // Chain 1: (0,0) … (8,0); chain 2: (4,0), (4,2), (4,4) — (4,0) repeats; (8,0) repeats.
    expect(out.sites).toHaveLength(5 + 2 + 1)
    expect(out.duplicates.map(d => [d.shape, d.site, d.firstShape])).toEqual([[1, [4, 0, 0], 0], [2, [8, 0, 0], 0]])
    expect(out.perShape.map(p => p.count)).toEqual([5, 2, 1])
    expect(new Set(out.sites.map(s => `${s.i},${s.j},${s.b}`)).size).toBe(out.sites.length)
  })

  it('names the shape in errors and refuses an empty blueprint', () => {
    expectInputError(() => expandBlueprint([{ type: 'sites', sites: [[0, 0]] }, { type: 'ring', center: [0, 0], radius_nm: 0.5, n: 48 }], 'Cu(111)'), 'shapes[1].radius_nm')
    expectInputError(() => expandBlueprint([], 'Cu(111)'), 'shapes')
    expectInputError(() => expandBlueprint([{ type: 'sites', sites: [] }], 'Cu(111)'), 'shapes')
    expectInputError(() => expandBlueprint([{ type: 'ring', center: [0, 0], radius_nm: 5, n: 12 }], 'Cu(111)', 'hollow'), 'site')
  })
})
