import { eq } from 'drizzle-orm'
import type { Db } from './db'

/** The invitation behind a token, or a 400 that says plainly why it cannot be used. */
export async function usableInvite(db: Db, token: string) {
  const invite = token.length >= 20 ? await db.query.invites.findFirst({ where: eq(schema.invites.token_hash, hashToken(token)) }) : undefined
  if (!invite) throw createError({ statusCode: 404, message: 'This invitation link is not valid.' })
  if (invite.accepted_at) throw createError({ statusCode: 400, message: 'This invitation has already been used.', data: { field: 'token', reason: 'used' } })
  if (invite.revoked_at) throw createError({ statusCode: 400, message: 'This invitation was withdrawn by the lab.', data: { field: 'token', reason: 'revoked' } })
  if (invite.expires_at.getTime() < Date.now()) throw createError({ statusCode: 400, message: 'This invitation has expired. Ask the lab for a new one.', data: { field: 'token', reason: 'expired' } })
  return invite
}
