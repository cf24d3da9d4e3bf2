import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { roleAllows, type Role } from '#shared/roles'

export interface LabAccess { userId: number, labId: number, role: Role }

/** The signed-in user's id, or 401. */
export async function requireUserId(event: H3Event): Promise<number> {
  const session = await requireUserSession(event, { message: 'Sign in first' })
  return session.user.id
}

/**
 * The one guard for lab data: the caller must be signed in (401) and a member of the lab (404, so
 * that other labs' ids reveal nothing), with at least the given role (403).
 */
export async function requireLabRole(event: H3Event, labId: number, needed: Role): Promise<LabAccess> {
  const userId = await requireUserId(event)
  const db = await useDb()
  const row = await db.query.memberships.findFirst({
    where: and(eq(schema.memberships.lab_id, labId), eq(schema.memberships.user_id, userId)),
  })
  if (!row) throw createError({ statusCode: 404, message: 'No such lab' })
  if (!roleAllows(row.role, needed)) {
    throw createError({ statusCode: 403, message: needed === 'owner' ? 'Only a lab owner may do this' : 'Viewers can look but not change anything' })
  }
  return { userId, labId, role: row.role }
}
