import { and, desc, eq } from 'drizzle-orm'
import { z } from 'zod'
import { withLabDefaults } from '#shared/schemas/lab'
import type { RouteOutput } from '#shared/route'

// Solves and saves a route for a blueprint version: the atoms are the latest marks of a plan
// scan of the build (the newest one unless scan_id names another), the sites are the blueprint's
// sites carried into that scan through its latest lattice fit, the paths follow that lattice,
// and the time estimate uses the lab's instrument settings.
const RoutePlan = z.object({
  scan_id: z.number().int().positive().optional(),
  clearance_nm: z.number().finite().min(0, 'must not be negative').max(100, 'at most 100 nm').optional(),
  cost: z.enum(['distance', 'squared'], { error: 'must be \'distance\' or \'squared\'' }).optional(),
})

export default defineEventHandler(async (event) => {
  const { db, blueprint, access } = await blueprintForCaller(event, 'member')
  const body = await readBody400(event, RoutePlan)
  const scan = body.scan_id
    ? await scanForBlueprint(db, blueprint, body.scan_id)
    : await db.query.scans.findFirst({
        where: and(eq(schema.scans.lab_id, blueprint.lab_id), eq(schema.scans.sample_id, blueprint.sample_id), eq(schema.scans.purpose, 'plan'), blueprint.build_id ? eq(schema.scans.build_id, blueprint.build_id) : undefined),
        orderBy: [desc(schema.scans.created_at), desc(schema.scans.id)],
      })
  if (!scan) throw createError({ statusCode: 400, message: 'scan_id: the build has no plan scan yet', data: { field: 'scan_id' } })
  const fit = await requireFit(db, scan, 'the plan scan')
  const marks = await latestMarks(db, scan.id)
  if (!marks || marks.count === 0) throw createError({ statusCode: 400, message: 'marks: the plan scan has no marks: detect or add the adatoms first', data: { field: 'marks' } })
  const sites = await blueprintSitesOn(blueprint, fit)
  if (!sites.length) throw createError({ statusCode: 400, message: 'blueprint: the blueprint has 0 sites', data: { field: 'blueprint' } })
  const lab = await db.query.labs.findFirst({ where: eq(schema.labs.id, access.labId) })
  const { a1, a2, origin } = fitFrame(fit)
  const input = {
    atoms: marks.marks.map(m => [m.x_nm, m.y_nm] as [number, number]), sites, lattice: { a1, a2, origin },
    ...(body.clearance_nm !== undefined && { clearance_nm: body.clearance_nm }), ...(body.cost && { cost: body.cost }),
    time: withLabDefaults(lab?.settings),
  }
  const result = await runCompute<RouteOutput>({ kind: 'route', input })
  const row = await saveRoute(db, { labId: access.labId, blueprintId: blueprint.id, scanId: scan.id, userId: access.userId, input, result, meta: { source: 'plan', marks_version: marks.version, fit_id: fit.id } })
  await audit(db, { labId: access.labId, userId: access.userId, action: 'route.plan', target: `route:${row.id}`, detail: { blueprint: blueprint.id, scan: scan.id, moves: row.move_count } })
  setResponseStatus(event, 201)
  return row
})
