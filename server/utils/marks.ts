import type { Db } from './db'

type MarkRow = { x_nm: number, y_nm: number, height_nm: number, score: number, species?: string }

/**
 * Saves a new version of a scan's marks. `baseVersion` is the version the editor started from:
 * if someone saved meanwhile, the caller is told to reload instead of overwriting their work.
 */
export async function saveMarkSet(db: Db, opts: { scanId: number, userId: number, marks: MarkRow[], baseVersion: number | null, source: 'detect' | 'edit' | 'import', params?: Record<string, unknown> }) {
  const latest = await latestMarks(db, opts.scanId)
  const current = latest?.version ?? 0
  if (opts.baseVersion !== null && opts.baseVersion !== current) {
    throw createError({ statusCode: 409, message: `These marks were changed meanwhile (version ${current} is newer than your ${opts.baseVersion}). Reload to see them; your edit was not saved.`, data: { field: 'base_version', current } })
  }
  // The unique (scan, version) index turns a race between two savers into a conflict, not a loss.
  try {
    const [row] = await db.insert(schema.markSets).values({
      scan_id: opts.scanId, version: current + 1, source: opts.source, params: opts.params ?? null,
      marks: opts.marks, count: opts.marks.length, created_by: opts.userId,
    }).returning()
    return row!
  }
  catch (e) {
    if (String((e as Error).message).includes('UNIQUE')) throw createError({ statusCode: 409, message: 'These marks were changed meanwhile. Reload to see them; your edit was not saved.', data: { field: 'base_version' } })
    throw e
  }
}
