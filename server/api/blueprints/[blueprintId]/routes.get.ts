import { and, desc, eq, isNull } from 'drizzle-orm'

// The routes solved for a blueprint version, newest first (re-plans of runs are not listed: they
// belong to their run). Results are left out; GET a run or a route for the moves.
export default defineEventHandler(async (event) => {
  const { db, blueprint } = await blueprintForCaller(event, 'viewer')
  const r = schema.routes
  return db.select({
    id: r.id, blueprint_id: r.blueprint_id, scan_id: r.scan_id, move_count: r.move_count, total_length_nm: r.total_length_nm,
    solver_ms: r.solver_ms, created_at: r.created_at, created_by: schema.users.name,
  }).from(r).innerJoin(schema.users, eq(schema.users.id, r.created_by))
    .where(and(eq(r.blueprint_id, blueprint.id), isNull(r.parent_id)))
    .orderBy(desc(r.created_at), desc(r.id))
})
