// Saved routes as the API returns them (dates arrive as ISO strings). `result` is the solver's
// output (shared/route RouteOutput) plus the positions it was solved from.
import type { RouteOutput, Point, TimeSettings } from '../route/types'

export interface RouteOptionsSaved {
  scan_id: number | null
  clearance_nm?: number
  cost?: 'distance' | 'squared'
  locked?: number[]
  excluded?: number[]
  keep_out?: Point[][]
  /** Version of the scan's marks the atoms came from (null: positions given by the caller). */
  marks_version: number | null
  lattice_fit_id: number | null
  lattice_fit_version: number | null
  /** Instrument settings of the lab the time estimate used. */
  time: TimeSettings
  time_limit_ms: number
  /** Re-plans only: the pairs kept on their sites and where the atoms came from. */
  replan?: { placed: Array<[number, number]>, atoms_from: 'body' | 'scan' }
}

export interface RouteResultSaved extends RouteOutput {
  /** The atoms (scan frame, nm) in the order the move and assignment indices refer to. */
  atoms: Point[]
  /** The blueprint's sites in the scan frame (nm), and their lattice indices (i, j, b). */
  sites: Point[]
  site_keys: Array<[number, number, number]>
  lattice: { a1: Point, a2: Point, origin: Point } | null
  timings: { solver_ms: number, wall_ms: number }
}

export interface RouteRow {
  id: number
  lab_id: number
  blueprint_id: number
  scan_id: number | null
  parent_id: number | null
  options: RouteOptionsSaved
  result: RouteResultSaved
  move_count: number
  total_length_nm: number
  solver_ms: number
  created_by: number
  created_at: string
  author: string | null
  blueprint: { id: number, lineage: number, version: number, name: string }
  /** From the lab's logged success rates on this sample; figures null until enough moves exist. */
  forecast?: { enough: boolean, based_on_attempts: number, moves: number, expected_placed: number | null, planned_s: number, expected_s: number | null }
}

/** One line of GET /api/blueprints/:id/routes (no paths: open the route for those). */
export interface RouteSummary {
  id: number
  blueprint_id: number
  blueprint_version: number
  scan_id: number | null
  parent_id: number | null
  move_count: number
  total_length_nm: number
  lower_bound_nm: number | null
  ratio_to_lower_bound: number | null
  warnings: number
  total_s: number | null
  solver_ms: number
  marks_version: number | null
  lattice_fit_version: number | null
  created_at: string
  author: string | null
}
