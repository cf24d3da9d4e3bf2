import { and, eq } from 'drizzle-orm'

// Owners remove members; anyone may leave a lab themselves — except its last owner.
export default defineEventHandler(async (event) => {
  const labId = idParam(event, 'labId')
  const userId = idParam(event, 'userId')
  const me = await requireUserId(event)
  const access = await requireLabRole(event, labId, me === userId ? 'viewer' : 'owner')
  const db = await useDb()
  await assertNotLastOwner(db, labId, userId, me === userId ? 'leave the lab' : 'be removed')
  const [removed] = await db.delete(schema.memberships)
    .where(and(eq(schema.memberships.lab_id, labId), eq(schema.memberships.user_id, userId))).returning()
  if (!removed) throw createError({ statusCode: 404, message: 'No such member' })
  await audit(db, { labId, userId: access.userId, action: me === userId ? 'member.leave' : 'member.remove', target: `user:${userId}` })
  return { ok: true }
})
