import { describe, expect, it } from 'vitest'
import { type Lattice, getSiteType, getSurface, latticeFromSurface, nearestSite, nearestSites, siteAt, sitesInPolygon, sitesInRect, toFractional } from '../../../shared/lattice'
import { expectInputError, windingInside } from './helpers'
import { rng } from './synthetic'

/** Brute force: every site whose cell corner lies in [−L, L]² (index ranges from the inverse cell, widened). */
function allSites(lat: Lattice, L: number) {
  const out: { i: number, j: number, b: number, x: number, y: number }[] = []
  const nb = lat.basis?.length ?? 1
  const det = lat.a1[0] * lat.a2[1] - lat.a1[1] * lat.a2[0]
  const Ri = Math.ceil(2 * L * (Math.abs(lat.a2[1]) + Math.abs(lat.a2[0])) / Math.abs(det)) + 3
  const Rj = Math.ceil(2 * L * (Math.abs(lat.a1[1]) + Math.abs(lat.a1[0])) / Math.abs(det)) + 3
  for (let i = -Ri; i <= Ri; i++) for (let j = -Rj; j <= Rj; j++) for (let b = 0; b < nb; b++) {
    const [x, y] = siteAt(lat, i, j, b)
    out.push({ i, j, b, x, y })
  }
  return out
}

const lattices: [string, Lattice][] = [
  ['Cu(111) fcc, turned 17°, shifted', latticeFromSurface('Cu(111)', 'fcc', { origin: [1.3, -0.7], rotation_deg: 17 })],
  ['Ag(100) bridge (2 per cell)', latticeFromSurface('Ag(100)', 'bridge', { rotation_deg: -33 })],
  ['Au(111) bridge (3 per cell)', latticeFromSurface('Au(111)', 'bridge', { origin: [0.1, 0.2] })],
  ['Pt(110) hollow', latticeFromSurface('Pt(110)', 'hollow', { rotation_deg: 71 })],
  // Unreduced, very oblique cell: a2 = 3.2·a1 + small offset; rounding fractional coordinates alone fails here.
  ['oblique unreduced', { a1: [0.25, 0], a2: [0.8, 0.07], origin: [0.05, 0.02] }],
  ['affine-distorted (111) with basis', { a1: [0.26, 0.01], a2: [-0.12, 0.225], origin: [0, 0], basis: [[0, 0], [0.09, 0.07]] }],
]

