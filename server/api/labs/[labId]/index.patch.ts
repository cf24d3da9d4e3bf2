import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { LabSettings, withLabDefaults } from '#shared/schemas/lab'

const LabPatch = z.object({
  name: z.string().trim().min(1, 'a name is required').max(120, 'at most 120 characters').optional(),
  settings: LabSettings.partial().optional(),
})

export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'owner')
  const body = await readBody400(event, LabPatch)
  const db = await useDb()
  const lab = await db.query.labs.findFirst({ where: eq(schema.labs.id, access.labId) })
  if (!lab) throw createError({ statusCode: 404, message: 'No such lab' })
  const [updated] = await db.update(schema.labs).set({
    name: body.name ?? lab.name,
    settings: { ...withLabDefaults(lab.settings), ...body.settings },
  }).where(eq(schema.labs.id, access.labId)).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: 'lab.update', target: `lab:${access.labId}`, detail: body })
  return { id: updated!.id, name: updated!.name, role: access.role, settings: withLabDefaults(updated!.settings) }
})
