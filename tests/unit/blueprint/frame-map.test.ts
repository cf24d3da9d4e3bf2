// The fit's affine map for any point, against the core's own site mapping and hand computations.
import { describe, expect, it } from 'vitest'
import { expandShape, toScanFrame } from '../../../shared/blueprint'
import { cellMetrics, frameMap, scanRectInIdeal, siteLatticeThrough } from '../../../shared/blueprint/frame-map'
import { getSiteType, getSurface, latticeFromSurface } from '../../../shared/lattice'

// Ag(111): a = 4.09 Å (Ashcroft & Mermin Table 4.3); the ideal cell a1 = (a/√2, 0), a2 at 120°.
const s = getSurface('Ag(111)')

describe('frameMap', () => {
  // A lattice turned 25° about the scan point (6, 4) (the ideal surface atom goes there).
  const lat = latticeFromSurface(s, 'fcc', { origin: [6, 4], rotation_deg: 25 })
  const map = frameMap(lat, s, 'fcc')

  it('puts ideal sites where toScanFrame puts their indices', () => {
    const sites = expandShape({ type: 'ring', center: [0, 0], radius_nm: 3, n: 18 }, s, 'fcc')
    const byIndex = toScanFrame(sites, lat)
    sites.forEach((site, k) => {
      const q = map.toScan([site.x_nm, site.y_nm])
      expect(q[0]).toBeCloseTo(byIndex[k]![0], 10)
      expect(q[1]).toBeCloseTo(byIndex[k]![1], 10)
    })
  })

  it('is a rotation by 25° about the surface atom (hand computation)', () => {
    // The ideal point (1, 0) nm lies 1 nm from the surface atom at 0: it goes to (6 + cos 25°, 4 + sin 25°).
    const q = map.toScan([1, 0])
    expect(q[0]).toBeCloseTo(6 + Math.cos(25 * Math.PI / 180), 10)
    expect(q[1]).toBeCloseTo(4 + Math.sin(25 * Math.PI / 180), 10)
    const back = map.toIdeal(q)
    expect(back[0]).toBeCloseTo(1, 10)
    expect(back[1]).toBeCloseTo(0, 10)
  })

  it('maps the fit-type site (0, 0, 0) to the fit origin for any site type', () => {
    for (const type of ['fcc', 'hcp', 'top', 'bridge']) {
      const l = latticeFromSurface(s, type, { origin: [3, 2], rotation_deg: -12 })
      const o = getSiteType(s, type).offsets_nm[0]!
      const q = frameMap(l, s, type).toScan(o)
      expect(Math.hypot(q[0] - l.origin[0], q[1] - l.origin[1])).toBeLessThan(1e-12)
    }
  })

  it('returns the scan rectangle as an ideal-frame polygon that maps back to the corners', () => {
    const poly = scanRectInIdeal(map, 20, 10)
    const corners = [[0, 0], [20, 0], [20, 10], [0, 10]]
    poly.forEach((p, k) => {
      const q = map.toScan(p)
      expect(q[0]).toBeCloseTo(corners[k]![0]!, 10)
      expect(q[1]).toBeCloseTo(corners[k]![1]!, 10)
    })
  })

  it('refuses parallel cell vectors, naming the fit', () => {
    expect(() => frameMap({ a1: [0.3, 0], a2: [0.6, 0], origin: [0, 0] }, s, 'fcc')).toThrow(/parallel/)
  })
})

describe('cellMetrics', () => {
  it('reads rotation, scale and shear of a stretched, sheared cell (hand computation)', () => {
    // a1′ = 1.02·R(10°)·a1; a2′ = R(10°)·a2 turned a further 1° (shear +1°), length unchanged.
    const R = (v: [number, number], deg: number): [number, number] => {
      const c = Math.cos(deg * Math.PI / 180), n = Math.sin(deg * Math.PI / 180)
      return [c * v[0] - n * v[1], n * v[0] + c * v[1]]
    }
    const a1 = R([s.a1[0] * 1.02, s.a1[1] * 1.02], 10)
    const a2 = R(s.a2, 11)
    const m = cellMetrics(a1, a2, s.a1, s.a2)
    expect(m.rotation_deg).toBeCloseTo(10, 10)
    expect(m.scale[0]).toBeCloseTo(1.02, 10)
    expect(m.scale[1]).toBeCloseTo(1, 10)
    expect(m.shear_deg).toBeCloseTo(1, 9)
  })
})

describe('siteLatticeThrough', () => {
  it('gives the same lattice as placing the other site type directly (rigid case)', () => {
    const fcc = latticeFromSurface(s, 'fcc', { origin: [6, 4], rotation_deg: 25 })
    const viaMap = siteLatticeThrough(frameMap(fcc, s, 'fcc'), s, 'bridge')
    const direct = latticeFromSurface(s, 'bridge', { origin: [6, 4], rotation_deg: 25 })
    for (const k of ['a1', 'a2', 'origin'] as const) {
      expect(viaMap[k][0]).toBeCloseTo(direct[k][0], 10)
      expect(viaMap[k][1]).toBeCloseTo(direct[k][1], 10)
    }
    expect(viaMap.basis).toHaveLength(3)
    viaMap.basis!.forEach((b, k) => {
      expect(b[0]).toBeCloseTo(direct.basis![k]![0], 10)
      expect(b[1]).toBeCloseTo(direct.basis![k]![1], 10)
    })
  })
})
