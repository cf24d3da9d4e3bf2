import { and, eq, isNull } from 'drizzle-orm'
import { ResetInput } from '#shared/schemas/account'

export default defineEventHandler(async (event) => {
  const body = await readBody400(event, ResetInput)
  const db = await useDb()
  const reset = await db.query.passwordResets.findFirst({ where: eq(schema.passwordResets.token_hash, hashToken(body.token)) })
  if (!reset) throw createError({ statusCode: 400, message: 'This reset link is not valid. Ask for a new one.', data: { field: 'token' } })
  if (reset.used_at) throw createError({ statusCode: 400, message: 'This reset link has already been used. Ask for a new one.', data: { field: 'token' } })
  if (reset.expires_at.getTime() < Date.now()) throw createError({ statusCode: 400, message: 'This reset link has expired. Ask for a new one.', data: { field: 'token' } })
  // Mark used first, conditionally, so two concurrent submissions cannot both succeed.
  const [claimed] = await db.update(schema.passwordResets).set({ used_at: new Date() })
    .where(and(eq(schema.passwordResets.id, reset.id), isNull(schema.passwordResets.used_at))).returning()
  if (!claimed) throw createError({ statusCode: 400, message: 'This reset link has already been used. Ask for a new one.', data: { field: 'token' } })
  const [user] = await db.update(schema.users).set({ password_hash: await hashPassword(body.password) })
    .where(eq(schema.users.id, reset.user_id)).returning()
  if (!user) throw createError({ statusCode: 404, message: 'The account no longer exists.' })
  await clearLoginFailures(db, `email:${user.email}`)
  await audit(db, { userId: user.id, action: 'user.password-reset', target: `user:${user.id}` })
  return { user: await signIn(event, user) }
})
