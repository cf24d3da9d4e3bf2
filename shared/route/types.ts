// Types of the route solver: optimal atom-to-site assignment plus an ordered, clearance-keeping
// move list (POST /api/compute/route). Plain arrays only, so that a route crosses a
// worker thread or an HTTP body unchanged.

export type Point = [number, number]

export interface LatticeFrame {
  a1: Point
  a2: Point
  origin: Point
}

export type CostKind = 'distance' | 'squared'

export interface TimeSettings {
  /** Lateral drag speed of the tip, nm/s. */
  tip_speed_nm_s: number
  /** Approach to the manipulation setpoint, retract, settle: seconds per move. */
  overhead_s_per_move: number
  /** A check scan after every k moves (0: none). */
  check_every_moves: number
  check_scan_s: number
}

/** The HTTP body of POST /api/compute/route (contract fields plus optional extras): see schema.ts. */
export type { RouteInput } from './schema'

export type AssignmentMode = 'auto' | 'dense' | 'sparse'

export interface RouteOptions {
  /** Atoms that never move: on a site (within 0.05 nm) they fill it, elsewhere they are obstacles. */
  locked?: number[]
  /** Atoms not to be used; they still are obstacles. */
  excluded?: number[]
  /** Polygons no path may enter. */
  keep_out?: Point[][]
  /** Pairs [siteIndex, atomIndex] known to be satisfied (re-plan): the atom is locked on the site. */
  placed?: Array<[number, number]>
  onProgress?: (fraction: number, stage: string) => void
  /** Abort with a RouteDeadlineError once the solve has run this long. */
  deadline_ms?: number
  time?: Partial<TimeSettings>
  /** 'dense' forces munkres, 'sparse' the candidate-graph solver; 'auto' picks by size. */
  assignment?: AssignmentMode
  /** Candidates per atom and per site for the sparse solver (default 12). */
  sparse_k?: number
}

export type MoveKind = 'direct' | 'detour' | 'parking' | 'final-from-parking'

export interface Move {
  atom: number
  /** Target site; for a parking move the site the atom will finally go to. */
  site: number
  path: Point[]
  length_nm: number
  kind: MoveKind
  segments: number
  estimate_s: number
  /** How the planner reached it: in precedence order, retried, breaking a cycle, parking, or forced. */
  phase: 'ready' | 'retry' | 'cycle' | 'park' | 'forced'
}

export interface RouteWarning {
  kind: 'clearance' | 'keep-out' | 'unreachable'
  /** Index into `moves` (-1 for a site no move can reach). */
  move: number
  /** The moved atom (-1 for an unreachable site). */
  atom: number
  site?: number
  /** The atom the path comes close to (clearance warnings). */
  near_atom?: number
  closest_nm?: number
  required_nm?: number
  message: string
}

export interface TimeEstimate {
  total_s: number
  drag_s: number
  overhead_s: number
  scans: number
  scan_s: number
  per_move_s: number[]
}

export interface RouteOutput {
  assignment: Array<[number, number]>
  moves: Move[]
  total_length_nm: number
  lower_bound_nm: number
  lower_bound_exact: boolean
  unfilled_sites: number[]
  solver_ms: number
  parking_moves: number
  detours: number
  warnings: RouteWarning[]
  /** Whether the assignment is the exact optimum of the cost used. */
  exact: boolean
  /** total_length_nm / lower_bound_nm (null when the bound is 0 and the route is not empty). */
  ratio_to_lower_bound: number | null
  /** Sum of the assignment's cost in the objective used (nm, or nm² for 'squared'). */
  assignment_cost: number
  assignment_method: 'dense' | 'sparse' | 'none'
  directions: Point[]
  time: TimeEstimate
}
