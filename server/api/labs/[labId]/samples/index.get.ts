import { and, desc, eq, isNotNull, isNull, sql } from 'drizzle-orm'
import { z } from 'zod'

const Query = z.object({ archived: z.enum(['0', '1', 'all']).default('0') })

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const { archived } = parseQuery400(event, Query)
  const db = await useDb()
  const s = schema.samples
  const filter = archived === 'all' ? undefined : archived === '1' ? isNotNull(s.archived_at) : isNull(s.archived_at)
  return db.select({
    id: s.id, name: s.name, surface: s.surface, adsorbate: s.adsorbate, temperature_K: s.temperature_K,
    notes: s.notes, archived_at: s.archived_at, created_at: s.created_at, updated_at: s.updated_at,
    created_by: schema.users.name,
    builds: sql<number>`(select count(*) from builds b where b.sample_id = ${s.id} and b.archived_at is null)`,
    scans: sql<number>`(select count(*) from scans c where c.sample_id = ${s.id})`,
  }).from(s)
    .innerJoin(schema.users, eq(schema.users.id, s.created_by))
    .where(and(eq(s.lab_id, access.labId), filter))
    .orderBy(desc(s.updated_at))
})
