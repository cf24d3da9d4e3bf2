// Types of the night's record: the moves of a route as the logbook sees them, logbook entries,
// and the state of a build run derived from them (who is where, which move is next).
export type Point = [number, number]

export const OUTCOMES = ['placed', 'stayed', 'off-site', 'lost', 'tip-change', 'skipped'] as const
export type Outcome = typeof OUTCOMES[number]

/** Outcomes that finish a move: the next move becomes the current one. */
export const ADVANCING: ReadonlySet<Outcome> = new Set<Outcome>(['placed', 'off-site', 'lost', 'skipped'])
/** Outcomes after which the rest of the plan no longer matches where the atoms are. */
export const REPLAN_AFTER: ReadonlySet<Outcome> = new Set<Outcome>(['off-site', 'lost', 'skipped'])

export interface RouteMoveSnap { atom: number, site: number, path: Point[], length_nm: number, kind?: string, estimate_s?: number }

/** One saved route as the run derivation needs it. */
export interface RouteSnap {
  id: number
  parent_id: number | null
  /** Positions the solver started from (scan frame, nm), indexed like the moves' `atom`. */
  atoms: Point[]
  /** Run-wide identity of each of those atoms (re-plans drop lost atoms, so indices shift). */
  atom_ids: number[]
  /** Target sites (scan frame, nm), indexed like the moves' `site`. */
  sites: Point[]
  moves: RouteMoveSnap[]
  /** [siteIndex, atomIndex] pairs the solver was told are already satisfied. */
  placed: Array<[number, number]>
  /** The last logbook seq this route's atoms already reflect (0 for the run's first route). */
  base_seq: number
  /** True when the route's atoms replace every position known so far (a newer scan). */
  anchor: boolean
}

export interface EntrySnap {
  id: number
  seq: number
  route_id: number
  move_index: number
  outcome: Outcome
  position: Point | null
  supersedes: number | null
}

export interface AtomNow { atom: number, position: Point | null }

export interface ReplanReason { entry_id: number, seq: number, message: string }

export interface RunState {
  current_route_id: number
  /** Route ids from the run's first route to the current one. */
  chain: number[]
  /** Index into the current route's moves, or null when every move has a finishing outcome. */
  current_move: number | null
  moves_total: number
  /** Moves of the current route with a finishing outcome. */
  done_moves: number[]
  /** Attempts logged per move of the current route (corrections not counted twice). */
  attempts: number[]
  /** Every atom known to the run and where it is now (null: lost). */
  atoms: AtomNow[]
  /** [siteIndex, atomId] of sites an atom was placed on and still holds. */
  placed: Array<[number, number]>
  /** Effective outcome counts over the whole run (superseded entries not counted). */
  counts: Record<Outcome, number>
  entries_total: number
  last_seq: number
  /** entry id → id of the entry that corrected it */
  superseded_by: Record<number, number>
  needs_replan: ReplanReason | null
}
