// Successive shortest augmenting paths for rectangular assignment on a sparse bipartite graph
// (Dijkstra on reduced costs with row/column potentials; the dual update of D. F. Crouse, "On
// implementing 2D rectangular assignment algorithms", IEEE Trans. Aerosp. Electron. Syst. 52 (2016)).
// Invariants: c_ij − u_i − v_j ≥ 0 on every edge, = 0 on matched edges, v_j ≤ 0 — and, from a cold
// start, v_j = 0 on free columns, so Σu + Σv equals the matched cost: the sparse optimum.
import type { Clock } from './clock'

export interface Csr {
  n: number
  m: number
  ptr: Int32Array
  col: Int32Array
  cost: Float64Array
}

export interface SspResult {
  ok: boolean
  rowMatch: Int32Array
  colMatch: Int32Array
  u: Float64Array
  v: Float64Array
  /** When !ok: the rows reached by the failed search (their candidate lists are too short). */
  failedRows: number[]
}

class MinHeap {
  key = new Float64Array(1024)
  val = new Int32Array(1024)
  size = 0
  clear() { this.size = 0 }
  push(k: number, v: number) {
    if (this.size === this.key.length) {
      const nk = new Float64Array(this.size * 2); nk.set(this.key); this.key = nk
      const nv = new Int32Array(this.size * 2); nv.set(this.val); this.val = nv
    }
    let i = this.size++
    const key = this.key, val = this.val
    while (i > 0) {
      const p = (i - 1) >> 1
      if (key[p]! <= k) break
      key[i] = key[p]!; val[i] = val[p]!; i = p
    }
    key[i] = k; val[i] = v
  }

  /** Pops the minimum; returns its value (the key is left in topKey). */
  topKey = 0
  pop(): number {
    const key = this.key, val = this.val
    const rv = val[0]!
    this.topKey = key[0]!
    const n = --this.size
    if (n > 0) {
      const k = key[n]!, v = val[n]!
      let i = 0
      for (;;) {
        let c = 2 * i + 1
        if (c >= n) break
        if (c + 1 < n && key[c + 1]! < key[c]!) c++
        if (key[c]! >= k) break
        key[i] = key[c]!; val[i] = val[c]!; i = c
      }
      key[i] = k; val[i] = v
    }
    return rv
  }
}

export interface SspWarm {
  /** Column potentials (≤ 0), e.g. from a coarser solve or the previous pricing round. */
  v: Float64Array
  /** A previous matching; pairs that are no longer tight under the new potentials are dropped. */
  rowMatch?: Int32Array
}

export function ssp(g: Csr, clock?: Clock, warm?: SspWarm): SspResult {
  const { n, m, ptr, col, cost } = g
  const u = new Float64Array(n), v = warm ? Float64Array.from(warm.v) : new Float64Array(m)
  const rowMatch = new Int32Array(n).fill(-1), colMatch = new Int32Array(m).fill(-1)
  // u_i = min_j (c_ij − v_j) keeps every reduced cost ≥ 0; keep old pairs that stay tight, then
  // match greedily on the tight edges.
  const prev = warm?.rowMatch
  const argmin = new Int32Array(n).fill(-1)
  for (let i = 0; i < n; i++) {
    let best = Infinity, bj = -1
    const pj = prev ? prev[i]! : -1
    let prevR = Infinity
    for (let e = ptr[i]!; e < ptr[i + 1]!; e++) {
      const r = cost[e]! - v[col[e]!]!
      if (r < best) { best = r; bj = col[e]! }
      if (col[e] === pj) prevR = r
    }
    u[i] = bj >= 0 ? best : 0
    argmin[i] = bj
    if (pj >= 0 && prevR <= best + 1e-12 * (1 + Math.abs(best)) && colMatch[pj] === -1) {
      colMatch[pj] = i; rowMatch[i] = pj
    }
  }
  for (let i = 0; i < n; i++) {
    const bj = argmin[i]!
    if (rowMatch[i] === -1 && bj >= 0 && colMatch[bj] === -1) { colMatch[bj] = i; rowMatch[i] = bj }
  }
  const dist = new Float64Array(m), pred = new Int32Array(m)
  const seen = new Int32Array(m), done = new Int32Array(m)
  const rowD = new Float64Array(n)
  const scanned = new Int32Array(n), popped = new Int32Array(m)
  const heap = new MinHeap()
  let iter = 0
  for (let cur = 0; cur < n; cur++) {
    if (rowMatch[cur] !== -1) continue
    if ((++iter & 63) === 0) clock?.check()
    heap.clear()
    let i = cur, Di = 0, ns = 0, np = 0, sink = -1, minVal = 0
    for (;;) {
      scanned[ns++] = i
      rowD[i] = Di
      const ui = u[i]!
      for (let e = ptr[i]!; e < ptr[i + 1]!; e++) {
        const j = col[e]!
        if (done[j] === iter) continue
        let r = Di + cost[e]! - ui - v[j]!
        if (r < Di) r = Di // reduced costs are ≥ 0 up to rounding
        if (seen[j] !== iter || r < dist[j]!) {
          seen[j] = iter; dist[j] = r; pred[j] = i
          heap.push(r, j)
        }
      }
      let j = -1
      while (heap.size > 0) {
        const c = heap.pop()
        if (done[c] !== iter && heap.topKey <= dist[c]!) { j = c; break }
      }
      if (j < 0) break
      done[j] = iter
      popped[np++] = j
      if (colMatch[j] === -1) { sink = j; minVal = dist[j]!; break }
      i = colMatch[j]!
      Di = dist[j]!
    }
    if (sink < 0) {
      return { ok: false, rowMatch, colMatch, u, v, failedRows: Array.from(scanned.subarray(0, ns)) }
    }
    for (let t = 0; t < ns; t++) { const r = scanned[t]!; u[r] = u[r]! + minVal - rowD[r]! }
    for (let t = 0; t < np; t++) { const c = popped[t]!; v[c] = v[c]! - (minVal - dist[c]!) }
    let j = sink
    for (;;) {
      const r = pred[j]!
      const next = rowMatch[r]!
      rowMatch[r] = j
      colMatch[j] = r
      if (r === cur) break
      j = next
    }
  }
  return { ok: true, rowMatch, colMatch, u, v, failedRows: [] }
}
