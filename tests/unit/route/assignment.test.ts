// The optimal assignment against brute force over all injective maps, against published worked
// examples of the Hungarian method, and the sparse solver against the munkres package.
import { describe, expect, it } from 'vitest'
import { denseAssign, type AssignSpec } from '../../../shared/route/assign-dense'
import { sparseAssign } from '../../../shared/route/assign-sparse'
import { solveAssignment } from '../../../shared/route/assign'
import { makeMetric } from '../../../shared/route/metric'
import { HEX, rng, scatter, type P } from './gen'

/** Minimum of Σ cost over all ways to give each of the n rows a distinct column (n ≤ m). */
function bruteForce(n: number, m: number, cost: (r: number, c: number) => number): number {
  let best = Infinity
  const used = new Array<boolean>(m).fill(false)
  const go = (r: number, acc: number) => {
    if (acc >= best) return
    if (r === n) { best = acc; return }
    for (let c = 0; c < m; c++) {
      if (used[c]) continue
      used[c] = true
      go(r + 1, acc + cost(r, c))
      used[c] = false
    }
  }
  go(0, 0)
  return best
}

function matrixSpec(M: number[][]): AssignSpec {
  const n = M.length, m = M[0]!.length
  // Coordinates are irrelevant for a given matrix; costFromEuclid = 0 is a valid (useless) bound.
  return {
    nRows: n, nCols: m,
    rowXY: Float64Array.from({ length: 2 * n }, (_, i) => i), colXY: Float64Array.from({ length: 2 * m }, (_, i) => i),
    cost: (r, c) => M[r]![c]!, costFromEuclid: () => 0,
  }
}

describe('worked examples of the Hungarian method', () => {
  // W. L. Winston, Operations Research: Applications and Algorithms, §7.5 "Machineco" (setup times
  // of four jobs on four machines); optimum 15 (M1–J2, M2–J4, M3–J3, M4–J1). Numbers from memory.
  const machineco = [[14, 5, 8, 7], [2, 12, 6, 5], [7, 8, 3, 9], [2, 4, 6, 10]]
  // H. A. Taha, Operations Research: An Introduction, "Joe Klyne's three children" bids for three
  // chores (mow, paint, wash); optimum 27 (John paints, Karen mows, Terri washes). From memory.
  const taha = [[15, 10, 9], [9, 15, 10], [10, 12, 8]]
  for (const [name, M, opt] of [['Winston Machineco 4×4', machineco, 15], ['Taha three children 3×3', taha, 27]] as const) {
    it(`${name}: optimum ${opt} (munkres and the sparse solver)`, () => {
      const spec = matrixSpec(M as unknown as number[][])
      expect(denseAssign(spec).cost).toBe(opt)
      const s = sparseAssign(spec)
      expect(s.cost).toBe(opt)
      expect(s.exact).toBe(true)
      // The brute force agrees with the book value (guards against a mis-remembered matrix).
      expect(bruteForce(M.length, M[0]!.length, (r, c) => M[r]![c]!)).toBe(opt)
    })
  }
  it('Machineco assignment pairs are the published ones', () => {
    const r = denseAssign(matrixSpec(machineco))
    expect(Array.from(r.rowMatch)).toEqual([1, 3, 2, 0])
  })
})

