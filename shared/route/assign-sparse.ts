// Large assignments: multilevel shortest augmenting paths on a sparse candidate graph, with
// LP-duality pricing (column generation) over ALL pairs. Weak duality of the rectangular
// assignment LP (min Σc·x, Σ_j x_ij = 1, Σ_i x_ij ≤ 1, x ≥ 0) says that any u, v with v ≤ 0 and
// u_i + v_j ≤ c_ij for every pair gives Σu + Σv ≤ optimum. From the sparse duals we take
// u'_i = min(u_i, min_j (c_ij − v_j)), feasible for every pair, so Σu' + Σv is a true lower
// bound; when no pair prices below u_i (and free columns have v = 0) it equals the matched cost,
// which certifies the sparse solution as the exact optimum.
// Candidates come from the column potentials of a coarser random subsample (solved the same way),
// so that rows whose nearest columns are all taken (a dense blueprint amid sparse atoms) still get
// the far columns they need: the k columns of smallest c_ij − v_j, not merely the k nearest.
import type { AssignResult, AssignSpec } from './assign-dense'
import type { Clock } from './clock'
import { gridOf, type PointGrid } from './grid'
import { ssp, type Csr } from './sparse-ssp'

export interface SparseOptions {
  /** Candidate columns per row (default 12). */
  k?: number
  /** Nearest rows per column (default 6). */
  kCol?: number
  /** Pricing rounds before settling for the dual bound (default 4). */
  maxRounds?: number
}

interface Level { rowMatch: Int32Array, v: Float64Array, cost: number, bound: number, exact: boolean }

const BASE_ROWS = 400

function pointsOf(xy: Float64Array): Array<[number, number]> {
  const out: Array<[number, number]> = new Array(xy.length / 2)
  for (let i = 0; i < out.length; i++) out[i] = [xy[2 * i]!, xy[2 * i + 1]!]
  return out
}

