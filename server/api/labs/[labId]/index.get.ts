import { eq } from 'drizzle-orm'
import { withLabDefaults } from '#shared/schemas/lab'

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const db = await useDb()
  const lab = await db.query.labs.findFirst({ where: eq(schema.labs.id, access.labId) })
  if (!lab) throw createError({ statusCode: 404, message: 'No such lab' })
  return { id: lab.id, name: lab.name, role: access.role, settings: withLabDefaults(lab.settings), created_at: lab.created_at }
})
