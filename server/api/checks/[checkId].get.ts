import { eq } from 'drizzle-orm'

// One as-built check with the sites and atoms it compared and the scan frame they are in.
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  const id = idParam(event, 'checkId')
  const db = await useDb()
  const check = await db.query.asBuiltChecks.findFirst({ where: eq(schema.asBuiltChecks.id, id) })
  if (!check) throw createError({ statusCode: 404, message: 'No such check' })
  await requireRowLab(event, check.lab_id, 'viewer', 'check')
  const scan = await db.query.scans.findFirst({ where: eq(schema.scans.id, check.scan_id) })
  return { ...check, scan: scan ? publicScan(scan) : null }
})
