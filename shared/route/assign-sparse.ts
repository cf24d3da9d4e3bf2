// Large assignments: multilevel shortest augmenting paths on a sparse candidate graph, with
// LP-duality pricing (column generation) over ALL pairs. Weak duality of the rectangular
// assignment LP (min Σc·x, Σ_j x_ij = 1, Σ_i x_ij ≤ 1, x ≥ 0) says that any u, v with v ≤ 0 and
// u_i + v_j ≤ c_ij for every pair gives Σu + Σv ≤ optimum. From the sparse duals we take
// u'_i = min(u_i, min_j (c_ij − v_j)), feasible for every pair, so Σu' + Σv is a true lower
// bound; when no pair prices below u_i (and free columns have v = 0) it equals the matched cost,
// which certifies the sparse solution as the exact optimum.
// Candidates come from the column potentials of a coarser stratified subsample (every 4th point
// along a Z-order curve, solved the same way), so that rows whose nearest columns are all taken (a
// dense blueprint amid sparse atoms) still get the far columns they need: the k columns of
// smallest c_ij − v_j, not merely the k nearest. A greedy complete matching is always among the
// candidates, so no search fails for want of edges; row searches prune blocks of grid cells by the
// Euclidean bound plus their least −v_j. Measured on a 10⁴ × 10⁴ lattice patch: these three took
// the solve from 80 s (random subsample, restarts after failed searches, cell-only pruning) to ≈3 s.
import type { AssignResult, AssignSpec } from './assign-dense'
import type { Clock } from './clock'
import { boundsOf, gridOf, PointGrid } from './grid'
import { ssp, type Csr } from './sparse-ssp'

export interface SparseOptions {
  /** Candidate columns per row (default 12). */
  k?: number
  /** Nearest rows per column (default 6). */
  kCol?: number
  /** Pricing rounds before settling for the dual bound (default 6). */
  maxRounds?: number
}

interface Level { rowMatch: Int32Array, u: Float64Array, v: Float64Array, cost: number, bound: number, exact: boolean }

const BASE_ROWS = 400

function pointsOf(xy: Float64Array): Array<[number, number]> {
  const out: Array<[number, number]> = new Array(xy.length / 2)
  for (let i = 0; i < out.length; i++) out[i] = [xy[2 * i]!, xy[2 * i + 1]!]
  return out
}

/** Bit-interleaved (Morton, Z-order) key of a point quantised to 2¹⁵ × 2¹⁵ within the box. */
function mortonKeys(xy: Float64Array): Float64Array {
  const n = xy.length / 2
  let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity
  for (let i = 0; i < n; i++) {
    const x = xy[2 * i]!, y = xy[2 * i + 1]!
    if (x < x0) x0 = x
    if (x > x1) x1 = x
    if (y < y0) y0 = y
    if (y > y1) y1 = y
  }
  const s = 32767 / Math.max(x1 - x0, y1 - y0, 1e-12)
  const spread = (v: number) => {
    v &= 0x7FFF
    v = (v | (v << 8)) & 0x00FF00FF
    v = (v | (v << 4)) & 0x0F0F0F0F
    v = (v | (v << 2)) & 0x33333333
    v = (v | (v << 1)) & 0x55555555
    return v >>> 0
  }
  const keys = new Float64Array(n)
  for (let i = 0; i < n; i++) keys[i] = spread(Math.round((xy[2 * i]! - x0) * s)) * 2 + spread(Math.round((xy[2 * i + 1]! - y0) * s))
  return keys
}

/**
 * Every `stride`-th point along the Z-order curve (stratified subsample): a random subsample would
 * leave local surpluses of rows or columns that the coarse solve must ship far, and its potentials
 * would carry that artificial transport into the fine start.
 */
function sample(xy: Float64Array, stride: number): Int32Array {
  const n = xy.length / 2
  const keys = mortonKeys(xy)
  const order = Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => (keys[a]! - keys[b]!) || (a - b))
  const take = Math.ceil(n / stride)
  const out = new Int32Array(take)
  for (let t = 0; t < take; t++) out[t] = order[Math.min(n - 1, Math.floor(t * stride + stride / 2))]!
  return out.sort()
}

export function sparseAssign(spec: AssignSpec, clock?: Clock, opts: SparseOptions = {}): AssignResult {
  const r = solveLevel(spec, clock, opts)
  return { rowMatch: r.rowMatch, cost: r.cost, bound: r.bound, exact: r.exact, method: 'sparse', u: r.u, v: r.v }
}

