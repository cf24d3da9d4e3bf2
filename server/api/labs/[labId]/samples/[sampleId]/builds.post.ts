import { BuildInput } from '#shared/schemas/build'

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'member')
  const sampleId = idParam(event, 'sampleId')
  const body = await readBody400(event, BuildInput)
  const db = await useDb()
  const sample = await sampleInLab(db, access.labId, sampleId)
  const [build] = await db.insert(schema.builds).values({
    lab_id: access.labId, sample_id: sample.id, name: body.name, notes: body.notes ?? '', created_by: access.userId,
  }).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: 'build.create', target: `build:${build!.id}` })
  setResponseStatus(event, 201)
  return build
})
