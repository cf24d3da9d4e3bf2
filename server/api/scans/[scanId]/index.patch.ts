import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { ScanProcessing } from '#shared/schemas/scan'

const ScanPatch = z.object({
  processing: ScanProcessing.optional(),
  notes: z.string().max(5000, 'at most 5000 characters').optional(),
})

// Processing steps and notes only: the frame and the data of a scan are as they were uploaded.
export default defineEventHandler(async (event) => {
  const { db, scan, access } = await scanForCaller(event, 'member')
  const body = await readBody400(event, ScanPatch)
  const [updated] = await db.update(schema.scans).set({
    processing: body.processing ?? scan.processing,
    notes: body.notes ?? scan.notes,
  }).where(eq(schema.scans.id, scan.id)).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: 'scan.update', target: `scan:${scan.id}`, detail: body })
  return publicScan(updated!)
})
