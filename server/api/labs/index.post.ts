import { LabInput } from '#shared/schemas/account'

export default defineEventHandler(async (event) => {
  const userId = await requireUserId(event)
  const { name } = await readBody400(event, LabInput)
  const db = await useDb()
  const lab = await db.transaction(async (tx) => {
    const [created] = await tx.insert(schema.labs).values({ name }).returning()
    await tx.insert(schema.memberships).values({ lab_id: created!.id, user_id: userId, role: 'owner' })
    return created!
  })
  await audit(db, { labId: lab.id, userId, action: 'lab.create', target: `lab:${lab.id}` })
  setResponseStatus(event, 201)
  return { id: lab.id, name: lab.name, role: 'owner' as const }
})
