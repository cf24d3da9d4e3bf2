import { and, desc, eq } from 'drizzle-orm'
import { z } from 'zod'

const Query = z.object({ version: z.coerce.number().int().positive().optional() })

export default defineEventHandler(async (event) => {
  const { db, scan } = await scanForCaller(event, 'viewer')
  const { version } = parseQuery400(event, Query)
  const row = version
    ? await db.query.markSets.findFirst({ where: and(eq(schema.markSets.scan_id, scan.id), eq(schema.markSets.version, version)) })
    : await latestMarks(db, scan.id)
  if (version && !row) throw createError({ statusCode: 404, message: `No version ${version} of these marks` })
  const versions = await db.select({ version: schema.markSets.version, count: schema.markSets.count, source: schema.markSets.source, created_at: schema.markSets.created_at, author: schema.users.name })
    .from(schema.markSets).innerJoin(schema.users, eq(schema.users.id, schema.markSets.created_by))
    .where(eq(schema.markSets.scan_id, scan.id)).orderBy(desc(schema.markSets.version))
  return { version: row?.version ?? 0, marks: row?.marks ?? [], versions }
})