function solveLevel(spec: AssignSpec, clock: Clock | undefined, opts: SparseOptions): Level {
  const { nRows: n, nCols: m, rowXY, colXY } = spec
  if (n === 0 || m === 0) return { rowMatch: new Int32Array(n).fill(-1), u: new Float64Array(n), v: new Float64Array(m), cost: 0, bound: 0, exact: true }
  const colGrid = gridOf(pointsOf(colXY), 2)
  const vInit = new Float64Array(m)
  let k = Math.min(m, opts.k ?? 12)
  if (n > BASE_ROWS) {
    // Coarse level: a quarter of the rows and of the columns, same geometry and cost.
    const rs = sample(rowXY, 4), cs = sample(colXY, Math.min(4, m / Math.ceil(n / 4)))
    const sub: AssignSpec = {
      nRows: rs.length, nCols: cs.length,
      rowXY: Float64Array.from({ length: 2 * rs.length }, (_, t) => rowXY[2 * rs[t >> 1]! + (t & 1)]!),
      colXY: Float64Array.from({ length: 2 * cs.length }, (_, t) => colXY[2 * cs[t >> 1]! + (t & 1)]!),
      cost: (r, c) => spec.cost(rs[r]!, cs[c]!),
      costFromEuclid: spec.costFromEuclid,
    }
    const coarse = solveLevel(sub, clock, { ...opts, maxRounds: 4 })
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
  addFeasibleMatching(spec, lists, clock)
  const maxRounds = opts.maxRounds ?? 6
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
      return { rowMatch: res.rowMatch, u: priced.uPrime, v: res.v, cost, bound: exact ? cost : Math.min(bound, cost), exact }
    }
    for (let i = 0; i < n; i++) {
      const add = priced.add[i]
      if (add) lists[i] = mergeSorted(lists[i]!, add)
    }
    if (square) warm = { v: res.v, rowMatch: res.rowMatch }
  }
  throw new Error('sparse assignment: candidate graph never admitted a complete matching')
}

/**
 * Adds the pairs of a greedy row-saturating matching to the candidate lists (each row its cheapest
 * listed free column, else the nearest free column), so that the candidate graph always admits a
 * complete matching and no search can fail for want of edges.
 */
function addFeasibleMatching(spec: AssignSpec, lists: Int32Array[], clock?: Clock): void {
  const n = spec.nRows, m = spec.nCols
  const taken = new Uint8Array(m)
  const left: number[] = []
  for (let i = 0; i < n; i++) {
    const l = lists[i]!
    let best = Infinity, bj = -1
    for (let t = 0; t < l.length; t++) {
      const j = l[t]!
      if (taken[j]) continue
      const c = spec.cost(i, j)
      if (c < best) { best = c; bj = j }
    }
    if (bj >= 0) taken[bj] = 1
    else left.push(i)
  }
  if (left.length === 0) return
  clock?.check()
  const pts = pointsOf(spec.colXY)
  const free = new PointGrid(boundsOf(pts), Math.sqrt(Math.max(1e-12, area(pts) * 2 / Math.max(m, 1))), m)
  for (let j = 0; j < m; j++) if (!taken[j]) free.insert(j, pts[j]![0], pts[j]![1])
  const id = new Int32Array(1), d2 = new Float64Array(1)
  for (const i of left) {
    if (free.knn(spec.rowXY[2 * i]!, spec.rowXY[2 * i + 1]!, 1, id, d2) < 1) break
    free.remove(id[0]!)
    lists[i] = mergeSorted(lists[i]!, [id[0]!])
  }
}

