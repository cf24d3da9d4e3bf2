import { and, count, eq } from 'drizzle-orm'
import type { Db } from './db'

/** A lab always keeps at least one owner: refuse a change that would leave it with none. */
export async function assertNotLastOwner(db: Db, labId: number, userId: number, what: string) {
  const membership = await db.query.memberships.findFirst({
    where: and(eq(schema.memberships.lab_id, labId), eq(schema.memberships.user_id, userId)),
  })
  if (!membership) throw createError({ statusCode: 404, message: 'No such member' })
  if (membership.role !== 'owner') return membership
  const [row] = await db.select({ n: count() }).from(schema.memberships)
    .where(and(eq(schema.memberships.lab_id, labId), eq(schema.memberships.role, 'owner')))
  if ((row?.n ?? 0) <= 1) {
    throw createError({ statusCode: 400, message: `The last owner cannot ${what}. Make another member an owner first.`, data: { field: 'role' } })
  }
  return membership
}
