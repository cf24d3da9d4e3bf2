// Drag-metric lengths against hand computations, and the allowed directions of the common
// surface cells: (111) hexagonal, (100) square, (110) rectangular (standard crystallography).
import { describe, expect, it } from 'vitest'
import { latticeSteps, makeMetric, reduceBasis } from '../../../shared/route/metric'
import type { P } from './gen'

const a = 0.2553 // Cu(111) nearest-neighbour distance, nm (a_fcc/√2, Ashcroft & Mermin Table 4.3: 3.61 Å)
const a1: P = [a, 0]
const a2_120: P = [-a / 2, (a * Math.sqrt(3)) / 2]
const a2_60: P = [a / 2, (a * Math.sqrt(3)) / 2]

describe('hexagonal (111) metric', () => {
  it('has the six close-packed directions, 60° apart', () => {
    const steps = latticeSteps(a1, a2_120)
    expect(steps).toHaveLength(6)
    const ang = steps.map(([x, y]) => Math.atan2(y, x))
    for (let k = 0; k < 6; k++) {
      const d = ((ang[(k + 1) % 6]! - ang[k]! + 2 * Math.PI) % (2 * Math.PI)) * 180 / Math.PI
      expect(d).toBeCloseTo(60, 9)
      expect(Math.hypot(...steps[k]!)).toBeCloseTo(a, 12)
    }
  })
  it('3·a1 + 2·a2 on the 120° lattice has length 3a', () => {
    // By hand: with a2 at 120°, 3a1 + 2a2 = a1 + 2(a1 + a2); a1 (0°) and a1 + a2 (60°) are both
    // close-packed and bracket the displacement, so the drag is 1·a along a1 plus 2·a along a1 + a2:
    // 3a = 0.7659 nm (the straight line is √7·a = 0.6755 nm).
    const m = makeMetric({ a1, a2: a2_120 })
    const dx = 3 * a1[0] + 2 * a2_120[0], dy = 3 * a1[1] + 2 * a2_120[1]
    expect(Math.hypot(dx, dy)).toBeCloseTo(Math.sqrt(7) * a, 12)
    expect(m.norm(dx, dy)).toBeCloseTo(3 * a, 12)
    const paths = m.directPaths(0, 0, dx, dy)
    expect(paths).toHaveLength(2)
    // The two orderings: corner at 1·a along a1, or at 2·a along a1 + a2.
    const corners = paths.map(p => p[1]!)
    expect(corners.some(c => Math.abs(c[0] - a) < 1e-12 && Math.abs(c[1]) < 1e-12)).toBe(true)
    expect(corners.some(c => Math.abs(c[0] - a) < 1e-12 && Math.abs(c[1] - a * Math.sqrt(3)) < 1e-12)).toBe(true)
  })
  it('3·a1 + 2·a2 on the 60° lattice has length 5a', () => {
    // By hand: a1 (0°) and a2 (60°) are neighbouring close-packed directions and bracket the
    // displacement, so it is 3 steps plus 2 steps.
    const m = makeMetric({ a1, a2: a2_60 })
    expect(m.norm(3 * a1[0] + 2 * a2_60[0], 3 * a1[1] + 2 * a2_60[1])).toBeCloseTo(5 * a, 12)
  })
  it('a displacement along a close-packed direction is one segment of its own length', () => {
    const m = makeMetric({ a1, a2: a2_120 })
    const p = m.directPaths(1, 1, 1 + 4 * a2_120[0], 1 + 4 * a2_120[1])
    expect(p).toHaveLength(1)
    expect(m.norm(4 * a2_120[0], 4 * a2_120[1])).toBeCloseTo(4 * a, 12)
  })
  it('a perpendicular displacement costs 2/√3 of the straight line', () => {
    // By hand: (0, L) is bracketed by 60° and 120°; L = (α + β)·sin 60° with α = β.
    const m = makeMetric({ a1, a2: a2_120 })
    expect(m.norm(0, 1)).toBeCloseTo(2 / Math.sqrt(3), 12)
  })
  it('a slightly distorted fitted lattice (2 %) keeps six directions', () => {
    expect(latticeSteps([a * 1.02, 0], a2_120)).toHaveLength(6)
  })
})

describe('square (100) and rectangular (110) metrics', () => {
  const s = 0.3615 / Math.SQRT2 // Cu(100) cell side a/√2 (a from memory: 3.615 Å)
  it('square: four edge directions; (3, 4) steps cost 7 steps (Manhattan)', () => {
    expect(latticeSteps([s, 0], [0, s])).toHaveLength(4)
    const m = makeMetric({ a1: [s, 0], a2: [0, s] })
    expect(m.norm(3 * s, -4 * s)).toBeCloseTo(7 * s, 12)
  })
  it('rectangular a/√2 × a: only the two axes', () => {
    const steps = latticeSteps([s, 0], [0, 0.3615])
    expect(steps).toHaveLength(4)
    for (const [x, y] of steps) expect(Math.abs(x) < 1e-12 || Math.abs(y) < 1e-12).toBe(true)
  })
  it('basis reduction finds the short vectors of a skewed basis', () => {
    const [b1, b2] = reduceBasis([a, 0], [5 * a - a / 2, (a * Math.sqrt(3)) / 2])
    expect(Math.hypot(...b1)).toBeCloseTo(a, 12)
    expect(Math.hypot(...b2)).toBeCloseTo(a, 12)
  })
})
