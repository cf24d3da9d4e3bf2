export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const db = await useDb()
  return sampleInLab(db, access.labId, idParam(event, 'sampleId'))
})
