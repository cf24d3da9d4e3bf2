// Optimal atom-to-site assignment in the path metric (linear assignment problem, rectangular),
// and the lower bound of the route length: the optimal assignment sum of shortest path lengths.
import { denseAssign, type AssignResult, type AssignSpec } from './assign-dense'
import { sparseAssign } from './assign-sparse'
import { tieBreak } from './assign-tiebreak'
import type { Clock } from './clock'
import { segmentEntersZone, type Zone } from './geometry'
import type { Metric } from './metric'
import type { AssignmentMode, CostKind, Point } from './types'

/**
 * Above this many matrix entries the sparse solver takes over. Measured (route bench, 2 cores):
 * munkres 1000 × 1000 354 ms vs sparse 100 ms, 2000 × 2000 2.6 s vs 0.23 s; at 300 × 300 munkres
 * is faster (10 vs 47 ms), but only the sparse solver yields the duals the tie-break needs.
 */
export const DENSE_MAX_ENTRIES = 256 * 256

export interface AssignInput {
  atoms: Point[]
  sites: Point[]
  /** Atoms and sites (original indices) taking part. */
  atomIds: number[]
  siteIds: number[]
  metric: Metric
  cost: CostKind
  zones: Zone[]
  mode: AssignmentMode
  sparseK?: number
}

export interface AssignOutput {
  /** [atomIndex, siteIndex] pairs in original indices. */
  pairs: Array<[number, number]>
  cost: number
  exact: boolean
  lowerBound: number
  lowerBoundExact: boolean
  method: 'dense' | 'sparse' | 'none'
}

/**
 * Metric length with a keep-out surcharge: when both shortest paths enter a keep-out polygon the
 * pair still may be used, by a detour, so it costs the metric length plus half of each entered
 * polygon's perimeter (going round it). The lower bound never includes the surcharge.
 */
export function pairLength(metric: Metric, zones: Zone[], px: number, py: number, sx: number, sy: number): number {
  const d = metric.norm(sx - px, sy - py)
  if (zones.length === 0) return d
  let extra = Infinity
  for (const path of metric.directPaths(px, py, sx, sy)) {
    let e = 0
    for (const z of zones) {
      for (let i = 1; i < path.length; i++) {
        if (segmentEntersZone(z, path[i - 1]![0], path[i - 1]![1], path[i]![0], path[i]![1])) { e += z.perimeter_nm / 2; break }
      }
    }
    extra = Math.min(extra, e)
  }
  return d + extra
}

export function solveAssignment(inp: AssignInput, clock?: Clock): AssignOutput {
  const nA = inp.atomIds.length, nS = inp.siteIds.length
  if (nA === 0 || nS === 0) return { pairs: [], cost: 0, exact: true, lowerBound: 0, lowerBoundExact: true, method: 'none' }
  // Rows are the smaller side (munkres is ≈4× faster that way, and the sparse solver needs it).
  const sitesAreRows = nS <= nA
  const rowIds = sitesAreRows ? inp.siteIds : inp.atomIds
  const colIds = sitesAreRows ? inp.atomIds : inp.siteIds
  const rowPts = sitesAreRows ? inp.sites : inp.atoms
  const colPts = sitesAreRows ? inp.atoms : inp.sites
  const rowXY = new Float64Array(2 * rowIds.length), colXY = new Float64Array(2 * colIds.length)
  rowIds.forEach((id, r) => { rowXY[2 * r] = rowPts[id]![0]; rowXY[2 * r + 1] = rowPts[id]![1] })
  colIds.forEach((id, c) => { colXY[2 * c] = colPts[id]![0]; colXY[2 * c + 1] = colPts[id]![1] })
  const { metric, zones } = inp
  // Paths run atom → site; the metric is symmetric only for straight lines, so orient explicitly.
  const length = sitesAreRows
    ? (r: number, c: number) => pairLength(metric, zones, colXY[2 * c]!, colXY[2 * c + 1]!, rowXY[2 * r]!, rowXY[2 * r + 1]!)
    : (r: number, c: number) => pairLength(metric, zones, rowXY[2 * r]!, rowXY[2 * r + 1]!, colXY[2 * c]!, colXY[2 * c + 1]!)
  const plain = sitesAreRows
    ? (r: number, c: number) => metric.norm(rowXY[2 * r]! - colXY[2 * c]!, rowXY[2 * r + 1]! - colXY[2 * c + 1]!)
    : (r: number, c: number) => metric.norm(colXY[2 * c]! - rowXY[2 * r]!, colXY[2 * c + 1]! - rowXY[2 * r + 1]!)
  const squared = inp.cost === 'squared'
  const base = { nRows: rowIds.length, nCols: colIds.length, rowXY, colXY }
  const objective: AssignSpec = {
    ...base,
    cost: squared ? (r, c) => { const d = length(r, c); return d * d } : length,
    // The lattice norm is never shorter than the straight line, so d bounds every cost from below.
    costFromEuclid: squared ? d => d * d : d => d,
  }
  const dense = inp.mode === 'dense' || (inp.mode !== 'sparse' && base.nRows * base.nCols <= DENSE_MAX_ENTRIES)
  const run = (spec: AssignSpec): AssignResult => dense ? denseAssign(spec, clock) : sparseAssign(spec, clock, { k: inp.sparseK })
  let res = run(objective)
  // Of the equally short assignments, take the one of shortest hops (see assign-tiebreak.ts).
  if (!dense) res = tieBreak(objective, res, clock)
  let lowerBound = res.bound, lowerBoundExact = res.exact
  if (squared || zones.length > 0) {
    // The bound is on path length, so solve the plain-length problem as well.
    const lb = run({ ...base, cost: plain, costFromEuclid: d => d })
    lowerBound = lb.bound
    lowerBoundExact = lb.exact
  }
  const pairs: Array<[number, number]> = []
  for (let r = 0; r < base.nRows; r++) {
    const c = res.rowMatch[r]!
    if (c < 0) continue
    pairs.push(sitesAreRows ? [colIds[c]!, rowIds[r]!] : [rowIds[r]!, colIds[c]!])
  }
  return { pairs, cost: res.cost, exact: res.exact, lowerBound, lowerBoundExact, method: res.method }
}
