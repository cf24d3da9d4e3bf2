import { describe, expect, it } from 'vitest'
import { type Shape, expandShape, transformShape } from '../../../shared/blueprint'
import { getSurface, idealLattice, siteAt } from '../../../shared/lattice'
import { expectInputError } from '../lattice/helpers'

const sortKeys = (s: { i: number, j: number, b: number }[]) => s.map(x => `${x.i},${x.j},${x.b}`).sort()

/** Rotate a point about a pivot (plain trigonometry, independent of the library's helpers). */
function turn(p: [number, number], c: [number, number], deg: number): [number, number] {
  const a = deg * Math.PI / 180
  return [c[0] + Math.cos(a) * (p[0] - c[0]) - Math.sin(a) * (p[1] - c[1]), c[1] + Math.sin(a) * (p[0] - c[0]) + Math.cos(a) * (p[1] - c[1])]
}

describe('transformShape: symmetry copies map sites onto sites', () => {
  const faces = [
    { id: 'Cu(111)', site: 'fcc', sym: 60 },
    { id: 'Ag(100)', site: 'hollow', sym: 90 },
    { id: 'Pt(110)', site: 'hollow', sym: 180 },
  ]
  for (const f of faces) {
    it(`rotating by k × ${f.sym}° about a site on ${f.id} moves every site to the rotated position`, () => {
      const lat = idealLattice(f.id, f.site)
      const pivotIdx: [number, number] = [2, -1]
      const pivot = siteAt(lat, ...pivotIdx)
      const shapes: Shape[] = [
        { type: 'sites', sites: [[0, 0], [3, 1], [-2, 5], [7, -4]] },
        { type: 'chain', start: [1, 1], direction: 0, count: 6, step: 2 },
      ]
      for (const shape of shapes) {
        const before = expandShape(shape, f.id, f.site)
        for (const k of [1, 2, -1]) {
          const after = expandShape(transformShape(shape, f.id, f.site, { rotateBy: k, about: pivotIdx }), f.id, f.site)
          const want = before.map(s => turn([s.x_nm, s.y_nm], pivot, k * f.sym))
          expect(after).toHaveLength(before.length)
          const got = after.map(s => [s.x_nm, s.y_nm])
          for (const w of want) expect(got.some(g => Math.hypot(g[0]! - w[0], g[1]! - w[1]) < 1e-9)).toBe(true)
        }
      }
    })
  }

  it('a ring rotated by 60° about its own centre site keeps its atom positions rotated (phase advanced)', () => {
    const lat = idealLattice('Cu(111)', 'fcc')
    const c = siteAt(lat, 0, 0)
    const ring: Shape = { type: 'ring', center: c, radius_nm: 3, n: 14 }
    const moved = transformShape(ring, 'Cu(111)', 'fcc', { rotateBy: 1 })
    expect(moved.type === 'ring' && moved.phase_deg).toBe(60)
    const before = expandShape(ring, 'Cu(111)', 'fcc').map(s => turn([s.x_nm, s.y_nm], c, 60))
    const after = expandShape(moved, 'Cu(111)', 'fcc')
    for (const w of before) expect(after.some(g => Math.hypot(g.x_nm - w[0], g.y_nm - w[1]) < 1e-9)).toBe(true)
  })

  it('translating by a lattice vector shifts indices by it', () => {
    const s = getSurface('Au(111)')
    const shape: Shape = { type: 'polygon', vertices: [[0.1, 0.2], [3.1, 0.2], [1.6, 2.9]], spacing_steps: 3 }
    const before = expandShape(shape, s, 'hcp')
    const after = expandShape(transformShape(shape, s, 'hcp', { translateBy: [5, -3] }), s, 'hcp')
    expect(sortKeys(after)).toEqual(sortKeys(before.map(x => ({ ...x, i: x.i + 5, j: x.j - 3 }))))
  })

  it('bridge sites on (111) are not mapped onto themselves by 60°, but are by 180° about a bridge site', () => {
    const shape: Shape = { type: 'sites', sites: [[0, 0, 0], [2, 1, 1], [1, 3, 2]] }
    expectInputError(() => transformShape(shape, 'Cu(111)', 'bridge', { rotateBy: 1 }), 'rotateBy')
    const lat = idealLattice('Cu(111)', 'bridge')
    const pivot = siteAt(lat, 0, 0, 0)
    const before = expandShape(shape, 'Cu(111)', 'bridge').map(s => turn([s.x_nm, s.y_nm], pivot, 180))
    const after = expandShape(transformShape(shape, 'Cu(111)', 'bridge', { rotateBy: 3 }), 'Cu(111)', 'bridge')
    for (const w of before) expect(after.some(g => Math.hypot(g.x_nm - w[0], g.y_nm - w[1]) < 1e-9)).toBe(true)
  })

  it('rejects non-integer steps and translations', () => {
    const shape: Shape = { type: 'sites', sites: [[0, 0]] }
    expectInputError(() => transformShape(shape, 'Cu(111)', 'fcc', { rotateBy: 0.5 }), 'rotateBy')
    expectInputError(() => transformShape(shape, 'Cu(111)', 'fcc', { translateBy: [1, 0.5] }), 'translateBy[1]')
    expectInputError(() => transformShape(shape, 'Cu(111)', 'fcc', { about: [0, 0, 1] }), 'about[2]')
  })
})
