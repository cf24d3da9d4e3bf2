import type { RouteSnap } from '#shared/logbook'
import type { RouteOutput } from '#shared/route'
import type { Db } from './db'
import type { RouteDbRow } from './routes'

// Saved routes. One row holds what the solver was given (`options.input`: atoms and sites in the
// scan frame, lattice, clearance, cost, time settings, placed pairs) and what it returned
// (`result`, the contract output of shared/route), so that a route can be shown, exported, run
// and re-planned without solving again. A re-plan is a new row pointing at its parent.

type Pt = [number, number]

export interface RouteSolverInput {
  atoms: Pt[]
  sites: Pt[]
  lattice?: { a1: Pt, a2: Pt, origin: Pt }
  clearance_nm?: number
  cost?: 'distance' | 'squared'
  time?: Record<string, number>
  placed?: Array<[number, number]>
}

export interface RouteMeta {
  /** 'plan': solved from a scan's marks; 'replan': from a run's logbook; 'scan': from a newer scan mid-run. */
  source: 'plan' | 'replan' | 'scan'
  /** Run-wide identity of each atom (default: its index). */
  atom_ids?: number[]
  run_id?: number
  /** Last logbook seq the atoms reflect (re-plans). */
  base_seq?: number
  reason?: string
  marks_version?: number
  fit_id?: number
}

export interface SaveRouteOptions {
  labId: number
  blueprintId: number
  scanId: number | null
  parentId?: number | null
  userId: number
  input: RouteSolverInput
  result: RouteOutput
  meta: RouteMeta
}

export async function saveRoute(db: Db, o: SaveRouteOptions): Promise<RouteDbRow> {
  const [row] = await db.insert(schema.routes).values({
    lab_id: o.labId, blueprint_id: o.blueprintId, scan_id: o.scanId, parent_id: o.parentId ?? null,
    options: { ...o.meta, input: o.input },
    // Positions beside the result too, as the route step saves them, so both kinds of row read alike.
    result: { ...o.result, atoms: o.input.atoms, sites: o.input.sites, lattice: o.input.lattice } as unknown as Record<string, unknown>,
    move_count: o.result.moves.length, total_length_nm: o.result.total_length_nm, solver_ms: o.result.solver_ms,
    created_by: o.userId,
  }).returning()
  return row!
}

/**
 * The solver input stored with a route. Rows saved by the logbook keep it in `options.input`;
 * rows solved in the route step keep the positions beside the result (`result.atoms`,
 * `result.sites`, `result.lattice`) and the settings in `options`.
 */
export function routeInput(row: RouteDbRow): RouteSolverInput {
  const o = row.options as { input?: RouteSolverInput, replan?: { placed?: Array<[number, number]> } } & Partial<RouteSolverInput>
  if (o.input) return o.input
  const r = row.result as Partial<Pick<RouteSolverInput, 'atoms' | 'sites' | 'lattice'>>
  return {
    atoms: r.atoms ?? o.atoms ?? [], sites: r.sites ?? o.sites ?? [], lattice: r.lattice ?? o.lattice,
    clearance_nm: o.clearance_nm, cost: o.cost, time: o.time, placed: o.placed ?? o.replan?.placed,
  }
}

export function routeMeta(row: RouteDbRow): Partial<RouteMeta> {
  return row.options as Partial<RouteMeta>
}

export function routeResult(row: RouteDbRow): RouteOutput {
  return row.result as unknown as RouteOutput
}

/** The route as the logbook derivation sees it (shared/logbook). */
export function routeSnap(row: RouteDbRow, runId: number): RouteSnap {
  const input = routeInput(row)
  const meta = routeMeta(row)
  const ownRun = meta.run_id === runId
  return {
    id: row.id,
    parent_id: row.parent_id,
    atoms: input.atoms,
    atom_ids: meta.atom_ids ?? input.atoms.map((_, k) => k),
    sites: input.sites,
    moves: routeResult(row).moves ?? [],
    placed: input.placed ?? [],
    base_seq: ownRun ? meta.base_seq ?? 0 : 0,
    anchor: ownRun && meta.source === 'scan',
  }
}
