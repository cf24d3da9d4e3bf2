// Scan-to-scan registration on synthetic marks (fixed seed): a known drift between two scans with
// a few atoms moved and a few added is recovered, and a blueprint carried into the second scan a
// whole number of cells off is brought back (hand-computed lattice vectors).
import { describe, expect, it } from 'vitest'
import { alignByLatticeVector, scanDrift } from '../../../shared/compare/register'
import { mulberry32 } from '../../../shared/scan/synthetic'

const rand = mulberry32(99)
const before = Array.from({ length: 80 }, () => [rand() * 30, rand() * 30] as [number, number])

describe('scanDrift', () => {
  it('finds the common displacement of the unmoved atoms', () => {
    const drift = [1.234, -0.567] as const
    const after = before.map(([x, y], k) => (k % 10 === 0
      ? [rand() * 30, rand() * 30] // moved by the tip: no longer where drift says
      : [x + drift[0] + 0.004 * (rand() - 0.5), y + drift[1] + 0.004 * (rand() - 0.5)]) as [number, number])
    after.push([3, 3], [25, 4])
    const d = scanDrift(before, after)
    expect(d.dx).toBeCloseTo(drift[0], 2)
    expect(d.dy).toBeCloseTo(drift[1], 2)
    expect(d.support).toBeGreaterThanOrEqual(72)
  })

  it('reports no support when nothing is near', () => {
    expect(scanDrift([[0, 0]], [[100, 100]]).support).toBe(0)
  })
})

describe('alignByLatticeVector', () => {
  // A 120° cell with |a| = 0.2892 nm (Ag(111), a/√2 with a = 4.09 Å, Ashcroft & Mermin Table 4.3).
  const a = 0.2892
  const a1 = [a, 0] as const
  const a2 = [-a / 2, (a * Math.sqrt(3)) / 2] as const
  it('undoes a shift of (3, −2) cells, even with a sub-cell drift residue', () => {
    const expected = [[1, 1], [2, 1.5], [1.5, 3]] as [number, number][]
    // raw = expected − (3·a1 − 2·a2) + small residue
    const t = [3 * a1[0] - 2 * a2[0], 3 * a1[1] - 2 * a2[1]]
    const raw = expected.map(([x, y]) => [x - t[0]! + 0.02, y - t[1]! - 0.01] as [number, number])
    const { points, shift } = alignByLatticeVector(raw, expected, a1, a2)
    expect(shift).toEqual([3, -2])
    points.forEach((p, k) => expect(Math.hypot(p[0] - expected[k]![0], p[1] - expected[k]![1])).toBeLessThan(0.03))
  })
})