describe('assignment against brute force (fixed seed)', () => {
  const R = rng(20240601)
  const metrics = [['straight', makeMetric()], ['hexagonal lattice', makeMetric(HEX)]] as const
  for (const [mname, metric] of metrics) {
    for (const [nA, nS] of [[5, 5], [6, 6], [7, 4], [4, 7], [6, 3], [3, 6]] as const) {
      it(`${mname}: ${nA} atoms, ${nS} sites, 8 random cases, both solvers`, () => {
        for (let rep = 0; rep < 8; rep++) {
          const atoms = scatter(R, nA, [0, 10, 0, 10]), sites = scatter(R, nS, [0, 10, 0, 10])
          const d = (a: number, s: number) => metric.norm(sites[s]![0] - atoms[a]![0], sites[s]![1] - atoms[a]![1])
          const brute = nA <= nS ? bruteForce(nA, nS, (a, s) => d(a, s)) : bruteForce(nS, nA, (s, a) => d(a, s))
          for (const mode of ['dense', 'sparse'] as const) {
            const r = solveAssignment({ atoms, sites, atomIds: atoms.map((_, i) => i), siteIds: sites.map((_, i) => i), metric, cost: 'distance', zones: [], mode })
            expect(r.pairs.length).toBe(Math.min(nA, nS))
            const total = r.pairs.reduce((t, [a, s]) => t + d(a, s), 0)
            expect(total).toBeCloseTo(brute, 9)
            expect(r.lowerBound).toBeCloseTo(brute, 9)
            expect(r.exact).toBe(true)
            expect(new Set(r.pairs.map(p => p[0])).size).toBe(r.pairs.length)
            expect(new Set(r.pairs.map(p => p[1])).size).toBe(r.pairs.length)
          }
        }
      })
    }
  }
  it('squared cost: minimises Σd² and still bounds the length by the Σd optimum', () => {
    const metric = makeMetric()
    for (let rep = 0; rep < 8; rep++) {
      const atoms = scatter(R, 6, [0, 10, 0, 10]), sites = scatter(R, 5, [0, 10, 0, 10])
      const d = (a: number, s: number) => Math.hypot(sites[s]![0] - atoms[a]![0], sites[s]![1] - atoms[a]![1])
      const r = solveAssignment({ atoms, sites, atomIds: atoms.map((_, i) => i), siteIds: sites.map((_, i) => i), metric, cost: 'squared', zones: [], mode: 'dense' })
      expect(r.cost).toBeCloseTo(bruteForce(5, 6, (s, a) => d(a, s) ** 2), 9)
      expect(r.lowerBound).toBeCloseTo(bruteForce(5, 6, (s, a) => d(a, s)), 9)
    }
  })
})

describe('sparse solver against munkres (independent npm package) on larger cases', () => {
  const geo = (rows: P[], cols: P[]): AssignSpec => {
    const rowXY = new Float64Array(rows.flat()), colXY = new Float64Array(cols.flat())
    return {
      nRows: rows.length, nCols: cols.length, rowXY, colXY,
      cost: (r, c) => Math.hypot(rowXY[2 * r]! - colXY[2 * c]!, rowXY[2 * r + 1]! - colXY[2 * c + 1]!),
      costFromEuclid: d => d,
    }
  }
  it('uniform 600 × 700: same optimum, certified exact', () => {
    const R = rng(7)
    const spec = geo(scatter(R, 600, [0, 40, 0, 40]), scatter(R, 700, [0, 40, 0, 40]))
    const d = denseAssign(spec), s = sparseAssign(spec)
    expect(s.cost).toBeCloseTo(d.cost, 7)
    expect(s.exact).toBe(true)
    expect(s.bound).toBeCloseTo(d.cost, 7)
  })
  it('dense patch amid sparse atoms 500 × 800: the bound never exceeds the optimum', () => {
    const R = rng(8)
    const rows: P[] = Array.from({ length: 500 }, (_, i) => [(i % 25) * 0.8, Math.floor(i / 25) * 0.8])
    const spec = geo(rows, scatter(R, 800, [-20, 40, -20, 40]))
    const d = denseAssign(spec)
    for (const maxRounds of [1, 4]) {
      const s = sparseAssign(spec, undefined, { maxRounds })
      expect(s.bound).toBeLessThanOrEqual(d.cost + 1e-7)
      expect(s.cost).toBeGreaterThanOrEqual(d.cost - 1e-7)
      if (s.exact) expect(s.cost).toBeCloseTo(d.cost, 7)
    }
  })
})

