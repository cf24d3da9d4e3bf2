import type { Db } from './db'
import type { BlueprintRow } from './blueprints'
import type { ScanRow } from './scans'
import { toScanFrame } from '#shared/blueprint/frame'

// A blueprint lives in the ideal frame of its surface; a lattice fit of a scan carries it into
// that scan's frame (nm). Routes and as-built checks both work in the scan frame.

type Pt = [number, number]
export type FitRow = typeof schema.latticeFits.$inferSelect
interface FitResult { a1: Pt, a2: Pt, origin: Pt, basis?: Pt[] }

export function fitFrame(fit: FitRow): FitResult {
  return fit.result as unknown as FitResult
}

/** The blueprint's sites in the scan frame of the fitted scan (InputError → 400 via compute400). */
export async function blueprintSitesOn(blueprint: BlueprintRow, fit: FitRow): Promise<Pt[]> {
  const expanded = await compute400(() => expandRow(blueprint))
  return compute400(() => toScanFrame(expanded.sites, fitFrame(fit)) as Pt[])
}

/** A scan of the same lab and sample as the blueprint, or a 400/404 naming scan_id. */
export async function scanForBlueprint(db: Db, blueprint: BlueprintRow, scanId: number): Promise<ScanRow> {
  const scan = await db.query.scans.findFirst({ where: (s, { eq }) => eq(s.id, scanId) })
  if (!scan || scan.lab_id !== blueprint.lab_id) throw createError({ statusCode: 404, message: 'scan_id: no such scan in this lab', data: { field: 'scan_id' } })
  if (scan.sample_id !== blueprint.sample_id) throw createError({ statusCode: 400, message: 'scan_id: the scan is of another sample than the blueprint', data: { field: 'scan_id' } })
  return scan
}

/** The scan's latest lattice fit, or a 400 that says the scan needs one first. */
export async function requireFit(db: Db, scan: ScanRow, what: string): Promise<FitRow> {
  const fit = await latestFit(db, scan.id)
  if (!fit) throw createError({ statusCode: 400, message: `scan_id: ${what} has no lattice fit. Fit the lattice of that scan first.`, data: { field: 'scan_id' } })
  return fit
}
