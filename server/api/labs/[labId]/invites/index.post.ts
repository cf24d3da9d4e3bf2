import { and, eq } from 'drizzle-orm'
import { InviteInput } from '#shared/schemas/account'

const INVITE_VALID_MS = 7 * 24 * 60 * 60 * 1000

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'owner')
  const body = await readBody400(event, InviteInput)
  const db = await useDb()
  const lab = await db.query.labs.findFirst({ where: eq(schema.labs.id, access.labId) })
  const inviter = await db.query.users.findFirst({ where: eq(schema.users.id, access.userId) })
  if (!lab || !inviter) throw createError({ statusCode: 404, message: 'No such lab' })
  const existing = await findUserByEmail(db, body.email)
  if (existing) {
    const member = await db.query.memberships.findFirst({
      where: and(eq(schema.memberships.lab_id, lab.id), eq(schema.memberships.user_id, existing.id)),
    })
    if (member) throw createError({ statusCode: 409, message: `${body.email} is already a member of ${lab.name}.`, data: { field: 'email' } })
  }
  const { token, hash } = newToken()
  const [invite] = await db.insert(schema.invites).values({
    lab_id: lab.id, email: body.email, role: body.role, token_hash: hash,
    invited_by: inviter.id, expires_at: new Date(Date.now() + INVITE_VALID_MS),
  }).returning()
  const link = `${baseUrl(event)}/invite/${token}`
  await sendMail({
    to: body.email,
    subject: `${inviter.name} invites you to ${lab.name} on Tessera`,
    text: `Hello,\n\n${inviter.name} (${inviter.email}) invites you to join the lab "${lab.name}" on Tessera as ${body.role}.\n\nOpen this link to accept, with an existing account or a new one:\n\n${link}\n\nThe invitation is valid for 7 days and can be used once.\n`,
  })
  await audit(db, { labId: lab.id, userId: access.userId, action: 'invite.create', target: `invite:${invite!.id}`, detail: { email: body.email, role: body.role } })
  setResponseStatus(event, 201)
  return { id: invite!.id, email: invite!.email, role: invite!.role, expires_at: invite!.expires_at }
})