describe('tie-break among optimal assignments (least Σ length², Σ length unchanged)', () => {
  it('atoms at x = 0…4 and sites at x = 1…5: every injective map onto the sites that is monotone costs 5; the chain of unit hops (Σd² = 5) wins over the long jump 0 → 5 (Σd² = 25)', () => {
    // Closed form on a line: Σ|a_i − s_π(i)| ≥ Σ(s_i − a_i) = 5 for every π, with Σd² minimal for π = id.
    const atoms: P[] = [0, 1, 2, 3, 4].map(x => [x, 0])
    const sites: P[] = [1, 2, 3, 4, 5].map(x => [x, 0])
    const r = solveAssignment({ atoms, sites, atomIds: [0, 1, 2, 3, 4], siteIds: [0, 1, 2, 3, 4], metric: makeMetric(), cost: 'distance', zones: [], mode: 'sparse' })
    expect(r.cost).toBeCloseTo(5, 12)
    expect(r.exact).toBe(true)
    expect([...r.pairs].sort((x, y) => x[0] - y[0])).toEqual([[0, 0], [1, 1], [2, 2], [3, 3], [4, 4]])
  })
  it('lattice points under the hexagonal norm (many ties): Σd equals brute force, and Σd² is the least among the brute-force optima', () => {
    const R = rng(77)
    const metric = makeMetric(HEX)
    const snap = (p: P): P => { const h = (HEX.a1[0] * Math.sqrt(3)) / 2, j = Math.round(p[1] / h), i = Math.round((p[0] + (j * HEX.a1[0]) / 2) / HEX.a1[0]); return [i * HEX.a1[0] - (j * HEX.a1[0]) / 2, j * h] }
    for (let rep = 0; rep < 12; rep++) {
      const nA = 5 + (rep % 3), nS = 5
      const atoms = scatter(R, nA, [0, 2, 0, 2]).map(snap), sites = scatter(R, nS, [0, 2, 0, 2]).map(snap)
      const d = (a: number, s: number) => metric.norm(sites[s]![0] - atoms[a]![0], sites[s]![1] - atoms[a]![1])
      // Brute force over all injective maps site → atom: the optimum of Σd, then the least Σd² among maps within 1e-9 of it.
      let best = Infinity, best2 = Infinity
      const used = new Array<boolean>(nA).fill(false)
      const go = (s: number, acc: number, acc2: number) => {
        if (s === nS) {
          if (acc < best - 1e-9) { best = acc; best2 = acc2 }
          else if (acc <= best + 1e-9) best2 = Math.min(best2, acc2)
          return
        }
        for (let a = 0; a < nA; a++) {
          if (used[a]) continue
          used[a] = true
          go(s + 1, acc + d(a, s), acc2 + d(a, s) ** 2)
          used[a] = false
        }
      }
      go(0, 0, 0)
      const r = solveAssignment({ atoms, sites, atomIds: atoms.map((_, i) => i), siteIds: sites.map((_, i) => i), metric, cost: 'distance', zones: [], mode: 'sparse' })
      const total = r.pairs.reduce((t, [a, s]) => t + d(a, s), 0)
      const total2 = r.pairs.reduce((t, [a, s]) => t + d(a, s) ** 2, 0)
      expect(total).toBeCloseTo(best, 9)
      expect(total2).toBeCloseTo(best2, 9)
    }
  })
  it('square 900 × 900 (warm start from the stratified subsample) with tie-break: same Σd as munkres, certified', () => {
    const R = rng(31)
    const atoms = scatter(R, 900, [0, 30, 0, 30]), sites = scatter(R, 900, [5, 35, 0, 30])
    const base = { atoms, sites, atomIds: atoms.map((_, i) => i), siteIds: sites.map((_, i) => i), metric: makeMetric(HEX), cost: 'distance' as const, zones: [] }
    const dense = solveAssignment({ ...base, mode: 'dense' }), sparse = solveAssignment({ ...base, mode: 'sparse' })
    const d = (a: number, s: number) => base.metric.norm(sites[s]![0] - atoms[a]![0], sites[s]![1] - atoms[a]![1])
    expect(sparse.pairs.reduce((t, [a, s]) => t + d(a, s), 0)).toBeCloseTo(dense.cost, 6)
    expect(sparse.exact).toBe(true)
    expect(sparse.lowerBound).toBeCloseTo(dense.cost, 6)
    expect(new Set(sparse.pairs.map(p => p[0])).size).toBe(900)
  })
})
