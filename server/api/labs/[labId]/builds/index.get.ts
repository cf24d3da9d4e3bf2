import { and, desc, eq, isNull, sql } from 'drizzle-orm'
import { z } from 'zod'

const Query = z.object({ sample: z.coerce.number().int().positive().optional() })

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const { sample } = parseQuery400(event, Query)
  const db = await useDb()
  const b = schema.builds
  return db.select({
    id: b.id, name: b.name, notes: b.notes, created_at: b.created_at,
    sample_id: b.sample_id, sample_name: schema.samples.name, surface: schema.samples.surface,
    created_by: schema.users.name,
    runs: sql<number>`(select count(*) from build_runs r where r.build_id = ${b.id})`,
    open_runs: sql<number>`(select count(*) from build_runs r where r.build_id = ${b.id} and r.state = 'open')`,
    fidelity: sql<number | null>`(select c.fidelity from as_built_checks c join blueprints p on p.id = c.blueprint_id where p.build_id = ${b.id} order by c.id desc limit 1)`,
  }).from(b)
    .innerJoin(schema.samples, eq(schema.samples.id, b.sample_id))
    .innerJoin(schema.users, eq(schema.users.id, b.created_by))
    .where(and(eq(b.lab_id, access.labId), isNull(b.archived_at), sample ? eq(b.sample_id, sample) : undefined))
    .orderBy(desc(b.created_at))
})