function area(pts: Array<[number, number]>): number {
  const b = boundsOf(pts)
  return (b.xmax - b.xmin) * (b.ymax - b.ymin)
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

/** Cells and blocks of BLOCK × BLOCK cells with the smallest −v_j inside (Infinity: empty). */
export interface WBounds { cell: Float64Array, block: Float64Array, nbx: number, nby: number }
const BLOCK = 8

/**
 * Best columns of row i by r_j = c_ij − v_j, smallest first, among those with r_j < limit. Rings
 * of blocks, then their cells, are skipped where the Euclidean bound plus the least −v cannot beat
 * the current cut-off: potentials of a distance cost vary over the whole patch, so a row's search
 * radius can span it, and the block level keeps that cheap.
 */
export function searchRow(
  spec: AssignSpec, grid: PointGrid, wb: WBounds, v: Float64Array, i: number,
  K: number, limit: number, outJ: Int32Array, outR: Float64Array,
): number {
  const x = spec.rowXY[2 * i]!, y = spec.rowXY[2 * i + 1]!, g = grid.cell, G = BLOCK * g
  const { nbx, nby } = wb
  const bcx = Math.floor(grid.cx(x) / BLOCK), bcy = Math.floor(grid.cy(y) / BLOCK)
  const cf = spec.costFromEuclid, colXY = spec.colXY
  let found = 0, cut = limit
  const maxRing = Math.max(nbx, nby)
  for (let ring = 0; ring <= maxRing; ring++) {
    if (ring > 1 && cf((ring - 1) * G) >= cut) break
    const by0 = bcy - ring, by1 = bcy + ring, bx0 = bcx - ring, bx1 = bcx + ring
    for (let by = Math.max(0, by0); by <= Math.min(nby - 1, by1); by++) {
      const edgeRow = by === by0 || by === by1
      const ybl = grid.y0 + by * G
      const dyb = y < ybl ? ybl - y : y > ybl + G ? y - ybl - G : 0
      for (let bx = Math.max(0, bx0); bx <= Math.min(nbx - 1, bx1); bx++) {
        if (!edgeRow && bx !== bx0 && bx !== bx1) continue
        const wB = wb.block[by * nbx + bx]!
        if (wB === Infinity) continue
        const xbl = grid.x0 + bx * G
        const dxb = x < xbl ? xbl - x : x > xbl + G ? x - xbl - G : 0
        if (cf(Math.sqrt(dxb * dxb + dyb * dyb)) + wB >= cut) continue
        const cy1 = Math.min(grid.ny, (by + 1) * BLOCK), cx1 = Math.min(grid.nx, (bx + 1) * BLOCK)
        for (let cy = by * BLOCK; cy < cy1; cy++) {
          const yl = grid.y0 + cy * g
          const dy = y < yl ? yl - y : y > yl + g ? y - yl - g : 0
          for (let cx = bx * BLOCK; cx < cx1; cx++) {
            const w = wb.cell[cy * grid.nx + cx]!
            if (w === Infinity) continue
            const xl = grid.x0 + cx * g
            const dx = x < xl ? xl - x : x > xl + g ? x - xl - g : 0
            if (cf(Math.sqrt(dx * dx + dy * dy)) + w >= cut) continue
            const list = grid.cellAt(cx, cy)
            for (let q = 0; q < list.length; q++) {
              const j = list[q]!
              const ex = colXY[2 * j]! - x, ey = colXY[2 * j + 1]! - y
              if (cf(Math.sqrt(ex * ex + ey * ey)) - v[j]! >= cut) continue
              const r = spec.cost(i, j) - v[j]!
              if (r >= cut) continue
              let t = found < K ? found++ : K - 1
              while (t > 0 && outR[t - 1]! > r) { outR[t] = outR[t - 1]!; outJ[t] = outJ[t - 1]!; t-- }
              outR[t] = r; outJ[t] = j
              if (found >= K) cut = Math.min(limit, outR[K - 1]!)
            }
          }
        }
      }
    }
    if (bx0 <= 0 && by0 <= 0 && bx1 >= nbx - 1 && by1 >= nby - 1) break
  }
  return found
}

export function cellMinW(grid: PointGrid, v: Float64Array): WBounds {
  const cell = new Float64Array(grid.nx * grid.ny).fill(Infinity)
  const nbx = Math.ceil(grid.nx / BLOCK), nby = Math.ceil(grid.ny / BLOCK)
  const block = new Float64Array(nbx * nby).fill(Infinity)
  for (let cy = 0; cy < grid.ny; cy++) {
    for (let cx = 0; cx < grid.nx; cx++) {
      let w = Infinity
      for (const j of grid.cellAt(cx, cy)) if (-v[j]! < w) w = -v[j]!
      cell[cy * grid.nx + cx] = w
      const b = Math.floor(cy / BLOCK) * nbx + Math.floor(cx / BLOCK)
      if (w < block[b]!) block[b] = w
    }
  }
  return { cell, block, nbx, nby }
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
