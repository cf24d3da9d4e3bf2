import { describe, expect, it } from 'vitest'
import { expandShape, toIdealFrame, toScanFrame } from '../../../shared/blueprint'
import { fitLattice, getSiteType, getSurface } from '../../../shared/lattice'
import { expectInputError } from '../lattice/helpers'
import { syntheticMarks } from '../lattice/synthetic'

describe('blueprint ↔ scan through a lattice fit', () => {
  // Synthetic scan: Cu(111) fcc marks turned 21°, 1.5 % stretched along x, shifted, σ = 0.005 nm.
  const s = getSurface('Cu(111)')
  const th = 21 * Math.PI / 180
  const M: [[number, number], [number, number]] = [[1.015 * Math.cos(th), -Math.sin(th)], [1.015 * Math.sin(th), Math.cos(th)]]
  const t: [number, number] = [12.5, 8.25]
  const syn = syntheticMarks({ seed: 21, count: 200, half: 30, a1: s.a1, a2: s.a2, basis: [[0, 0]], M, t, sigma_nm: 0.005, nOut: 0 })
  const fit = fitLattice({ surface: 'Cu(111)', marks: syn.marks })
  const off = getSiteType(s, 'fcc').offsets_nm[0]!
  // Scan position of ideal site (i, j) under the true map, given the fit's index shift.
  const shift = [fit.indices[0]![0] - syn.truth[0]![0], fit.indices[0]![1] - syn.truth[0]![1]]
  const trueScan = (i: number, j: number) => {
    const p = [(i - shift[0]!) * s.a1[0] + (j - shift[1]!) * s.a2[0], (i - shift[0]!) * s.a1[1] + (j - shift[1]!) * s.a2[1]]
    return [t[0] + M[0][0] * p[0]! + M[0][1] * p[1]!, t[1] + M[1][0] * p[0]! + M[1][1] * p[1]!]
  }

  it('toScanFrame puts blueprint sites where the true map does (within 0.01 nm)', () => {
    const sites = expandShape({ type: 'ring', center: off, radius_nm: 3, n: 16 }, s, 'fcc')
    const scan = toScanFrame(sites, fit)
    sites.forEach((site, k) => {
      const [x, y] = trueScan(site.i, site.j)
      expect(Math.hypot(scan[k]![0] - x!, scan[k]![1] - y!)).toBeLessThan(0.01)
    })
  })

  it('toIdealFrame inverts it: same indices, ideal positions, zero deviation at the sites', () => {
    const sites = expandShape({ type: 'chain', start: [-4, 2], direction: 1, count: 10, step: 2 }, s, 'fcc')
    const back = toIdealFrame(toScanFrame(sites, fit), fit, s, 'fcc')
    expect(back.map(b => [b.i, b.j, b.b])).toEqual(sites.map(x => [x.i, x.j, x.b]))
    back.forEach((b, k) => {
      expect(b.deviation_nm).toBeLessThan(1e-9)
      expect(b.x_nm).toBeCloseTo(sites[k]!.x_nm, 12)
      expect(b.ideal[0]).toBeCloseTo(sites[k]!.x_nm, 9)
      expect(b.ideal[1]).toBeCloseTo(sites[k]!.y_nm, 9)
    })
  })

  it('marks map back to the sites the fit assigned them', () => {
    const back = toIdealFrame(syn.marks, fit, s, 'fcc')
    back.forEach((b, k) => expect([b.i, b.j, b.b]).toEqual(fit.indices[k]))
  })

  it('bridge sites use the fit basis', () => {
    const fitB = { a1: fit.a1, a2: fit.a2, origin: fit.origin, basis: [[0, 0], [0.1, 0.05], [0.03, 0.12]] as [number, number][] }
    const p = toScanFrame([{ i: 1, j: 2, b: 2 }], fitB)[0]!
    expect(p[0]).toBeCloseTo(fit.origin[0] + fit.a1[0] + 2 * fit.a2[0] + 0.03, 12)
    expectInputError(() => toScanFrame([{ i: 0, j: 0, b: 1 }], fit), 'sites[0].b')
    expectInputError(() => toIdealFrame([[0, Number.NaN]], fit, s, 'fcc'), 'points[0]')
  })
})
