import { and, count, eq, gt, lt } from 'drizzle-orm'
import type { Db } from './db'

// Failed sign-ins are counted per e-mail and per client address over a sliding window, in the
// database, so the limit holds across app servers and restarts.
// A whole institute often shares one outgoing address, so the per-address limit is looser than
// the per-account one.
const WINDOW_MS = 15 * 60 * 1000
const MAX_FAILURES = { email: 8, ip: 40 }

export async function assertLoginAllowed(db: Db, keys: string[]) {
  const since = new Date(Date.now() - WINDOW_MS)
  for (const key of keys) {
    const limit = key.startsWith('ip:') ? MAX_FAILURES.ip : MAX_FAILURES.email
    const [row] = await db.select({ n: count() }).from(schema.loginAttempts)
      .where(and(eq(schema.loginAttempts.key, key), gt(schema.loginAttempts.created_at, since)))
    if ((row?.n ?? 0) >= limit) {
      throw createError({ statusCode: 429, message: 'Too many failed sign-in attempts. Wait 15 minutes or reset the password.' })
    }
  }
}

export async function recordLoginFailure(db: Db, keys: string[]) {
  await db.insert(schema.loginAttempts).values(keys.map(key => ({ key })))
  // Keep the table small: attempts older than the window no longer count.
  await db.delete(schema.loginAttempts).where(lt(schema.loginAttempts.created_at, new Date(Date.now() - WINDOW_MS)))
}

export async function clearLoginFailures(db: Db, key: string) {
  await db.delete(schema.loginAttempts).where(eq(schema.loginAttempts.key, key))
}
