import { and, desc, eq, isNull } from 'drizzle-orm'
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
  }).from(b)
    .innerJoin(schema.samples, eq(schema.samples.id, b.sample_id))
    .innerJoin(schema.users, eq(schema.users.id, b.created_by))
    .where(and(eq(b.lab_id, access.labId), isNull(b.archived_at), sample ? eq(b.sample_id, sample) : undefined))
    .orderBy(desc(b.created_at))
})