describe('registered lattice', () => {
  it('siteAt and toFractional are inverse (fractional coordinates of i·a1 + j·a2 are (i, j))', () => {
    const lat = lattices[0]![1]
    for (const [i, j] of [[0, 0], [3, -2], [-7, 11]] as const) {
      const f = toFractional(lat, siteAt(lat, i, j))
      expect(f[0]).toBeCloseTo(i, 10)
      expect(f[1]).toBeCloseTo(j, 10)
    }
  })

  for (const [name, lat] of lattices) {
    it(`nearestSite agrees with brute force over all sites on random points: ${name}`, () => {
      const rand = rng(42)
      const sites = allSites(lat, 4)
      const qs = new Float64Array(2 * 400)
      for (let k = 0; k < 400; k++) {
        qs[2 * k] = (rand() - 0.5) * 4
        qs[2 * k + 1] = (rand() - 0.5) * 4
      }
      const batch = nearestSites(lat, qs)
      for (let k = 0; k < 400; k++) {
        const x = qs[2 * k]!, y = qs[2 * k + 1]!
        let best = Infinity
        for (const s of sites) best = Math.min(best, Math.hypot(s.x - x, s.y - y))
        const got = nearestSite(lat, [x, y])
        expect(got.distance).toBeCloseTo(best, 12)
        const [sx, sy] = siteAt(lat, got.i, got.j, got.b)
        expect(Math.hypot(sx - x, sy - y)).toBeCloseTo(best, 12)
        expect(batch.distance[k]).toBeCloseTo(best, 12)
        expect([batch.i[k], batch.j[k], batch.b[k]]).toEqual([got.i, got.j, got.b])
      }
    })
  }

  it('site count in a rectangle equals area/cell area within the boundary term, and brute force exactly', () => {
    for (const [, lat] of lattices) {
      // Edges off any round number, so no site lies on the boundary up to rounding.
      const rect = { x0: -2.1037, y0: -1.7131, x1: 2.6219, y1: 1.9043 }
      const got = sitesInRect(lat, rect)
      const nb = lat.basis?.length ?? 1
      const brute = allSites(lat, 4).filter(s => s.x >= rect.x0 && s.x <= rect.x1 && s.y >= rect.y0 && s.y <= rect.y1)
      expect(got.length).toBe(brute.length)
      const cell = Math.abs(lat.a1[0] * lat.a2[1] - lat.a1[1] * lat.a2[0])
      const area = (rect.x1 - rect.x0) * (rect.y1 - rect.y0)
      const perimeter = 2 * (rect.x1 - rect.x0 + rect.y1 - rect.y0)
      const diam = Math.hypot(...lat.a1) + Math.hypot(...lat.a2)
      // Lattice-point counting: |N − area/cell| ≤ perimeter·(cell diameter)/cell (per basis point).
      expect(Math.abs(got.length - nb * area / cell)).toBeLessThanOrEqual(nb * (perimeter * diam / cell + 4))
    }
  })

  it('sitesInPolygon matches brute force with an independent winding-number test', () => {
    const hexagon = Array.from({ length: 6 }, (_, k) => [1.8 * Math.cos(k * Math.PI / 3 + 0.2) + 0.3, 1.8 * Math.sin(k * Math.PI / 3 + 0.2)] as [number, number])
    const concave: [number, number][] = [[-2.0113, -1.9871], [2.0071, -2.0039], [1.9927, 2.0143], [0.0031, 0.3127], [-2.0087, 1.9953]]
    for (const [, lat] of lattices) {
      for (const poly of [hexagon, concave]) {
        const got = sitesInPolygon(lat, poly).map(s => `${s.i},${s.j},${s.b}`).sort()
        const brute = allSites(lat, 4).filter(s => windingInside(s.x, s.y, poly)).map(s => `${s.i},${s.j},${s.b}`).sort()
        expect(got).toEqual(brute)
      }
    }
  })

  it('latticeFromSurface: origin is site (0, 0, 0) of the type; cell and basis turn with the rotation', () => {
    const s = getSurface('Cu(111)')
    const off = getSiteType(s, 'fcc').offsets_nm[0]!
    const lat = latticeFromSurface(s, 'fcc', { origin: [1, 2], rotation_deg: 30 })
    const c = Math.cos(Math.PI / 6), sn = Math.sin(Math.PI / 6)
    expect(lat.origin[0]).toBeCloseTo(1 + c * off[0] - sn * off[1], 12)
    expect(lat.origin[1]).toBeCloseTo(2 + sn * off[0] + c * off[1], 12)
    expect(Math.atan2(lat.a1[1], lat.a1[0]) * 180 / Math.PI).toBeCloseTo(30, 10)
    expect(lat.basis).toBeUndefined()
    const br = latticeFromSurface(s, 'bridge')
    expect(br.basis).toHaveLength(3)
    expect(br.basis![0]).toEqual([0, 0])
  })

  it('rejects parallel cells, bad regions and oversized regions with InputError', () => {
    expectInputError(() => nearestSite({ a1: [1, 0], a2: [2, 0], origin: [0, 0] }, [0, 0]), 'a2')
    expectInputError(() => sitesInPolygon(lattices[0]![1], [[0, 0], [1, 0]]), 'region')
    expectInputError(() => sitesInPolygon(lattices[0]![1], [[0, 0], [1, 0], [Number.NaN, 1]]), 'region[2]')
    expectInputError(() => sitesInRect(lattices[0]![1], { x0: 0, y0: 0, x1: 1e4, y1: 1e4 }), 'region')
    expectInputError(() => latticeFromSurface('Cu(111)', 'fcc', { rotation_deg: Number.NaN }), 'rotation_deg')
  })
})
