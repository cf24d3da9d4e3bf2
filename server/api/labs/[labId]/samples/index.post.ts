import { SampleInput } from '#shared/schemas/account'

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'member')
  const body = await readBody400(event, SampleInput)
  const db = await useDb()
  const [sample] = await db.insert(schema.samples).values({
    lab_id: access.labId, name: body.name, surface: body.surface, adsorbate: body.adsorbate,
    temperature_K: body.temperature_K, notes: body.notes ?? '', created_by: access.userId,
  }).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: 'sample.create', target: `sample:${sample!.id}` })
  setResponseStatus(event, 201)
  return sample
})
