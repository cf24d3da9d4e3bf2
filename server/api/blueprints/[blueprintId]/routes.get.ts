import { and, desc, eq, sql } from 'drizzle-orm'

// The saved routes of a blueprint, every version of it, newest first; summaries only (no paths).
export default defineEventHandler(async (event) => {
  const { db, blueprint } = await blueprintForCaller(event, 'viewer')
  const r = schema.routes
  const rows = await db.select({
    id: r.id, blueprint_id: r.blueprint_id, blueprint_version: schema.blueprints.version, scan_id: r.scan_id, parent_id: r.parent_id,
    move_count: r.move_count, total_length_nm: r.total_length_nm, solver_ms: r.solver_ms, created_at: r.created_at, author: schema.users.name,
    lower_bound_nm: sql<number | null>`json_extract(${r.result}, '$.lower_bound_nm')`,
    ratio_to_lower_bound: sql<number | null>`json_extract(${r.result}, '$.ratio_to_lower_bound')`,
    warnings: sql<number>`coalesce(json_array_length(${r.result}, '$.warnings'), 0)`,
    total_s: sql<number | null>`json_extract(${r.result}, '$.time.total_s')`,
    marks_version: sql<number | null>`json_extract(${r.options}, '$.marks_version')`,
    lattice_fit_version: sql<number | null>`json_extract(${r.options}, '$.lattice_fit_version')`,
  }).from(r)
    .innerJoin(schema.blueprints, eq(schema.blueprints.id, r.blueprint_id))
    .leftJoin(schema.users, eq(schema.users.id, r.created_by))
    .where(and(eq(schema.blueprints.lineage, blueprint.lineage), eq(r.lab_id, blueprint.lab_id)))
    .orderBy(desc(r.id))
  return rows
})
