import { eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { Db } from './db'

export type UserRow = typeof schema.users.$inferSelect

export async function findUserByEmail(db: Db, email: string) {
  return db.query.users.findFirst({ where: eq(schema.users.email, email) })
}

/** Starts a session for the user; the cookie carries public fields only. */
export async function signIn(event: H3Event, user: UserRow) {
  await replaceUserSession(event, { user: { id: user.id, email: user.email, name: user.name }, loggedInAt: Date.now() })
  return { id: user.id, email: user.email, name: user.name }
}
