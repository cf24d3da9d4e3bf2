import { and, eq, isNull } from 'drizzle-orm'
import { roleAllows } from '#shared/roles'

export default defineEventHandler(async (event) => {
  const userId = await requireUserId(event)
  const db = await useDb()
  const invite = await usableInvite(db, getRouterParam(event, 'token') ?? '')
  const result = await db.transaction(async (tx) => {
    // Claim the invitation first, so a double click or a second tab cannot use it twice.
    const [claimed] = await tx.update(schema.invites).set({ accepted_at: new Date(), accepted_by: userId })
      .where(and(eq(schema.invites.id, invite.id), isNull(schema.invites.accepted_at))).returning()
    if (!claimed) throw createError({ statusCode: 400, message: 'This invitation has already been used.', data: { field: 'token', reason: 'used' } })
    const member = await tx.query.memberships.findFirst({
      where: and(eq(schema.memberships.lab_id, invite.lab_id), eq(schema.memberships.user_id, userId)),
    })
    // An existing member keeps the higher of the two roles.
    if (member) {
      if (roleAllows(member.role, invite.role)) return { role: member.role, joined: false }
      await tx.update(schema.memberships).set({ role: invite.role }).where(eq(schema.memberships.id, member.id))
      return { role: invite.role, joined: false }
    }
    await tx.insert(schema.memberships).values({ lab_id: invite.lab_id, user_id: userId, role: invite.role })
    return { role: invite.role, joined: true }
  })
  await audit(db, { labId: invite.lab_id, userId, action: 'invite.accept', target: `invite:${invite.id}`, detail: { invited: invite.email } })
  return { lab_id: invite.lab_id, ...result }
})
