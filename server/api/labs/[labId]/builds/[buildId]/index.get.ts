export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const db = await useDb()
  const build = await buildInLab(db, access.labId, idParam(event, 'buildId'))
  const sample = await sampleInLab(db, access.labId, build.sample_id)
  return { build, sample, role: access.role }
})
