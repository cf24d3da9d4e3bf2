import { and, eq } from 'drizzle-orm'
import type { CheckOutput } from '#shared/compare'
import { CheckRequest } from '#shared/logbook'

// As-built check: the after-scan's latest marks against the blueprint's sites, carried into that
// scan's frame through its latest lattice fit and registered to the scan the route was planned on
// (the drift between the scans), by one-to-one matching within the tolerance (shared/compare). Saved with the sites and atoms it compared, so the overlay can be redrawn.
export default defineEventHandler(async (event) => {
  const { db, blueprint, access } = await blueprintForCaller(event, 'member')
  const body = await readBody400(event, CheckRequest)
  const scan = await scanForBlueprint(db, blueprint, body.scan_id)
  let reference: number | null = null
  if (body.run_id !== undefined) {
    const run = await db.query.buildRuns.findFirst({ where: and(eq(schema.buildRuns.id, body.run_id), eq(schema.buildRuns.lab_id, access.labId)) })
    if (!run) throw createError({ statusCode: 404, message: 'run_id: no such run in this lab', data: { field: 'run_id' } })
    reference = (await db.query.routes.findFirst({ where: eq(schema.routes.id, run.route_id) }))?.scan_id ?? null
  }
  reference ??= await planningScanOf(db, blueprint)
  const fit = await requireFit(db, scan, 'the after-scan')
  const { sites, registration } = await registeredSitesOn(db, blueprint, scan, fit, reference)
  if (!sites.length) throw createError({ statusCode: 400, message: 'blueprint: the blueprint has 0 sites: there is nothing to check against', data: { field: 'blueprint' } })
  const marks = await latestMarks(db, scan.id)
  const found = (marks?.marks ?? []).map(m => [m.x_nm, m.y_nm] as [number, number])
  const result = await runCompute<CheckOutput>({ kind: 'check', input: { sites, found, ...(body.tolerance_nm !== undefined && { tolerance_nm: body.tolerance_nm }), ...(body.near_nm !== undefined && { near_nm: body.near_nm }) } })
  const [row] = await db.insert(schema.asBuiltChecks).values({
    lab_id: access.labId, blueprint_id: blueprint.id, scan_id: scan.id, run_id: body.run_id ?? null,
    tolerance_nm: result.tolerance_nm, fidelity: result.fidelity, rms_nm: result.rms_nm,
    result: { ...result, sites, found, fit_id: fit.id, marks_version: marks?.version ?? 0, registration },
    created_by: access.userId,
  }).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: 'check.run', target: `check:${row!.id}`, detail: { blueprint: blueprint.id, scan: scan.id, run: body.run_id ?? null, fidelity: result.fidelity } })
  setResponseStatus(event, 201)
  return row
})
