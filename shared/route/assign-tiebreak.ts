// Among the optimal assignments, the one with the least Σ c² (lexicographic objective). By
// complementary slackness every optimal matching uses only pairs that are tight (c_ij = u_i + v_j)
// under an optimal dual (u, v) and leaves no column with v_j < 0 free; so a second assignment over
// the tight pairs, with cost c² and those columns kept in use, keeps Σc at its optimum. Why: a distance cost has many equally short
// assignments (a chain of short hops costs as much as one long jump over the atoms in between), and
// the planner wants the chain, whose moves cross the fewest atoms and sites.
import type { AssignResult, AssignSpec } from './assign-dense'
import { cellMinW, searchRow } from './assign-sparse'
import type { Clock } from './clock'
import { gridOf } from './grid'
import { ssp } from './sparse-ssp'

/** Tight pairs listed per row (the matched one always included). */
const TIGHT_K = 128

export function tieBreak(spec: AssignSpec, res: AssignResult, clock?: Clock): AssignResult {
  const { u, v } = res
  if (!u || !v || !res.exact) return res
  const n = spec.nRows, m = spec.nCols
  for (let i = 0; i < n; i++) if (res.rowMatch[i]! < 0) return res
  const pts: Array<[number, number]> = Array.from({ length: m }, (_, j) => [spec.colXY[2 * j]!, spec.colXY[2 * j + 1]!])
  const grid = gridOf(pts, 2)
  const wb = cellMinW(grid, v)
  const outJ = new Int32Array(TIGHT_K), outR = new Float64Array(TIGHT_K)
  // Columns renumbered in order of first appearance; the matched ones are always listed.
  const colOf = new Int32Array(m).fill(-1), cols: number[] = []
  const idOf = (j: number) => {
    if (colOf[j]! < 0) { colOf[j] = cols.length; cols.push(j) }
    return colOf[j]!
  }
  const ptr = new Int32Array(n + 1)
  const colL: number[] = [], sq: number[] = []
  let maxSq = 0
  for (let i = 0; i < n; i++) {
    if ((i & 255) === 0) clock?.check()
    const own = res.rowMatch[i]!
    const tol = 1e-9 * (1 + Math.abs(u[i]!))
    const f = searchRow(spec, grid, wb, v, i, TIGHT_K, u[i]! + tol, outJ, outR)
    let hasOwn = false
    for (let t = 0; t <= f; t++) {
      const j = t < f ? outJ[t]! : own
      if (t === f && hasOwn) break
      if (j === own) hasOwn = true
      const d = spec.cost(i, j)
      colL.push(idOf(j)); sq.push(d * d)
      if (d * d > maxSq) maxSq = d * d
    }
    ptr[i + 1] = colL.length
  }
  // Complementary slackness also needs every column with v < 0 in use: a reward M larger than any
  // change of Σc² keeps them all (a free column has v = 0 and may trade places with another one).
  const M = 2 * n * maxSq + 1
  const cost = Float64Array.from(sq, (c2, e) => (v[cols[colL[e]!]!]! < 0 ? c2 - M : c2))
  const r = ssp({ n, m: cols.length, ptr, col: Int32Array.from(colL), cost }, clock)
  if (!r.ok) return res
  const rowMatch = new Int32Array(n)
  let total = 0
  for (let i = 0; i < n; i++) { rowMatch[i] = cols[r.rowMatch[i]!]!; total += spec.cost(i, rowMatch[i]!) }
  // Rounding could admit a pair tight only to 1e-9: keep the first solution unless Σc held.
  if (total > res.cost + 1e-7 * (1 + res.cost)) return res
  return { ...res, rowMatch, cost: total }
}
