import { eq } from 'drizzle-orm'
import { RunStart } from '#shared/logbook'

// Starts a build run from a saved route: who (the caller), when (now), the instrument notes and
// the manipulation parameters in use. The run follows this route until its first re-plan.
export default defineEventHandler(async (event) => {
  const { db, route, access } = await routeForCaller(event, 'member')
  const body = await readBody400(event, RunStart)
  const blueprint = await db.query.blueprints.findFirst({ where: eq(schema.blueprints.id, route.blueprint_id) })
  if (!blueprint || blueprint.lab_id !== access.labId) throw createError({ statusCode: 404, message: 'No such route' })
  if (route.move_count === 0) throw createError({ statusCode: 400, message: 'route: this route has no moves: every site is already filled', data: { field: 'route' } })
  const [run] = await db.insert(schema.buildRuns).values({
    lab_id: access.labId, build_id: blueprint.build_id, route_id: route.id, current_route_id: route.id,
    params: body.params ?? {}, notes: body.notes ?? '', started_by: access.userId,
  }).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: 'run.start', target: `run:${run!.id}`, detail: { route: route.id, params: body.params ?? {} } })
  setResponseStatus(event, 201)
  return run
})
