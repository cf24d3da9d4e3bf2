// Handle geometry of the blueprint editor, checked by hand computation on Ag(111)
// (a = 4.09 Å, Ashcroft & Mermin Table 4.3; nearest-neighbour distance a/√2).
import { describe, expect, it } from 'vitest'
import { expandShape, siteContext } from '../../../shared/blueprint'
import { chainToward, dragHandle, latticeStep, moveByLattice, pivotSite, shapeHandles, sitePosition } from '../../../shared/blueprint/handles'

const ctx = siteContext('Ag(111)', 'fcc')
const nn = 0.409 / Math.SQRT2

describe('ring and ellipse handles', () => {
  const ring = { type: 'ring' as const, center: [1, 2] as [number, number], radius_nm: 3, n: 24, phase_deg: 0 }

  it('puts the radius handle on the circle at the phase angle and reads radius and phase back', () => {
    const h = shapeHandles(ring, ctx)
    expect(h.map(x => x.kind)).toEqual(['move', 'radius'])
    expect(h[1]!.p).toEqual([4, 2])
    // Dragged to (1, 2) + (0, 4): radius 4 nm, phase 90°.
    const r = dragHandle(ring, { kind: 'radius' }, [1, 6], ctx)
    expect(r).toMatchObject({ radius_nm: 4, phase_deg: 90 })
  })

  it('sets the semi-axes of an ellipse from the axis handles, b by projection on the minor axis', () => {
    const e = { type: 'ellipse' as const, center: [0, 0] as [number, number], semi_a_nm: 4, semi_b_nm: 2, angle_deg: 0, n: 20 }
    const a = dragHandle(e, { kind: 'axis-a' }, [0, 5], ctx)
    expect(a).toMatchObject({ semi_a_nm: 5, angle_deg: 90 })
    // With the major axis along +x, the minor-axis handle reads only the y component.
    const b = dragHandle(e, { kind: 'axis-b' }, [1.5, -3], ctx)
    expect(b).toMatchObject({ semi_b_nm: 3, semi_a_nm: 4 })
  })
})

describe('chain handles', () => {
  it('picks the drag direction nearest the pointer and the count from its projection', () => {
    // Six steps of 2 along the 60° direction from site (0, 0, 0) reach the ideal point start + 12·nn·(cos 60°, sin 60°).
    const s = sitePosition(ctx, 0, 0, 0)
    const target: [number, number] = [s[0] + 12 * nn * Math.cos(Math.PI / 3) + 0.05, s[1] + 12 * nn * Math.sin(Math.PI / 3) - 0.03]
    const c = chainToward(ctx, [0, 0, 0], target, 2)
    expect(ctx.surface.directions[c.direction]!.angle_deg).toBeCloseTo(60, 9)
    expect(c.count).toBe(7)
    const sites = expandShape(c, ctx.surface, 'fcc')
    const last = sites.at(-1)!
    expect(Math.hypot(last.x_nm - s[0], last.y_nm - s[1])).toBeCloseTo(12 * nn, 9)
    // The end handle sits on the last site.
    const end = shapeHandles(c, ctx).find(h => h.kind === 'end')!
    expect(end.p[0]).toBeCloseTo(last.x_nm, 9)
    expect(end.p[1]).toBeCloseTo(last.y_nm, 9)
  })

  it('keeps one atom when dragged backwards of every direction by less than half a step', () => {
    expect(chainToward(ctx, [3, 1, 0], sitePosition(ctx, 3, 1, 0), 1).count).toBe(1)
  })
})

describe('moving by lattice vectors', () => {
  it('rounds a displacement to the nearest lattice vector', () => {
    const { a1, a2 } = ctx.surface
    // 2.3·a1 − 0.8·a2 rounds to (2, −1).
    expect(latticeStep(ctx, [2.3 * a1[0] - 0.8 * a2[0], 2.3 * a1[1] - 0.8 * a2[1]])).toEqual([2, -1])
  })

  it('moves a ring and keeps its snapped pattern: every site shifts by the same (di, dj)', () => {
    const ring = { type: 'ring' as const, center: [0.1, 0.2] as [number, number], radius_nm: 2.5, n: 20 }
    const { a1, a2 } = ctx.surface
    const moved = moveByLattice(ring, [3 * a1[0] + a2[0], 3 * a1[1] + a2[1]], ctx)
    const before = expandShape(ring, ctx.surface, 'fcc').map(s => [s.i + 3, s.j + 1, s.b])
    const after = expandShape(moved, ctx.surface, 'fcc').map(s => [s.i, s.j, s.b])
    expect(after).toEqual(before)
  })

  it('chooses the nearest site as the pivot', () => {
    const p = sitePosition(ctx, 4, -2, 0)
    expect(pivotSite(ctx, [p[0] + 0.03, p[1] - 0.02])).toEqual([4, -2, 0])
  })
})

describe('vertex handles', () => {
  it('moves one vertex of a polygon and of a patch region', () => {
    const poly = { type: 'polygon' as const, vertices: [[0, 0], [4, 0], [0, 4]] as [number, number][], spacing_steps: 2 }
    expect(dragHandle(poly, { kind: 'vertex', index: 1 }, [5, 1], ctx)).toMatchObject({ vertices: [[0, 0], [5, 1], [0, 4]] })
    const patch = { type: 'patch' as const, kind: 'square' as const, spacing: 2, region: [[0, 0], [4, 0], [4, 4], [0, 4]] as [number, number][] }
    expect((dragHandle(patch, { kind: 'vertex', index: 2 }, [6, 6], ctx) as typeof patch).region[2]).toEqual([6, 6])
  })
})
