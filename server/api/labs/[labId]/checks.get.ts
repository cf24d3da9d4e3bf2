import { and, desc, eq } from 'drizzle-orm'
import { z } from 'zod'

const Query = z.object({
  build: z.coerce.number().int().positive().optional(),
  run: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(500).default(50),
})

// The lab's as-built checks, newest first (summaries; GET /api/checks/:id for sites and atoms).
export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const q = parseQuery400(event, Query)
  const db = await useDb()
  const c = schema.asBuiltChecks
  return db.select({
    id: c.id, blueprint_id: c.blueprint_id, blueprint_name: schema.blueprints.name, blueprint_version: schema.blueprints.version,
    scan_id: c.scan_id, scan_filename: schema.scans.filename, run_id: c.run_id, tolerance_nm: c.tolerance_nm,
    fidelity: c.fidelity, rms_nm: c.rms_nm, site_count: schema.blueprints.site_count, created_at: c.created_at, created_by: schema.users.name,
  }).from(c)
    .innerJoin(schema.blueprints, eq(schema.blueprints.id, c.blueprint_id))
    .innerJoin(schema.scans, eq(schema.scans.id, c.scan_id))
    .innerJoin(schema.users, eq(schema.users.id, c.created_by))
    .where(and(eq(c.lab_id, access.labId), q.build ? eq(schema.blueprints.build_id, q.build) : undefined, q.run ? eq(c.run_id, q.run) : undefined))
    .orderBy(desc(c.created_at), desc(c.id))
    .limit(q.limit)
})
