import { eq } from 'drizzle-orm'
import { RouteReplanBody } from '#shared/schemas/route'
import type { Point } from '#shared/route/types'
import type { RouteOptionsSaved, RouteResultSaved } from '#shared/types/route'

// Re-plans a route from where the atoms are now, keeping the placed atoms on their sites, and
// saves the result as a new route pointing back at this one (parent_id). Atoms come from the body
// (same scan frame as this route) or from a newer scan's latest marks, whose lattice fit then
// maps the blueprint's sites again. The solver options of this route carry over unless given.
export default defineEventHandler(async (event) => {
  const { db, route, access } = await routeForCaller(event, 'member')
  const body = await readBody400(event, RouteReplanBody)
  const blueprint = await db.query.blueprints.findFirst({ where: eq(schema.blueprints.id, route.blueprint_id) })
  if (!blueprint) throw createError({ statusCode: 404, message: 'No such blueprint' })
  const prev = route.options as unknown as RouteOptionsSaved
  const prevResult = route.result as unknown as RouteResultSaved
  const clearance_nm = body.clearance_nm ?? prev.clearance_nm
  const cost = body.cost ?? prev.cost
  const keep_out = body.keep_out ?? prev.keep_out
  // Atom indices of the old route mean nothing for new positions: locks and exclusions start afresh.
  const { locked, excluded, placed } = body

  let atoms: Point[], sites: Point[], siteKeys = prevResult.site_keys, lattice = prevResult.lattice
  let scanId = route.scan_id, marksVersion: number | null = null, fit = { id: prev.lattice_fit_id, version: prev.lattice_fit_version }
  if (body.scan_id !== undefined) {
    const plan = await planFromScan(db, blueprint, body.scan_id, route.scan_id)
    ;({ atoms, sites, siteKeys, lattice } = plan)
    scanId = plan.scan.id
    marksVersion = plan.marksVersion
    fit = plan.fit
  }
  else {
    atoms = body.atoms as Point[]
    sites = prevResult.sites
  }
  return solveAndSave(event, db, {
    labId: access.labId, userId: access.userId, blueprintId: blueprint.id, scanId, parentId: route.id,
    input: { atoms, sites, lattice, clearance_nm, cost },
    siteKeys,
    options: { locked, excluded, keep_out, placed },
    saved: {
      scan_id: scanId, clearance_nm, cost, locked, excluded, keep_out, marks_version: marksVersion,
      lattice_fit_id: fit.id, lattice_fit_version: fit.version,
      replan: { placed, atoms_from: body.scan_id !== undefined ? 'scan' : 'body' },
    },
  })
})
