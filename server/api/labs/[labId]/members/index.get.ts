import { and, asc, eq, gt, isNull } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const db = await useDb()
  const members = await db.select({
    user_id: schema.users.id, name: schema.users.name, email: schema.users.email,
    role: schema.memberships.role, joined_at: schema.memberships.created_at,
  }).from(schema.memberships)
    .innerJoin(schema.users, eq(schema.users.id, schema.memberships.user_id))
    .where(eq(schema.memberships.lab_id, access.labId))
    .orderBy(asc(schema.users.name))
  // Pending invitations are the owners' business.
  const invites = access.role === 'owner'
    ? await db.select({ id: schema.invites.id, email: schema.invites.email, role: schema.invites.role, expires_at: schema.invites.expires_at, created_at: schema.invites.created_at })
        .from(schema.invites)
        .where(and(eq(schema.invites.lab_id, access.labId), isNull(schema.invites.accepted_at), isNull(schema.invites.revoked_at), gt(schema.invites.expires_at, new Date())))
        .orderBy(asc(schema.invites.created_at))
    : []
  return { members, invites, me: { user_id: access.userId, role: access.role } }
})
