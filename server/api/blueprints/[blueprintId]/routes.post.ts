import { RouteSolveBody } from '#shared/schemas/route'

// Solves a route for a blueprint on a scan and saves it: atoms are the scan's latest marks,
// sites the blueprint's sites through the scan's latest lattice fit, paths along the fit's drag
// directions. `Accept: text/event-stream` streams progress, then the saved route.
export default defineEventHandler(async (event) => {
  const { db, blueprint, access } = await blueprintForCaller(event, 'member')
  const body = await readBody400(event, RouteSolveBody)
  const plan = await planFromScan(db, blueprint, body.scan_id)
  const { scan_id: _scan, clearance_nm, cost, locked, excluded, keep_out } = body
  return solveAndSave(event, db, {
    labId: access.labId, userId: access.userId, blueprintId: blueprint.id, scanId: plan.scan.id, parentId: null,
    input: { atoms: plan.atoms, sites: plan.sites, lattice: plan.lattice, clearance_nm, cost },
    siteKeys: plan.siteKeys,
    options: { locked, excluded, keep_out },
    saved: { scan_id: plan.scan.id, clearance_nm, cost, locked, excluded, keep_out, marks_version: plan.marksVersion, lattice_fit_id: plan.fit.id, lattice_fit_version: plan.fit.version },
  })
})
