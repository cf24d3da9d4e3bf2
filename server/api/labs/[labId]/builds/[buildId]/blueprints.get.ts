// The blueprints of a build (latest version of each).
export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const db = await useDb()
  const build = await buildInLab(db, access.labId, idParam(event, 'buildId'))
  return buildBlueprints(db, access.labId, build.id)
})
