import { LoginInput } from '#shared/schemas/account'

export default defineEventHandler(async (event) => {
  const body = await readBody400(event, LoginInput)
  const db = await useDb()
  const keys = [`email:${body.email}`, `ip:${getRequestIP(event, { xForwardedFor: true }) ?? 'unknown'}`]
  await assertLoginAllowed(db, keys)
  const user = await findUserByEmail(db, body.email)
  // Verify against a dummy hash when the account does not exist, so timing reveals nothing.
  const ok = await verifyPassword(user?.password_hash ?? await dummyHash(), body.password)
  if (!user || !ok) {
    await recordLoginFailure(db, keys)
    throw createError({ statusCode: 401, message: 'E-mail or password is not right.' })
  }
  await clearLoginFailures(db, keys[0]!)
  return { user: await signIn(event, user) }
})

// A constant, computed once: the hash that unknown addresses are checked against.
let dummy: Promise<string> | undefined
function dummyHash() {
  dummy ??= hashPassword('tessera-no-such-account')
  return dummy
}
