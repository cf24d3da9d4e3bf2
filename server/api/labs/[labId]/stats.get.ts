import { z } from 'zod'

const Query = z.object({ sample: z.coerce.number().int().positive().optional() })

// Move success rates of the lab (or one sample): by outcome, move length, drag direction relative
// to the lattice and manipulation parameters (shared/logbook/rates.ts).
export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const { sample } = parseQuery400(event, Query)
  const db = await useDb()
  if (sample) await sampleInLab(db, access.labId, sample)
  return { sample_id: sample ?? null, ...(await labRates(db, access.labId, sample)) }
})
