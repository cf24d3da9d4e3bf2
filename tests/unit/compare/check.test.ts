import { describe, expect, it } from 'vitest'
import { checkAsBuilt } from '../../../shared/compare/check'
import { matchWithin } from '../../../shared/compare/matching'
import { isInputError } from '../../../shared/errors'

type Pt = [number, number]

function field(fn: () => unknown): string {
  try {
    fn()
  }
  catch (e) {
    if (isInputError(e)) return e.field
    throw e
  }
  return '(no error)'
}

/** Park–Miller minimal standard generator, fixed seed: synthetic inputs only. */
function rng(seed: number) {
  let s = seed
  return () => (s = (s * 16807) % 2147483647) / 2147483647
}

/** Brute force over every one-to-one matching within tol: most pairs, then least total distance. */
function bruteForce(sites: Pt[], found: Pt[], tol: number): { count: number, total: number } {
  let best = { count: -1, total: Infinity }
  const used = new Array<boolean>(found.length).fill(false)
  const rec = (i: number, count: number, total: number) => {
    if (i === sites.length) {
      if (count > best.count || (count === best.count && total < best.total - 1e-15)) best = { count, total }
      return
    }
    rec(i + 1, count, total)
    for (let j = 0; j < found.length; j++) {
      if (used[j]) continue
      const d = Math.hypot(sites[i]![0] - found[j]![0], sites[i]![1] - found[j]![1])
      if (d > tol + 1e-9) continue
      used[j] = true
      rec(i + 1, count + 1, total + d)
      used[j] = false
    }
  }
  rec(0, 0, 0)
  return best
}

describe('checkAsBuilt on hand-computed cases', () => {
  it('places every site of a perfect build', () => {
    const sites: Pt[] = [[0, 0], [1, 0], [0, 1]]
    const out = checkAsBuilt({ sites, found: [[0, 1], [0, 0], [1, 0]] })
    expect(out.placed).toEqual([0, 1, 2])
    expect(out.pairs.map(p => p.slice(0, 2))).toEqual([[0, 1], [1, 2], [2, 0]])
    expect([out.missing, out.extra, out.rms_nm, out.fidelity]).toEqual([[], [], 0, 1])
  })

  it('reports a displaced site, a missing one and an extra atom with RMS and fidelity', () => {
    // site 0 displaced by (0.03, 0.04) → 0.05 nm; site 1 exact; site 2 has nothing near;
    // found[2] at (5, 5) is extra. RMS over placed = √((0.05² + 0²)/2) = 0.0353553…; fidelity 2/3.
    const out = checkAsBuilt({ sites: [[0, 0], [1, 0], [2, 0]], found: [[0.03, 0.04], [1, 0], [5, 5]] })
    expect(out.placed).toEqual([0, 1])
    expect(out.missing).toEqual([2])
    expect(out.extra).toEqual([2])
    expect(out.rms_nm).toBeCloseTo(Math.sqrt(0.05 ** 2 / 2), 14)
    expect(out.fidelity).toBeCloseTo(2 / 3, 15)
    expect(out.pairs[0]![2]).toBeCloseTo(0.05, 15)
    expect(out.site_status).toEqual(['placed', 'placed', 'missing'])
    expect(out.off_site).toEqual([])
    expect(out.mean_offset_nm![0]).toBeCloseTo(0.015, 15)
  })

  it('counts a distance exactly at the tolerance as placed and just beyond as off-site', () => {
    // 1.4 − 1.3 = 0.10000000000000009 in binary floating point: "exactly at" 0.1 nm
    const at = checkAsBuilt({ sites: [[1.3, 0]], found: [[1.4, 0]] })
    expect(at.placed).toEqual([0])
    const at2 = checkAsBuilt({ sites: [[0, 0]], found: [[0.06, 0.08]] }) // 3-4-5 triangle: 0.1
    expect(at2.placed).toEqual([0])
    const beyond = checkAsBuilt({ sites: [[1.3, 0]], found: [[1.4001, 0]] })
    expect(beyond.placed).toEqual([])
    expect(beyond.missing).toEqual([0])
    expect(beyond.extra).toEqual([0])
    expect(beyond.rms_nm).toBeNull()
    expect(beyond.fidelity).toBe(0)
    // the UI shows it as off-site with the offset
    expect(beyond.off_site).toHaveLength(1)
    expect(beyond.off_site[0]!.site).toBe(0)
    expect(beyond.off_site[0]!.offset[0]).toBeCloseTo(0.1001, 12)
    expect(beyond.off_site[0]!.distance_nm).toBeCloseTo(0.1001, 12)
    expect(beyond.site_status).toEqual(['off-site'])
    // a custom tolerance moves the edge
    expect(checkAsBuilt({ sites: [[1.3, 0]], found: [[1.4001, 0]], tolerance_nm: 0.2 }).placed).toEqual([0])
    // beyond near_nm it is simply missing
    expect(checkAsBuilt({ sites: [[0, 0]], found: [[0.6, 0]] }).off_site).toEqual([])
  })

  it('keeps the match one-to-one: of two atoms near one site the nearer is placed, the other is extra', () => {
    const out = checkAsBuilt({ sites: [[0, 0]], found: [[0.08, 0], [0, 0.03]] })
    expect(out.pairs).toEqual([[0, 1, 0.03]])
    expect(out.extra).toEqual([0])
  })

  it('maximises the number of placed sites where greedy nearest-first would not', () => {
    // A = 0, B = 0.15; f1 = 0.076 (0.076 from A, 0.074 from B), f2 = 0.24 (0.09 from B only).
    // Nearest-first pairs f1–B and leaves A and f2 unmatched; the optimum places both.
    const out = checkAsBuilt({ sites: [[0, 0], [0.15, 0]], found: [[0.076, 0], [0.24, 0]] })
    expect(out.placed).toEqual([0, 1])
    expect(out.pairs.map(p => p.slice(0, 2))).toEqual([[0, 0], [1, 1]])
  })

  it('among maximal matchings takes the least total distance', () => {
    // both atoms are within tolerance of both sites; crossing pairs would cost 0.09 + 0.09,
    // straight pairs 0.01 + 0.01
    const out = checkAsBuilt({ sites: [[0, 0], [0.1, 0]], found: [[0.01, 0], [0.09, 0]], tolerance_nm: 0.15 })
    expect(out.pairs.map(p => p.slice(0, 2))).toEqual([[0, 0], [1, 1]])
    expect(out.rms_nm).toBeCloseTo(0.01, 14)
  })

  it('handles an empty after-scan: every site missing', () => {
    const out = checkAsBuilt({ sites: [[0, 0], [1, 1]], found: [] })
    expect([out.placed, out.missing, out.extra, out.rms_nm, out.fidelity]).toEqual([[], [0, 1], [], null, 0])
  })

  it('rejects bad input naming the field', () => {
    expect(field(() => checkAsBuilt({ sites: [], found: [[0, 0]] }))).toBe('sites')
    expect(field(() => checkAsBuilt({ sites: [[0, 0]], found: [[0, 0], [1, 1], [Number.NaN, 0]] }))).toBe('found[2]')
    expect(field(() => checkAsBuilt({ sites: [[0, 0], [1]], found: [] }))).toBe('sites[1]')
    expect(field(() => checkAsBuilt({ sites: [[0, 0]], found: [], tolerance_nm: 0 }))).toBe('tolerance_nm')
    expect(field(() => checkAsBuilt({ sites: [[0, 0]], found: [], near_nm: -1 }))).toBe('near_nm')
    // a tolerance that links a whole dense patch into one cluster is refused with a reason
    const patch: Pt[] = []
    for (let i = 0; i < 40; i++) for (let j = 0; j < 40; j++) patch.push([i * 0.2, j * 0.2])
    expect(field(() => checkAsBuilt({ sites: patch, found: patch, tolerance_nm: 5 }))).toBe('tolerance_nm')
  })
})

