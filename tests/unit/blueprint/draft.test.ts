// Live expansion of a draft: per-shape problems name their field and leave the other shapes
// drawn; sites shared by two shapes are kept once and reported; the spacing rule (two
// nearest-neighbour distances, common practice) flags close pairs. Cu(111): a = 3.61 Å
// (Ashcroft & Mermin Table 4.3), nearest-neighbour distance a/√2 = 0.2553 nm.
import { describe, expect, it } from 'vitest'
import { createDraftCache, expandDraft, shapeProblem } from '../../../shared/blueprint/draft'
import type { Shape } from '../../../shared/blueprint'

const nn = 0.361 / Math.SQRT2
const opts = { minSpacing_nm: 2 * nn }

describe('expandDraft', () => {
  it('reports a ring that is too small by its field and still expands the chain next to it', () => {
    const shapes: Shape[] = [
      { type: 'ring', center: [0, 0], radius_nm: 0.3, n: 12 },
      { type: 'chain', start: [20, 0], direction: 0, count: 5, step: 2 },
    ]
    const d = expandDraft(shapes, 'Cu(111)', 'fcc', opts)
    expect(d.perShape[0]!.error?.field).toBe('radius_nm')
    // Needs radius ≥ s / (2 sin(π/12)) with s = 2·nn (closed form for the chord of a regular 12-gon).
    expect(d.perShape[0]!.error?.message).toContain((2 * nn / (2 * Math.sin(Math.PI / 12))).toFixed(3))
    expect(d.sites).toHaveLength(5)
    expect(d.sites.every(s => s.shape === 1)).toBe(true)
  })

  it('keeps a site made by two shapes once and lists the repeat', () => {
    const shapes: Shape[] = [
      { type: 'chain', start: [0, 0], direction: 0, count: 4, step: 2 },
      { type: 'sites', sites: [[6, 0], [0, 6]] },
    ]
    const d = expandDraft(shapes, 'Cu(111)', 'fcc', opts)
    expect(d.sites).toHaveLength(5)
    expect(d.duplicates).toEqual([{ shape: 1, site: [6, 0, 0], firstShape: 0 }])
  })

  it('flags neighbours one step apart as too close, and none at two steps', () => {
    const close = expandDraft([{ type: 'chain', start: [0, 0], direction: 0, count: 3, step: 1 }], 'Cu(111)', 'fcc', opts)
    expect(close.issues.map(i => [i.kind, i.sites])).toEqual([['too-close', [0, 1]], ['too-close', [1, 2]]])
    expect(close.issues[0]!.distance_nm).toBeCloseTo(nn, 9)
    expect(expandDraft([{ type: 'chain', start: [0, 0], direction: 0, count: 3, step: 2 }], 'Cu(111)', 'fcc', opts).issues).toEqual([])
  })

  it('reuses the expansion of an unchanged shape from the cache', () => {
    const cache = createDraftCache()
    const ring: Shape = { type: 'ring', center: [0, 0], radius_nm: 3, n: 24 }
    const a = expandDraft([ring], 'Cu(111)', 'fcc', opts, cache)
    const b = expandDraft([ring, { type: 'sites', sites: [[30, 0]] }], 'Cu(111)', 'fcc', opts, cache)
    expect(b.perShape[0]).toBe(a.perShape[0])
    // A different minimum spacing is a different expansion.
    expect(expandDraft([ring], 'Cu(111)', 'fcc', { minSpacing_nm: 0.6 }, cache).perShape[0]).not.toBe(a.perShape[0])
  })
})

describe('shapeProblem', () => {
  it('names n for a ring of two atoms and count for a chain leaving the bounds', () => {
    expect(shapeProblem({ type: 'ring', center: [0, 0], radius_nm: 3, n: 2 }, 'Cu(111)', 'fcc', opts)?.field).toBe('n')
    const bounds = { x0: -1, y0: -1, x1: 2, y1: 2 }
    const p = shapeProblem({ type: 'chain', start: [0, 0], direction: 0, count: 20, step: 2 }, 'Cu(111)', 'fcc', { ...opts, bounds })
    expect(p).toMatchObject({ field: 'count' })
    expect(p!.message).toMatch(/leaves the scan/)
    expect(shapeProblem({ type: 'ring', center: [0, 0], radius_nm: 3, n: 24 }, 'Cu(111)', 'fcc', opts)).toBeNull()
  })
})