/** Deterministic subsample of `take` of `n` indices (mulberry32 partial Fisher–Yates). */
function sample(n: number, take: number, seed: number): Int32Array {
  const idx = new Int32Array(n)
  for (let i = 0; i < n; i++) idx[i] = i
  let s = seed >>> 0
  const rnd = () => {
    s = (s + 0x6D2B79F5) >>> 0
    let t = Math.imul(s ^ (s >>> 15), 1 | s)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
  for (let i = 0; i < take; i++) {
    const j = i + Math.floor(rnd() * (n - i))
    const t = idx[i]!; idx[i] = idx[j]!; idx[j] = t
  }
  return idx.slice(0, take).sort()
}

export function sparseAssign(spec: AssignSpec, clock?: Clock, opts: SparseOptions = {}): AssignResult {
  const r = solveLevel(spec, clock, opts, 1)
  return { rowMatch: r.rowMatch, cost: r.cost, bound: r.bound, exact: r.exact, method: 'sparse' }
}

function solveLevel(spec: AssignSpec, clock: Clock | undefined, opts: SparseOptions, seed: number): Level {
  const { nRows: n, nCols: m, rowXY, colXY } = spec
  if (n === 0 || m === 0) return { rowMatch: new Int32Array(n).fill(-1), v: new Float64Array(m), cost: 0, bound: 0, exact: true }
  const colGrid = gridOf(pointsOf(colXY), 2)
  const vInit = new Float64Array(m)
  let k = Math.min(m, opts.k ?? 12)
  if (n > BASE_ROWS) {
    // Coarse level: a quarter of the rows and of the columns, same geometry and cost.
    const rs = sample(n, Math.ceil(n / 4), seed), cs = sample(m, Math.max(Math.ceil(m / 4), Math.ceil(n / 4)), seed + 17)
    const sub: AssignSpec = {
      nRows: rs.length, nCols: cs.length,
      rowXY: Float64Array.from({ length: 2 * rs.length }, (_, t) => rowXY[2 * rs[t >> 1]! + (t & 1)]!),
      colXY: Float64Array.from({ length: 2 * cs.length }, (_, t) => colXY[2 * cs[t >> 1]! + (t & 1)]!),
      cost: (r, c) => spec.cost(rs[r]!, cs[c]!),
      costFromEuclid: spec.costFromEuclid,
    }
    const coarse = solveLevel(sub, clock, { ...opts, maxRounds: 2 }, seed + 1)
    const subGrid = gridOf(pointsOf(sub.colXY), 2)
    const id = new Int32Array(1), d2 = new Float64Array(1)
    for (let j = 0; j < m; j++) {
      subGrid.knn(colXY[2 * j]!, colXY[2 * j + 1]!, 1, id, d2)
      vInit[j] = Math.min(0, coarse.v[id[0]!]!)
    }
  }
  else if (n * m <= 2e6) {
    k = m
  }
  clock?.check()
  const rowGrid = gridOf(pointsOf(rowXY), 2)
  const kc = Math.min(n, opts.kCol ?? 6)
  const colEdges: number[][] = Array.from({ length: n }, () => [])
  {
    const ids = new Int32Array(kc), d2 = new Float64Array(kc)
    for (let j = 0; j < m; j++) {
      const f = rowGrid.knn(colXY[2 * j]!, colXY[2 * j + 1]!, kc, ids, d2)
      for (let t = 0; t < f; t++) colEdges[ids[t]!]!.push(j)
    }
  }
  const kRow = new Int32Array(n).fill(k)
  const lists = initialCandidates(spec, colGrid, vInit, kRow, colEdges, clock)
  const maxRounds = opts.maxRounds ?? 4
  // A rectangular SSP starts cold (v = 0): a warm start would leave free columns with v < 0, which
  // voids the optimality certificate (see the header), so there the coarse potentials only choose
  // the candidates. A square problem ends with no free column, so it may start from them and
  // continue each pricing round from the previous matching.
  const square = n === m
  let warm: { v: Float64Array, rowMatch?: Int32Array } | undefined = square ? { v: vInit } : undefined
  let rounds = 0
  for (let attempt = 0; attempt < maxRounds + 24; attempt++) {
    const csr = toCsr(spec, lists)
    const res = ssp(csr, clock, warm)
    if (!res.ok) {
      // No augmenting path inside the candidate graph: give the rows that search reached more
      // candidates (by reduced cost under the coarse potentials) and solve again.
      widen(spec, colGrid, vInit, kRow, res.failedRows, lists)
      continue
    }
    rounds++
    // Free columns must carry v = 0 for the dual bound (complementary slackness of Σ_i x_ij ≤ 1).
    for (let j = 0; j < m; j++) if (res.colMatch[j] === -1) res.v[j] = 0
    const priced = price(spec, colGrid, res.u, res.v, clock)
    if (priced.violations === 0 || rounds >= maxRounds) {
      let cost = 0
      for (let i = 0; i < n; i++) cost += spec.cost(i, res.rowMatch[i]!)
      let bound = 0
      for (let i = 0; i < n; i++) bound += priced.uPrime[i]!
      for (let j = 0; j < m; j++) bound += res.v[j]!
      const exact = priced.violations === 0
      return { rowMatch: res.rowMatch, v: res.v, cost, bound: exact ? cost : Math.min(bound, cost), exact }
    }
    for (let i = 0; i < n; i++) {
      const add = priced.add[i]
      if (add) lists[i] = mergeSorted(lists[i]!, add)
    }
    if (square) warm = { v: res.v, rowMatch: res.rowMatch }
  }
  throw new Error('sparse assignment: candidate graph never admitted a complete matching')
}

function mergeSorted(a: Int32Array, add: ArrayLike<number>): Int32Array {
  const all = new Int32Array(a.length + add.length)
  all.set(a)
  for (let t = 0; t < add.length; t++) all[a.length + t] = add[t]!
  all.sort()
  let w = 0
  for (let r = 0; r < all.length; r++) if (r === 0 || all[r] !== all[r - 1]) all[w++] = all[r]!
  return all.slice(0, w)
}

function initialCandidates(
  spec: AssignSpec, grid: PointGrid, v: Float64Array, kRow: Int32Array, colEdges: number[][], clock?: Clock,
): Int32Array[] {
  const n = spec.nRows, m = spec.nCols
  const wmin = cellMinW(grid, v)
  const K = kRow[0] ?? 1
  const outJ = new Int32Array(Math.max(K, 1)), outR = new Float64Array(Math.max(K, 1))
  const lists: Int32Array[] = new Array(n)
  for (let i = 0; i < n; i++) {
    if ((i & 255) === 0) clock?.check()
    let base: Int32Array
    if (K >= m) base = Int32Array.from({ length: m }, (_, j) => j)
    else base = outJ.slice(0, searchRow(spec, grid, wmin, v, i, K, Infinity, outJ, outR))
    lists[i] = mergeSorted(base, colEdges[i]!)
  }
  return lists
}

function widen(spec: AssignSpec, grid: PointGrid, v: Float64Array, kRow: Int32Array, rows: number[], lists: Int32Array[]): void {
  const m = spec.nCols
  const wmin = cellMinW(grid, v)
  for (const i of rows) {
    const K = Math.min(m, 2 * kRow[i]!)
    kRow[i] = K
    const outJ = new Int32Array(K), outR = new Float64Array(K)
    const f = K >= m ? m : searchRow(spec, grid, wmin, v, i, K, Infinity, outJ, outR)
    if (K >= m) for (let j = 0; j < m; j++) outJ[j] = j
    lists[i] = mergeSorted(lists[i]!, outJ.subarray(0, f))
  }
}

function toCsr(spec: AssignSpec, lists: Int32Array[]): Csr {
  const n = spec.nRows
  const ptr = new Int32Array(n + 1)
  for (let i = 0; i < n; i++) ptr[i + 1] = ptr[i]! + lists[i]!.length
  const col = new Int32Array(ptr[n]!), cost = new Float64Array(ptr[n]!)
  for (let i = 0; i < n; i++) {
    const l = lists[i]!
    const off = ptr[i]!
    col.set(l, off)
    for (let t = 0; t < l.length; t++) cost[off + t] = spec.cost(i, l[t]!)
  }
  return { n, m: spec.nCols, ptr, col, cost }
}

/** Best columns of row i by r_j = c_ij − v_j, smallest first, among those with r_j < limit. */
function searchRow(
  spec: AssignSpec, grid: PointGrid, wmin: Float64Array, v: Float64Array, i: number,
  K: number, limit: number, outJ: Int32Array, outR: Float64Array,
): number {
  const x = spec.rowXY[2 * i]!, y = spec.rowXY[2 * i + 1]!, g = grid.cell
  const ccx = grid.cx(x), ccy = grid.cy(y)
  let found = 0
  const maxRing = Math.max(grid.nx, grid.ny)
  for (let ring = 0; ring <= maxRing; ring++) {
    const cutoff = found >= K ? Math.min(limit, outR[K - 1]!) : limit
    if (ring > 1 && spec.costFromEuclid((ring - 1) * g) >= cutoff) break
    const y0 = ccy - ring, y1 = ccy + ring, x0 = ccx - ring, x1 = ccx + ring
    for (let cy = Math.max(0, y0); cy <= Math.min(grid.ny - 1, y1); cy++) {
      const yl = grid.y0 + cy * g
      const dy = y < yl ? yl - y : y > yl + g ? y - yl - g : 0
      const edgeRow = cy === y0 || cy === y1
      for (let cx = Math.max(0, x0); cx <= Math.min(grid.nx - 1, x1); cx++) {
        if (!edgeRow && cx !== x0 && cx !== x1) continue
        const w = wmin[cy * grid.nx + cx]!
        if (w === Infinity) continue
        const xl = grid.x0 + cx * g
        const dx = x < xl ? xl - x : x > xl + g ? x - xl - g : 0
        const cut = found >= K ? Math.min(limit, outR[K - 1]!) : limit
        if (spec.costFromEuclid(Math.sqrt(dx * dx + dy * dy)) + w >= cut) continue
        for (const j of grid.cellAt(cx, cy)) {
          const ex = spec.colXY[2 * j]! - x, ey = spec.colXY[2 * j + 1]! - y
          const c2 = found >= K ? Math.min(limit, outR[K - 1]!) : limit
          if (spec.costFromEuclid(Math.sqrt(ex * ex + ey * ey)) - v[j]! >= c2) continue
          const r = spec.cost(i, j) - v[j]!
          if (r >= c2) continue
          let t = found < K ? found++ : K - 1
          while (t > 0 && outR[t - 1]! > r) { outR[t] = outR[t - 1]!; outJ[t] = outJ[t - 1]!; t-- }
          outR[t] = r; outJ[t] = j
        }
      }
    }
    if (x0 <= 0 && y0 <= 0 && x1 >= grid.nx - 1 && y1 >= grid.ny - 1) break
  }
  return found
}

function cellMinW(grid: PointGrid, v: Float64Array): Float64Array {
  const wmin = new Float64Array(grid.nx * grid.ny).fill(Infinity)
  for (let cy = 0; cy < grid.ny; cy++) {
    for (let cx = 0; cx < grid.nx; cx++) {
      let w = Infinity
      for (const j of grid.cellAt(cx, cy)) if (-v[j]! < w) w = -v[j]!
      wmin[cy * grid.nx + cx] = w
    }
  }
  return wmin
}

/** For every row, min_j (c_ij − v_j) over ALL columns where it falls below u_i. */
function price(spec: AssignSpec, grid: PointGrid, u: Float64Array, v: Float64Array, clock?: Clock) {
  const n = spec.nRows
  const wmin = cellMinW(grid, v)
  const uPrime = Float64Array.from(u)
  const add: Array<number[] | undefined> = new Array(n)
  const K = 16
  const outJ = new Int32Array(K), outR = new Float64Array(K)
  let violations = 0
  for (let i = 0; i < n; i++) {
    if ((i & 255) === 0) clock?.check()
    const ui = u[i]!
    const f = searchRow(spec, grid, wmin, v, i, K, ui - 1e-9 * (1 + Math.abs(ui)), outJ, outR)
    if (f > 0) {
      violations++
      uPrime[i] = outR[0]!
      add[i] = Array.from(outJ.subarray(0, f))
    }
  }
  return { uPrime, add, violations }
}
