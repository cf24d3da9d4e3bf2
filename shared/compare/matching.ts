// One-to-one matching of two point sets within a radius: the largest number of pairs, and among
// those the smallest total distance. Candidate pairs come from a grid of buckets (cell = radius);
// each connected component of the candidate graph is solved by the Hungarian method (munkres) on
// the cost d for candidates and B for the rest, B > (pairs possible)·radius, so that one more
// candidate pair always outweighs any saving in distance (lexicographic objective).
import { munkres } from 'munkres'

/** Distances are compared with this slack (nm): "exactly at the tolerance" counts as within. */
export const DISTANCE_SLACK_nm = 1e-9

export interface MatchOptions {
  /** largest cost matrix (rows × columns) a component may have for the Hungarian method */
  maxCells?: number
  /** what to do with a larger component: match it greedily (shortest pair first) or leave it */
  oversize?: 'greedy' | 'skip'
  /** stop collecting candidates beyond this many (memory bound); reported in the result */
  maxCandidates?: number
}

export interface MatchResult {
  /** [aIndex, bIndex, distance], sorted by aIndex */
  pairs: [number, number, number][]
  /** components larger than maxCells (greedy-matched or skipped, per `oversize`) */
  oversizeComponents: number
  largestComponent: number
  /** true when candidate collection stopped at maxCandidates: the result is then incomplete */
  truncated: boolean
}

type Pt = readonly [number, number]

interface Candidates { a: Int32Array, b: Int32Array, d: Float64Array, n: number, truncated: boolean }

/** Candidate pairs with d ≤ radius (+ slack), from a bucket grid over b. */
function candidatePairs(a: readonly Pt[], aIdx: readonly number[], b: readonly Pt[], bIdx: readonly number[], radius: number, max: number): Candidates {
  // cell ≥ the largest accepted distance, so every candidate lies in the 3 × 3 neighbourhood
  const cell = radius + DISTANCE_SLACK_nm
  const grid = new Map<string, number[]>()
  for (const j of bIdx) {
    const key = `${Math.floor(b[j]![0] / cell)},${Math.floor(b[j]![1] / cell)}`
    const list = grid.get(key)
    if (list) list.push(j)
    else grid.set(key, [j])
  }
  let cap = Math.min(max, Math.max(16, 2 * (aIdx.length + bIdx.length)))
  let c: Candidates = { a: new Int32Array(cap), b: new Int32Array(cap), d: new Float64Array(cap), n: 0, truncated: false }
  const push = (i: number, j: number, d: number) => {
    if (c.n === cap) {
      if (cap >= max) {
        c.truncated = true
        return
      }
      cap = Math.min(max, cap * 2)
      const g = { a: new Int32Array(cap), b: new Int32Array(cap), d: new Float64Array(cap), n: c.n, truncated: false }
      g.a.set(c.a)
      g.b.set(c.b)
      g.d.set(c.d)
      c = g
    }
    c.a[c.n] = i
    c.b[c.n] = j
    c.d[c.n] = d
    c.n++
  }
  for (const i of aIdx) {
    const [x, y] = a[i]!
    const cx = Math.floor(x / cell)
    const cy = Math.floor(y / cell)
    for (let gx = cx - 1; gx <= cx + 1; gx++) {
      for (let gy = cy - 1; gy <= cy + 1; gy++) {
        const list = grid.get(`${gx},${gy}`)
        if (!list) continue
        for (const j of list) {
          const d = Math.hypot(b[j]![0] - x, b[j]![1] - y)
          if (d <= cell) push(i, j, d)
          if (c.truncated) return c
        }
      }
    }
  }
  return c
}

function find(parent: Int32Array, x: number): number {
  while (parent[x]! !== x) {
    parent[x] = parent[parent[x]!]!
    x = parent[x]!
  }
  return x
}

/** Matches points a[aIdx] to b[bIdx] one-to-one within `radius` (see the file header). */
export function matchWithin(a: readonly Pt[], aIdx: readonly number[], b: readonly Pt[], bIdx: readonly number[], radius: number, opts: MatchOptions = {}): MatchResult {
  const maxCells = opts.maxCells ?? 1_000_000
  const cand = candidatePairs(a, aIdx, b, bIdx, radius, opts.maxCandidates ?? 4_000_000)
  const result: MatchResult = { pairs: [], oversizeComponents: 0, largestComponent: 0, truncated: cand.truncated }
  if (cand.truncated) return result
  const na = a.length
  const parent = new Int32Array(na + b.length)
  for (let i = 0; i < parent.length; i++) parent[i] = i
  for (let e = 0; e < cand.n; e++) {
    const ri = find(parent, cand.a[e]!)
    const rj = find(parent, na + cand.b[e]!)
    if (ri !== rj) parent[ri] = rj
  }
  const groups = new Map<number, number[]>()
  for (let e = 0; e < cand.n; e++) {
    const r = find(parent, cand.a[e]!)
    const g = groups.get(r)
    if (g) g.push(e)
    else groups.set(r, [e])
  }
  for (const edges of groups.values()) {
    if (edges.length === 1) {
      const e = edges[0]!
      result.pairs.push([cand.a[e]!, cand.b[e]!, cand.d[e]!])
      result.largestComponent = Math.max(result.largestComponent, 1)
      continue
    }
    const rows = [...new Set(edges.map(e => cand.a[e]!))]
    const cols = [...new Set(edges.map(e => cand.b[e]!))]
    const cells = rows.length * cols.length
    result.largestComponent = Math.max(result.largestComponent, cells)
    if (cells > maxCells) {
      result.oversizeComponents++
      if (opts.oversize === 'skip') continue
      const usedA = new Set<number>()
      const usedB = new Set<number>()
      for (const e of [...edges].sort((p, q) => cand.d[p]! - cand.d[q]!)) {
        if (usedA.has(cand.a[e]!) || usedB.has(cand.b[e]!)) continue
        usedA.add(cand.a[e]!)
        usedB.add(cand.b[e]!)
        result.pairs.push([cand.a[e]!, cand.b[e]!, cand.d[e]!])
      }
      continue
    }
    const rowOf = new Map(rows.map((r, k) => [r, k]))
    const colOf = new Map(cols.map((c, k) => [c, k]))
    const big = (Math.min(rows.length, cols.length) + 1) * (radius + DISTANCE_SLACK_nm) + 1
    const cost = rows.map(() => new Float64Array(cols.length).fill(big))
    for (const e of edges) cost[rowOf.get(cand.a[e]!)!]![colOf.get(cand.b[e]!)!] = cand.d[e]!
    for (const [r, c] of munkres(cost)) {
      const d = cost[r]![c]!
      if (d < big) result.pairs.push([rows[r]!, cols[c]!, d])
    }
  }
  result.pairs.sort((p, q) => p[0] - q[0])
  return result
}
