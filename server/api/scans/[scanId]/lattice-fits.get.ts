import { desc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { db, scan } = await scanForCaller(event, 'viewer')
  return db.query.latticeFits.findMany({ where: eq(schema.latticeFits.scan_id, scan.id), orderBy: desc(schema.latticeFits.version) })
})
