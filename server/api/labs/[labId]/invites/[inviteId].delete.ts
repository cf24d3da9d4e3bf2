import { and, eq, isNull } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'owner')
  const inviteId = idParam(event, 'inviteId')
  const db = await useDb()
  const [revoked] = await db.update(schema.invites).set({ revoked_at: new Date() })
    .where(and(eq(schema.invites.id, inviteId), eq(schema.invites.lab_id, access.labId), isNull(schema.invites.accepted_at))).returning()
  if (!revoked) throw createError({ statusCode: 404, message: 'No such pending invitation' })
  await audit(db, { labId: access.labId, userId: access.userId, action: 'invite.revoke', target: `invite:${inviteId}` })
  return { ok: true }
})
