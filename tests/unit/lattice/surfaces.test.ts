import { describe, expect, it } from 'vitest'
import { expectInputError } from './helpers'
import { SURFACES, customSurface, getSiteType, getSurface, idealLattice, siteSetGeometry } from '../../../shared/lattice'

// Lattice constants in Å: Ashcroft & Mermin, Solid State Physics, Table 4.3.
const AM: Record<string, number> = { Cu: 3.61, Ag: 4.09, Au: 4.08, Pt: 3.92, Ni: 3.52, Pd: 3.89 }

const len = (v: readonly number[]) => Math.hypot(v[0]!, v[1]!)
const angle = (p: readonly number[], q: readonly number[]) => Math.acos((p[0]! * q[0]! + p[1]! * q[1]!) / (len(p) * len(q))) * 180 / Math.PI

describe('surface library', () => {
  it('holds (111), (100), (110) of the six metals with the handbook constants and their source', () => {
    expect(SURFACES).toHaveLength(18)
    for (const [el, a] of Object.entries(AM)) {
      for (const face of ['111', '100', '110']) {
        const s = getSurface(`${el}(${face})`)
        expect(s.a_nm).toBeCloseTo(a / 10, 12)
        expect(s.source).toContain('Ashcroft & Mermin')
        expect(s.source).toContain(a.toFixed(2))
      }
    }
  })

  it('nearest-neighbour distance is a/√2 (derived; Cu 0.2553 nm with 3.61 Å)', () => {
    for (const [el, a] of Object.entries(AM)) {
      for (const face of ['111', '100', '110']) expect(getSurface(`${el}(${face})`).nn_nm).toBeCloseTo(a / 10 / Math.SQRT2, 12)
    }
    expect(getSurface('Cu(111)').nn_nm).toBeCloseTo(0.2553, 4)
  })

  it('(111) cell is hexagonal: |a1| = |a2| = a/√2 at 120°, a1 along +x (standard crystallography)', () => {
    for (const el of Object.keys(AM)) {
      const s = getSurface(`${el}(111)`)
      const d = AM[el]! / 10 / Math.SQRT2
      expect(len(s.a1)).toBeCloseTo(d, 12)
      expect(len(s.a2)).toBeCloseTo(d, 12)
      expect(angle(s.a1, s.a2)).toBeCloseTo(120, 10)
      expect(s.a1[1]).toBe(0)
      expect(s.cellArea_nm2).toBeCloseTo(Math.sqrt(3) / 2 * d * d, 12)
      expect(s.symmetry_deg).toBe(60)
    }
  })

  it('(100) is square with side a/√2 and (110) rectangular a/√2 × a (standard crystallography)', () => {
    for (const [el, aA] of Object.entries(AM)) {
      const a = aA / 10
      const s100 = getSurface(`${el}(100)`)
      expect(len(s100.a1)).toBeCloseTo(a / Math.SQRT2, 12)
      expect(len(s100.a2)).toBeCloseTo(a / Math.SQRT2, 12)
      expect(angle(s100.a1, s100.a2)).toBeCloseTo(90, 10)
      expect(s100.cellArea_nm2).toBeCloseTo(a * a / 2, 12)
      expect(s100.symmetry_deg).toBe(90)
      const s110 = getSurface(`${el}(110)`)
      expect(len(s110.a1)).toBeCloseTo(a / Math.SQRT2, 12)
      expect(len(s110.a2)).toBeCloseTo(a, 12)
      expect(angle(s110.a1, s110.a2)).toBeCloseTo(90, 10)
      expect(s110.cellArea_nm2).toBeCloseTo(a * a / Math.SQRT2, 12)
      expect(s110.symmetry_deg).toBe(180)
    }
  })

  it('fcc and hcp hollows on (111) are a/√6 apart (Cu 0.1474 nm; derived)', () => {
    for (const [el, aA] of Object.entries(AM)) {
      const s = getSurface(`${el}(111)`)
      const fcc = getSiteType(s, 'fcc').offsets_nm[0]!
      const hcp = getSiteType(s, 'hcp').offsets_nm[0]!
      // Nearest hcp hollow to the fcc hollow in the cell: check the three images around it.
      const lat = idealLattice(s, 'hcp')
      let best = Infinity
      for (let i = -1; i <= 1; i++) for (let j = -1; j <= 1; j++) {
        best = Math.min(best, Math.hypot(hcp[0] + i * s.a1[0] + j * s.a2[0] - fcc[0], hcp[1] + i * s.a1[1] + j * s.a2[1] - fcc[1]))
      }
      expect(best).toBeCloseTo(aA / 10 / Math.sqrt(6), 12)
      expect(lat.origin).toEqual(hcp)
    }
    expect(getSurface('Cu(111)').a_nm! / Math.sqrt(6)).toBeCloseTo(0.1474, 4)
  })

  it('site types: hollows over the cell centre/centroids, bridges at bond midpoints (3 per (111) cell, 2 per (100) cell)', () => {
    const s111 = getSurface('Ag(111)')
    expect(s111.sites.map(x => x.name).sort()).toEqual(['bridge', 'fcc', 'hcp', 'top'])
    expect(getSiteType(s111, 'bridge').offsets_frac).toHaveLength(3)
    expect(s111.defaultSite).toBe('fcc')
    // Hollow = centroid of a triangle of three surface atoms: equidistant (d/√3) from them.
    for (const name of ['fcc', 'hcp']) {
      const h = getSiteType(s111, name).offsets_nm[0]!
      const atoms = [[0, 0], s111.a1, s111.a2, [s111.a1[0] + s111.a2[0], s111.a1[1] + s111.a2[1]]]
      const ds = atoms.map(p => Math.hypot(h[0] - p[0]!, h[1] - p[1]!)).sort((p, q) => p - q)
      expect(ds[0]).toBeCloseTo(s111.nn_nm / Math.sqrt(3), 12)
      expect(ds[2]).toBeCloseTo(s111.nn_nm / Math.sqrt(3), 12)
    }
    const s100 = getSurface('Pt(100)')
    expect(s100.sites.map(x => x.name).sort()).toEqual(['bridge', 'hollow', 'top'])
    expect(getSiteType(s100, 'bridge').offsets_frac).toHaveLength(2)
    expect(getSiteType(s100, 'hollow').offsets_frac).toEqual([[0.5, 0.5]])
    const s110 = getSurface('Ni(110)')
    expect(s110.sites.map(x => x.name).sort()).toEqual(['hollow', 'long-bridge', 'short-bridge', 'top'])
    const a = s110.a_nm!
    expect(len(getSiteType(s110, 'short-bridge').offsets_nm[0]!)).toBeCloseTo(a / Math.SQRT2 / 2, 12)
    expect(len(getSiteType(s110, 'long-bridge').offsets_nm[0]!)).toBeCloseTo(a / 2, 12)
    // nm offsets are the fractional offsets through the cell: u·a1 + v·a2.
    for (const s of [s111, s100, s110]) {
      for (const st of s.sites) {
        st.offsets_frac.forEach((f, k) => {
          expect(st.offsets_nm[k]![0]).toBeCloseTo(f[0] * s.a1[0] + f[1] * s.a2[0], 12)
          expect(st.offsets_nm[k]![1]).toBeCloseTo(f[0] * s.a1[1] + f[1] * s.a2[1], 12)
        })
      }
    }
  })

  it('drag directions: six close-packed on (111), four edges on (100), along/across rows on (110)', () => {
    const s111 = getSurface('Cu(111)')
    expect(s111.directions).toHaveLength(6)
    s111.directions.forEach((d, k) => {
      expect(d.angle_deg < 0 ? d.angle_deg + 360 : d.angle_deg).toBeCloseTo(60 * k, 9)
      expect(len(d.unit)).toBeCloseTo(1, 12)
      // The lattice vector along the direction is a nearest-neighbour vector.
      const v = [d.lattice[0] * s111.a1[0] + d.lattice[1] * s111.a2[0], d.lattice[0] * s111.a1[1] + d.lattice[1] * s111.a2[1]]
      expect(len(v)).toBeCloseTo(s111.nn_nm, 12)
      expect(v[0]! / len(v)).toBeCloseTo(d.unit[0], 12)
    })
    const s100 = getSurface('Cu(100)')
    expect(s100.directions.map(d => Math.round((d.angle_deg + 360) % 360))).toEqual([0, 90, 180, 270])
    const s110 = getSurface('Cu(110)')
    expect(s110.directions).toHaveLength(4)
    const along = s110.directions.filter(d => Math.abs(d.unit[0]) > 0.99)
    const across = s110.directions.filter(d => Math.abs(d.unit[1]) > 0.99)
    expect(along.map(d => d.step_nm)).toEqual([s110.a_nm! / Math.SQRT2, s110.a_nm! / Math.SQRT2])
    expect(across.map(d => d.step_nm)).toEqual([s110.a_nm!, s110.a_nm!])
    expect(along[0]!.name).toContain('along rows')
  })

  it('covering radius of the site sets: circumradius of the site cell (closed forms)', () => {
    const d111 = getSurface('Cu(111)').nn_nm
    // Hexagonal lattice: circumradius of the equilateral triangle, d/√3.
    expect(siteSetGeometry(idealLattice('Cu(111)', 'fcc')).coveringRadius_nm).toBeCloseTo(d111 / Math.sqrt(3), 9)
    // Square: half the diagonal, d/√2.
    const d100 = getSurface('Cu(100)').nn_nm
    expect(siteSetGeometry(idealLattice('Cu(100)', 'hollow')).coveringRadius_nm).toBeCloseTo(d100 / Math.SQRT2, 9)
    // Rectangle d × a: half the diagonal.
    const s110 = getSurface('Cu(110)')
    expect(siteSetGeometry(idealLattice(s110, 'top')).coveringRadius_nm).toBeCloseTo(Math.hypot(s110.nn_nm, s110.a_nm!) / 2, 9)
    // (111) bridges form a kagome net of bond d/2; its largest hole is the hexagon, radius d/2.
    const g = siteSetGeometry(idealLattice('Cu(111)', 'bridge'))
    expect(g.coveringRadius_nm).toBeCloseTo(d111 / 2, 9)
    expect(g.minSeparation_nm).toBeCloseTo(d111 / 2, 9)
  })

  it('rejects unknown surfaces and site types not on a face', () => {
    expectInputError(() => getSurface('Fe(111)'), 'surface')
    expectInputError(() => getSiteType(getSurface('Ag(100)'), 'hcp'), 'site')
    expect(getSurface('cu(111)').id).toBe('Cu(111)')
  })
})

