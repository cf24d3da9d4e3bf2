import { MarksSave } from '#shared/schemas/scan'

export default defineEventHandler(async (event) => {
  const { db, scan, access } = await scanForCaller(event, 'member')
  const body = await readBody400(event, MarksSave)
  const saved = await saveMarkSet(db, { scanId: scan.id, userId: access.userId, marks: body.marks, baseVersion: body.base_version, source: 'edit' })
  await audit(db, { labId: access.labId, userId: access.userId, action: 'marks.save', target: `scan:${scan.id}`, detail: { version: saved.version, count: saved.count } })
  return { version: saved.version, count: saved.count }
})
