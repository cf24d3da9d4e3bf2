// The site-grid layer's plan: which sites and rows it draws, checked against the core's own
// site enumeration (sitesInRect) and by brute force.
import { describe, expect, it } from 'vitest'
import { latticeFromSurface, sitesInRect } from '../../../shared/lattice'
import { ROW_MIN_PX, SITE_MIN_PX, clipLine, forEachSiteInBox, gridPlan, rowFamilies, rowSegments } from '../../../shared/lattice/grid-plan'

// Ag(111), fcc hollows, turned 17°: nearest-neighbour distance a/√2 with a = 4.09 Å (Ashcroft & Mermin Table 4.3).
const lat = latticeFromSurface('Ag(111)', 'fcc', { origin: [3, 4], rotation_deg: 17 })
const nn = 0.409 / Math.SQRT2

describe('forEachSiteInBox', () => {
  it('visits exactly the sites sitesInRect finds', () => {
    const box = { x0: 1, y0: 2, x1: 9.5, y1: 7.25 }
    const mine: string[] = []
    forEachSiteInBox(lat, box, (x, y) => mine.push(`${x.toFixed(9)},${y.toFixed(9)}`))
    const core = sitesInRect(lat, box).map(s => `${s.x.toFixed(9)},${s.y.toFixed(9)}`)
    expect(mine.sort()).toEqual(core.sort())
  })

  it('stops at the limit', () => {
    expect(forEachSiteInBox(lat, { x0: 0, y0: 0, x1: 50, y1: 50 }, () => {}, 1000)).toBe(1000)
  })
})

describe('gridPlan', () => {
  it('draws single sites once neighbours are SITE_MIN_PX apart, rows below', () => {
    expect(gridPlan(lat, SITE_MIN_PX / nn + 0.01).mode).toBe('sites')
    expect(gridPlan(lat, SITE_MIN_PX / nn - 0.01).mode).toBe('rows')
  })

  it('thins the rows to every k-th (k of 1, 2, 5 × 10ⁿ) so that they stay ROW_MIN_PX apart', () => {
    // Row spacing on a hexagonal lattice: nn·√3/2 (closed form).
    const row = nn * Math.sqrt(3) / 2
    for (const scale of [20, 5, 1, 0.3]) {
      const p = gridPlan(lat, scale)
      if (p.mode !== 'rows') continue
      expect(p.every * row * scale).toBeGreaterThanOrEqual(ROW_MIN_PX - 1e-9)
      // The next smaller nice step would be too dense.
      const nice = [1, 2, 5, 10, 20, 50, 100, 200, 500]
      const smaller = nice[nice.indexOf(p.every) - 1]
      if (smaller) expect(smaller * row * scale).toBeLessThan(ROW_MIN_PX)
    }
  })
})

describe('rows', () => {
  it('has three row families on (111), each nn·√3/2 apart', () => {
    const f = rowFamilies(lat)
    expect(f).toHaveLength(3)
    for (const x of f) expect(x.spacing_nm).toBeCloseTo(nn * Math.sqrt(3) / 2, 12)
  })

  it('draws rows through lattice sites, clipped to the box', () => {
    const box = { x0: 0, y0: 0, x1: 6, y1: 5 }
    const seg = rowSegments(lat, box, 1)
    expect(seg.length % 4).toBe(0)
    for (let k = 0; k < seg.length; k += 4) {
      for (const [x, y] of [[seg[k]!, seg[k + 1]!], [seg[k + 2]!, seg[k + 3]!]]) {
        expect(x).toBeGreaterThanOrEqual(box.x0 - 1e-9)
        expect(x).toBeLessThanOrEqual(box.x1 + 1e-9)
        expect(y).toBeGreaterThanOrEqual(box.y0 - 1e-9)
        expect(y).toBeLessThanOrEqual(box.y1 + 1e-9)
      }
    }
    // Brute force: every site in the box lies on a row of each family (3 rows through each site).
    let onRows = 0, total = 0
    forEachSiteInBox(lat, { x0: 1, y0: 1, x1: 5, y1: 4 }, (x, y) => {
      total++
      let hits = 0
      for (let k = 0; k < seg.length; k += 4) {
        const [x0, y0, x1, y1] = [seg[k]!, seg[k + 1]!, seg[k + 2]!, seg[k + 3]!]
        const cross = (x1 - x0) * (y - y0) - (y1 - y0) * (x - x0)
        if (Math.abs(cross) / Math.hypot(x1 - x0, y1 - y0) < 1e-9) hits++
      }
      if (hits === 3) onRows++
    })
    expect(onRows).toBe(total)
    expect(total).toBeGreaterThan(50)
  })

  it('clips a line to a box (hand computation) and misses a box it does not cross', () => {
    expect(clipLine(0, 1, 1, 0, { x0: 2, y0: 0, x1: 5, y1: 3 })).toEqual([2, 1, 5, 1])
    expect(clipLine(0, 9, 1, 0, { x0: 2, y0: 0, x1: 5, y1: 3 })).toBeNull()
  })
})