describe('customSurface', () => {
  it('turns the cell so a1 lies along +x and keeps lengths and angle', () => {
    const s = customSurface({ a1: [0.3, 0.4], a2: [-0.4, 0.3], basis: [[-0.05, 0.35]] })
    expect(s.a1[1]).toBe(0)
    expect(s.a1[0]).toBeCloseTo(0.5, 12)
    expect(len(s.a2)).toBeCloseTo(0.5, 12)
    expect(angle(s.a1, s.a2)).toBeCloseTo(90, 10)
    expect(s.symmetry_deg).toBe(90)
    expect(s.directions).toHaveLength(4)
    // The basis point (−0.05, 0.35) is 0.5·a1 + 0.5·a2 of the input cell (hand arithmetic).
    expect(getSiteType(s, 'site').offsets_frac[0]![0]).toBeCloseTo(0.5, 12)
    expect(getSiteType(s, 'site').offsets_frac[0]![1]).toBeCloseTo(0.5, 12)
  })

  it('rejects zero, parallel and non-finite vectors and repeated basis offsets, naming the field', () => {
    expectInputError(() => customSurface({ a1: [0.3, 0], a2: [0.6, 0] }), 'a2')
    expectInputError(() => customSurface({ a1: [0.3, 0.1], a2: [-0.6, -0.2] }), 'a2')
    expectInputError(() => customSurface({ a1: [0, 0], a2: [0, 0.3] }), 'a1')
    expectInputError(() => customSurface({ a1: [0.3, 0], a2: [0, 0] }), 'a2')
    expectInputError(() => customSurface({ a1: [Number.NaN, 0], a2: [0, 0.3] }), 'a1')
    expectInputError(() => customSurface({ a1: [0.3, 0], a2: [0, 0.3], basis: [[0, 0], [0.3, 0]] }), 'basis[1]')
    expectInputError(() => customSurface({ a1: [0.3, 0], a2: [0, 0.3], basis: [[0, Infinity]] }), 'basis[0]')
  })
})
