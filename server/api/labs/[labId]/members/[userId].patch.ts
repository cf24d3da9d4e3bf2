import { and, eq } from 'drizzle-orm'
import { RoleChangeInput } from '#shared/schemas/account'

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'owner')
  const userId = idParam(event, 'userId')
  const { role } = await readBody400(event, RoleChangeInput)
  const db = await useDb()
  if (role !== 'owner') await assertNotLastOwner(db, access.labId, userId, 'step down')
  const [updated] = await db.update(schema.memberships).set({ role })
    .where(and(eq(schema.memberships.lab_id, access.labId), eq(schema.memberships.user_id, userId))).returning()
  if (!updated) throw createError({ statusCode: 404, message: 'No such member' })
  await audit(db, { labId: access.labId, userId: access.userId, action: 'member.role', target: `user:${userId}`, detail: { role } })
  return { user_id: userId, role: updated.role }
})
