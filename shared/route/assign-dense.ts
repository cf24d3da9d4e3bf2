// Exact rectangular linear assignment (Kuhn–Munkres / Hungarian method) with the `munkres`
// package on a dense Float64Array cost matrix, the smaller side as rows.
import { munkres } from 'munkres'
import type { Clock } from './clock'

export interface AssignSpec {
  /** Rows are the smaller side (nRows ≤ nCols). */
  nRows: number
  nCols: number
  rowXY: Float64Array
  colXY: Float64Array
  cost: (r: number, c: number) => number
  /** A lower bound of cost(r, c) from the Euclidean distance d of the pair alone. */
  costFromEuclid: (d: number) => number
}

export interface AssignResult {
  /** Column of each row, -1 where a row is left unmatched. */
  rowMatch: Int32Array
  cost: number
  /** A valid lower bound of the optimal cost (equal to `cost` when exact). */
  bound: number
  exact: boolean
  method: 'dense' | 'sparse'
  /** Row and column duals certifying the result (sparse solver only). */
  u?: Float64Array
  v?: Float64Array
}

/**
 * Dense solve. Measured (issue brief): munkres with the smaller side as rows runs at ≈2.4× SciPy's
 * C++ solver, with the larger side as rows ≈9×, hence rows ≤ cols here.
 */
export function denseAssign(spec: AssignSpec, clock?: Clock): AssignResult {
  const { nRows, nCols } = spec
  const rowMatch = new Int32Array(nRows).fill(-1)
  if (nRows === 0 || nCols === 0) return { rowMatch, cost: 0, bound: 0, exact: true, method: 'dense' }
  const buf = new Float64Array(nRows * nCols)
  const rows: Float64Array[] = new Array(nRows)
  for (let r = 0; r < nRows; r++) {
    const off = r * nCols
    for (let c = 0; c < nCols; c++) buf[off + c] = spec.cost(r, c)
    rows[r] = buf.subarray(off, off + nCols)
    if ((r & 63) === 0) clock?.check()
  }
  let total = 0
  for (const [r, c] of munkres(rows)) {
    const v = buf[r * nCols + c]!
    if (!Number.isFinite(v)) continue
    rowMatch[r] = c
    total += v
  }
  return { rowMatch, cost: total, bound: total, exact: true, method: 'dense' }
}
