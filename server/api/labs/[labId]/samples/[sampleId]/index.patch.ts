import { eq } from 'drizzle-orm'
import { SamplePatch } from '#shared/schemas/account'

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'member')
  const sampleId = idParam(event, 'sampleId')
  const body = await readBody400(event, SamplePatch)
  const db = await useDb()
  const sample = await sampleInLab(db, access.labId, sampleId)
  const { archived, ...fields } = body
  const [updated] = await db.update(schema.samples).set({
    ...fields,
    archived_at: archived === undefined ? sample.archived_at : archived ? new Date() : null,
    updated_at: new Date(),
  }).where(eq(schema.samples.id, sample.id)).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: archived ? 'sample.archive' : 'sample.update', target: `sample:${sample.id}`, detail: { before: sample, change: body } })
  return updated
})
