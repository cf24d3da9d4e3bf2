import { and, desc, eq } from 'drizzle-orm'
import { z } from 'zod'

const Query = z.object({
  sample: z.coerce.number().int().positive().optional(),
  build: z.coerce.number().int().positive().optional(),
  purpose: z.enum(['plan', 'after']).optional(),
})

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const q = parseQuery400(event, Query)
  const db = await useDb()
  const s = schema.scans
  const rows = await db.select().from(s).where(and(
    eq(s.lab_id, access.labId),
    q.sample ? eq(s.sample_id, q.sample) : undefined,
    q.build ? eq(s.build_id, q.build) : undefined,
    q.purpose ? eq(s.purpose, q.purpose) : undefined,
  )).orderBy(desc(s.created_at), desc(s.id))
  return rows.map(publicScan)
})
