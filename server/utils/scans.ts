import type { H3Event } from 'h3'
import { desc, eq } from 'drizzle-orm'
import type { Role } from '#shared/roles'
import { decodeFloat32Grid } from '#shared/scan/gridfile'
import type { Db } from './db'

export type ScanRow = typeof schema.scans.$inferSelect

/** The scan behind an id, for a caller with at least `role` in its lab (401/404/403 otherwise). */
export async function scanForCaller(event: H3Event, role: Role) {
  await requireUserId(event)
  const id = idParam(event, 'scanId')
  const db = await useDb()
  const scan = await db.query.scans.findFirst({ where: eq(schema.scans.id, id) })
  if (!scan) throw createError({ statusCode: 404, message: 'No such scan' })
  const access = await requireRowLab(event, scan.lab_id, role, 'scan')
  return { db, scan, access }
}

export async function latestMarks(db: Db, scanId: number) {
  return db.query.markSets.findFirst({ where: eq(schema.markSets.scan_id, scanId), orderBy: desc(schema.markSets.version) })
}

export async function latestFit(db: Db, scanId: number) {
  return db.query.latticeFits.findFirst({ where: eq(schema.latticeFits.scan_id, scanId), orderBy: desc(schema.latticeFits.version) })
}

/** The stored height grid (nm, Float32) of a scan. */
export async function loadGrid(scan: ScanRow) {
  const raw = scan.grid_key ? await useStorage('scans').getItemRaw(scan.grid_key) : null
  if (!raw) throw createError({ statusCode: 404, message: 'The height grid of this scan is missing from storage' })
  return decodeFloat32Grid(raw instanceof Uint8Array ? raw : new Uint8Array(raw as ArrayBuffer))
}

export function publicScan(scan: ScanRow) {
  const { storage_key: _s, grid_key: _g, ...rest } = scan
  return { ...rest, pixel_nm: [scan.size_x_nm / scan.width_px, scan.size_y_nm / scan.height_px] as [number, number] }
}
