import { asc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const userId = await requireUserId(event)
  const db = await useDb()
  return db.select({ id: schema.labs.id, name: schema.labs.name, role: schema.memberships.role })
    .from(schema.memberships)
    .innerJoin(schema.labs, eq(schema.labs.id, schema.memberships.lab_id))
    .where(eq(schema.memberships.user_id, userId))
    .orderBy(asc(schema.labs.name))
})
