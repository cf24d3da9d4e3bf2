import { RegisterInput } from '#shared/schemas/account'

export default defineEventHandler(async (event) => {
  const body = await readBody400(event, RegisterInput)
  const db = await useDb()
  if (await findUserByEmail(db, body.email)) {
    throw createError({ statusCode: 409, message: 'An account with this e-mail already exists. Sign in, or reset the password.', data: { field: 'email' } })
  }
  const [user] = await db.insert(schema.users).values({
    email: body.email,
    name: body.name,
    password_hash: await hashPassword(body.password),
  }).onConflictDoNothing().returning()
  // Two registrations racing for one address: the unique index lets only one through.
  if (!user) throw createError({ statusCode: 409, message: 'An account with this e-mail already exists.', data: { field: 'email' } })
  await audit(db, { userId: user.id, action: 'user.register', target: `user:${user.id}` })
  return { user: await signIn(event, user) }
})