describe('matching optimality against brute force', () => {
  it('finds the most pairs and then the least total distance on 300 random small cases', () => {
    const r = rng(2024)
    for (let t = 0; t < 300; t++) {
      const ns = 1 + Math.floor(r() * 6)
      const nf = Math.floor(r() * 7)
      const sites: Pt[] = Array.from({ length: ns }, () => [r() * 0.5, r() * 0.5])
      const found: Pt[] = Array.from({ length: nf }, () => [r() * 0.5, r() * 0.5])
      const tol = 0.05 + r() * 0.2
      const want = bruteForce(sites, found, tol)
      const got = matchWithin(sites, sites.map((_, i) => i), found, found.map((_, j) => j), tol)
      expect(got.pairs.length).toBe(want.count)
      expect(Math.abs(got.pairs.reduce((s, p) => s + p[2], 0) - want.total)).toBeLessThan(1e-12)
      // one-to-one
      expect(new Set(got.pairs.map(p => p[0])).size).toBe(got.pairs.length)
      expect(new Set(got.pairs.map(p => p[1])).size).toBe(got.pairs.length)
    }
  })
})

describe('matchWithin limits', () => {
  it('matches oversize clusters greedily or skips them, as asked, and reports them', () => {
    // the greedy case of the maximality test above: nearest-first gives one pair
    const a: Pt[] = [[0, 0], [0.15, 0]]
    const b: Pt[] = [[0.076, 0], [0.24, 0]]
    const greedy = matchWithin(a, [0, 1], b, [0, 1], 0.1, { maxCells: 1, oversize: 'greedy' })
    expect(greedy.oversizeComponents).toBe(1)
    expect(greedy.pairs.map(p => p.slice(0, 2))).toEqual([[1, 0]])
    const skip = matchWithin(a, [0, 1], b, [0, 1], 0.1, { maxCells: 1, oversize: 'skip' })
    expect(skip.pairs).toEqual([])
    const capped = matchWithin(a, [0, 1], b, [0, 1], 0.1, { maxCandidates: 2 })
    expect(capped.truncated).toBe(true)
  })
})

describe('a 10⁴-site build (synthetic, fixed seed)', () => {
  it('recovers the known placement, offsets and RMS', () => {
    const r = rng(7)
    const sites: Pt[] = []
    for (let i = 0; i < 100; i++) for (let j = 0; j < 100; j++) sites.push([i * 0.5, j * 0.5])
    const found: Pt[] = []
    const truth: number[] = []
    let sum2 = 0
    sites.forEach(([x, y], i) => {
      if (r() < 0.03) return // 3 % not built
      const dx = (r() - 0.5) * 0.1
      const dy = (r() - 0.5) * 0.1
      found.push([x + dx, y + dy])
      truth.push(i)
      sum2 += dx * dx + dy * dy
    })
    const out = checkAsBuilt({ sites, found })
    expect(out.placed).toEqual(truth)
    expect(out.extra).toEqual([])
    expect(out.fidelity).toBeCloseTo(truth.length / 1e4, 15)
    expect(out.rms_nm!).toBeCloseTo(Math.sqrt(sum2 / truth.length), 14)
  })
})
