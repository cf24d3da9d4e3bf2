import { eq, sql } from 'drizzle-orm'
import type { CheckOutput } from '#shared/compare'
import { replanFromState } from '#shared/logbook'
import type { RouteOutput } from '#shared/route'
import type { Db } from './db'
import type { LoadedRun } from './runs'
import type { RouteMeta, RouteSolverInput } from './route-rows'

// Re-planning the rest of a run: from where the logbook says the atoms are (placed atoms keep
// their sites, lost atoms are gone), or from a newer scan of the sample (its marks, through its
// lattice fit). The new route is saved as a child of the current one; the run then follows it,
// unless the logbook or the plan changed meanwhile (then 409 and nothing switches).

type Pt = [number, number]
export interface ReplanBody { scan_id?: number, tolerance_nm?: number, expected_seq?: number }

async function fromScan(db: Db, loaded: LoadedRun, scanId: number, tolerance_nm: number) {
  const current = loaded.routes.get(loaded.run.current_route_id)!
  const blueprint = await db.query.blueprints.findFirst({ where: eq(schema.blueprints.id, current.blueprint_id) })
  if (!blueprint) throw createError({ statusCode: 404, message: 'The blueprint of this run is missing' })
  const scan = await scanForBlueprint(db, blueprint, scanId)
  const fit = await requireFit(db, scan, 'the newer scan')
  const marks = await latestMarks(db, scan.id)
  if (!marks || marks.count === 0) throw createError({ statusCode: 400, message: 'scan_id: the newer scan has no marks: detect the adatoms on it first', data: { field: 'scan_id' } })
  const { sites } = await registeredSitesOn(db, blueprint, scan, fit, current.scan_id)
  const atoms = marks.marks.map(m => [m.x_nm, m.y_nm] as Pt)
  // Sites that already hold an atom within the tolerance stay as they are.
  const check = await runCompute<CheckOutput>({ kind: 'check', input: { sites, found: atoms, tolerance_nm } })
  const { a1, a2, origin } = fitFrame(fit)
  return {
    scanId: scan.id, atoms, atom_ids: atoms.map((_, k) => k), sites, lattice: { a1, a2, origin },
    placed: check.pairs.map(([s, a]) => [s, a] as [number, number]),
    reason: `re-planned from scan ${scan.id} (${scan.filename}): ${check.placed.length} of ${sites.length} sites already filled`,
    meta: { fit_id: fit.id, marks_version: marks.version },
  }
}

export async function replanRun(db: Db, loaded: LoadedRun, userId: number, body: ReplanBody) {
  const { run, state } = loaded
  if (run.state !== 'open') throw createError({ statusCode: 409, message: 'This run is closed: it cannot be re-planned. Start a new run from a route.', data: { field: 'run' } })
  if (body.expected_seq !== undefined && body.expected_seq !== state.last_seq) {
    throw createError({ statusCode: 409, message: 'The logbook has entries you have not seen yet: refresh before re-planning.', data: { field: 'expected_seq', last_seq: state.last_seq } })
  }
  const current = loaded.routes.get(run.current_route_id)!
  const snap = loaded.snaps.get(current.id)!
  const prev = routeInput(current)
  let plan: { scanId: number | null, atoms: Pt[], atom_ids: number[], sites: Pt[], lattice?: RouteSolverInput['lattice'], placed: Array<[number, number]>, reason: string, meta: Partial<RouteMeta> }
  if (body.scan_id !== undefined) {
    plan = await fromScan(db, loaded, body.scan_id, body.tolerance_nm ?? 0.1)
  }
  else {
    const r = replanFromState(state, snap)
    const lost = state.atoms.filter(a => a.position === null).length
    plan = { scanId: current.scan_id, ...r, lattice: prev.lattice, reason: state.needs_replan?.message ?? `re-planned after entry ${state.last_seq}${lost ? ` (${lost} atom${lost === 1 ? '' : 's'} lost)` : ''}`, meta: {} }
  }
  if (!plan.atoms.length) throw createError({ statusCode: 400, message: 'atoms: no atoms are left to move: every atom of the run is lost', data: { field: 'atoms' } })
  const input: RouteSolverInput = {
    atoms: plan.atoms, sites: plan.sites, placed: plan.placed,
    ...(plan.lattice && { lattice: plan.lattice }), ...(prev.clearance_nm !== undefined && { clearance_nm: prev.clearance_nm }),
    ...(prev.cost && { cost: prev.cost }), ...(prev.time && { time: prev.time }),
  }
  const result = await runCompute<RouteOutput>({ kind: 'replan', input })
  const row = await saveRoute(db, {
    labId: run.lab_id, blueprintId: current.blueprint_id, scanId: plan.scanId, parentId: current.id, userId, input, result,
    meta: { ...plan.meta, source: body.scan_id !== undefined ? 'scan' : 'replan', atom_ids: plan.atom_ids, run_id: run.id, base_seq: state.last_seq, reason: plan.reason },
  })
  // Switch only if nobody logged or re-planned since the read this plan is built on.
  const switched = await db.run(sql`UPDATE build_runs SET current_route_id = ${row.id}
    WHERE id = ${run.id} AND state = 'open' AND current_route_id = ${current.id}
      AND (SELECT COALESCE(MAX(seq), 0) FROM logbook_entries WHERE run_id = ${run.id}) = ${state.last_seq}`)
  if (switched.rowsAffected === 0) {
    throw createError({ statusCode: 409, message: `The run changed while re-planning (a new entry or another re-plan). The new plan (route ${row.id}) was kept but not taken; refresh and re-plan again.`, data: { field: 'run', route_id: row.id } })
  }
  await audit(db, { labId: run.lab_id, userId, action: 'run.replan', target: `run:${run.id}`, detail: { from: current.id, to: row.id, source: body.scan_id !== undefined ? 'scan' : 'logbook', moves: row.move_count, base_seq: state.last_seq } })
  return row
}
