import type { Db } from './db'

export async function audit(db: Db, entry: { labId?: number | null, userId?: number | null, action: string, target?: string, detail?: Record<string, unknown> }) {
  await db.insert(schema.auditLog).values({
    lab_id: entry.labId ?? null,
    user_id: entry.userId ?? null,
    action: entry.action,
    target: entry.target ?? '',
    detail: entry.detail ?? null,
  })
}
