import { ForgotInput } from '#shared/schemas/account'

const RESET_VALID_MS = 60 * 60 * 1000

// Always answers the same, whether or not the address has an account, so it cannot be used to
// find out who has one.
export default defineEventHandler(async (event) => {
  const { email } = await readBody400(event, ForgotInput)
  const db = await useDb()
  const user = await findUserByEmail(db, email)
  if (user) {
    const { token, hash } = newToken()
    await db.insert(schema.passwordResets).values({ user_id: user.id, token_hash: hash, expires_at: new Date(Date.now() + RESET_VALID_MS) })
    const link = `${baseUrl(event)}/reset/${token}`
    await sendMail({
      to: user.email,
      subject: 'Reset your Tessera password',
      text: `Hello ${user.name},\n\nSomeone (hopefully you) asked to reset the password of your Tessera account.\nOpen this link within one hour to choose a new password:\n\n${link}\n\nThe link works once. If you did not ask for this, ignore this message; your password stays as it is.\n`,
    })
    await audit(db, { userId: user.id, action: 'user.reset-requested', target: `user:${user.id}` })
  }
  return { ok: true, message: 'If an account exists for that address, a reset link is on its way.' }
})
