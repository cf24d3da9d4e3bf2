import { eq } from 'drizzle-orm'

// The invite link is a bearer secret: whoever holds it may see which lab it is for, so that the
// page can say so before they sign in or register.
export default defineEventHandler(async (event) => {
  const db = await useDb()
  const invite = await usableInvite(db, getRouterParam(event, 'token') ?? '')
  const lab = await db.query.labs.findFirst({ where: eq(schema.labs.id, invite.lab_id) })
  const inviter = await db.query.users.findFirst({ where: eq(schema.users.id, invite.invited_by) })
  return { lab: { id: invite.lab_id, name: lab?.name ?? '' }, role: invite.role, email: invite.email, invited_by: inviter?.name ?? '', expires_at: invite.expires_at }
})
