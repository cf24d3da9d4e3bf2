import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import type { Role } from '#shared/roles'
import type { RouteSnap } from '#shared/logbook'
import type { RouteOutput } from '#shared/route'
import type { Db } from './db'

// Saved routes. One row holds what the solver was given (`options.input`: atoms and sites in the
// scan frame, lattice, clearance, cost, time settings, placed pairs) and what it returned
// (`result`, the contract output of shared/route), so that a route can be shown, exported, run
// and re-planned without solving again. A re-plan is a new row pointing at its parent.

export type RouteRow = typeof schema.routes.$inferSelect
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

export async function saveRoute(db: Db, o: SaveRouteOptions): Promise<RouteRow> {
  const [row] = await db.insert(schema.routes).values({
    lab_id: o.labId, blueprint_id: o.blueprintId, scan_id: o.scanId, parent_id: o.parentId ?? null,
    options: { ...o.meta, input: o.input },
    result: o.result as unknown as Record<string, unknown>,
    move_count: o.result.moves.length, total_length_nm: o.result.total_length_nm, solver_ms: o.result.solver_ms,
    created_by: o.userId,
  }).returning()
  return row!
}

/** The solver input stored with a route (older rows may keep it at the top level of options). */
export function routeInput(row: RouteRow): RouteSolverInput {
  const o = row.options as { input?: RouteSolverInput } & Partial<RouteSolverInput>
  return o.input ?? { atoms: o.atoms ?? [], sites: o.sites ?? [], lattice: o.lattice, clearance_nm: o.clearance_nm, cost: o.cost, time: o.time, placed: o.placed }
}

export function routeMeta(row: RouteRow): Partial<RouteMeta> {
  return row.options as Partial<RouteMeta>
}

export function routeResult(row: RouteRow): RouteOutput {
  return row.result as unknown as RouteOutput
}

/** The route as the logbook derivation sees it (shared/logbook). */
export function routeSnap(row: RouteRow, runId: number): RouteSnap {
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

/** The route behind :routeId for a caller with at least `role` in its lab (401/404/403). */
export async function routeForCaller(event: H3Event, role: Role) {
  await requireUserId(event)
  const id = idParam(event, 'routeId')
  const db = await useDb()
  const route = await db.query.routes.findFirst({ where: eq(schema.routes.id, id) })
  if (!route) throw createError({ statusCode: 404, message: 'No such route' })
  const access = await requireRowLab(event, route.lab_id, role, 'route')
  return { db, route, access }
}
