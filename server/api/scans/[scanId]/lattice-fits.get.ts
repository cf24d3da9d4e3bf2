import { desc, eq } from 'drizzle-orm'

// Every saved lattice fit of a scan, newest first, with who saved it.
export default defineEventHandler(async (event) => {
  const { db, scan } = await scanForCaller(event, 'viewer')
  const rows = await db.select({ fit: schema.latticeFits, author: schema.users.name })
    .from(schema.latticeFits).innerJoin(schema.users, eq(schema.users.id, schema.latticeFits.created_by))
    .where(eq(schema.latticeFits.scan_id, scan.id)).orderBy(desc(schema.latticeFits.version))
  return rows.map(r => ({ ...r.fit, author: r.author }))
})
