import { and, eq } from 'drizzle-orm'
import type { Db } from './db'

/** A sample of the given lab, or 404 (another lab's sample is indistinguishable from none). */
export async function sampleInLab(db: Db, labId: number, sampleId: number) {
  const sample = await db.query.samples.findFirst({ where: and(eq(schema.samples.id, sampleId), eq(schema.samples.lab_id, labId)) })
  if (!sample) throw createError({ statusCode: 404, message: 'No such sample' })
  return sample
}

export async function buildInLab(db: Db, labId: number, buildId: number) {
  const build = await db.query.builds.findFirst({ where: and(eq(schema.builds.id, buildId), eq(schema.builds.lab_id, labId)) })
  if (!build) throw createError({ statusCode: 404, message: 'No such build' })
  return build
}
