import type { Db } from './db'
import type { BlueprintRow } from './blueprints'
import type { ScanRow } from './scans'
import { toScanFrame } from '#shared/blueprint/frame'
import { alignByLatticeVector, scanDrift } from '#shared/compare/register'
import { and, desc, eq, isNotNull } from 'drizzle-orm'

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

export interface Registration { reference_scan_id: number, drift_nm: [number, number], support: number, shift: [number, number] }

/**
 * The blueprint's sites on `scan`, registered to where they were planned: when the blueprint was
 * planned on another scan (`referenceScanId`), the drift between the two scans' marks carries the
 * planned sites over, and the sites from `scan`'s own fit move by the lattice vector that puts
 * them there (a fit fixes its lattice only up to a lattice translation). Without a usable
 * reference (same scan, no marks, no agreement among at least 3 atoms) the fit's own placement
 * stands.
 */
export async function registeredSitesOn(db: Db, blueprint: BlueprintRow, scan: ScanRow, fit: FitRow, referenceScanId: number | null | undefined): Promise<{ sites: Pt[], registration: Registration | null }> {
  const raw = await blueprintSitesOn(blueprint, fit)
  if (!referenceScanId || referenceScanId === scan.id || !raw.length) return { sites: raw, registration: null }
  const [refFit, refMarks, marks] = await Promise.all([latestFit(db, referenceScanId), latestMarks(db, referenceScanId), latestMarks(db, scan.id)])
  if (!refFit || !refMarks?.count || !marks?.count) return { sites: raw, registration: null }
  const drift = scanDrift(refMarks.marks.map(m => [m.x_nm, m.y_nm]), marks.marks.map(m => [m.x_nm, m.y_nm]))
  if (drift.support < 3) return { sites: raw, registration: null }
  const planned = await blueprintSitesOn(blueprint, refFit)
  const expected = planned.map(([x, y]) => [x + drift.dx, y + drift.dy] as Pt)
  const { a1, a2 } = fitFrame(fit)
  const aligned = await compute400(() => alignByLatticeVector(raw, expected, a1, a2))
  return { sites: aligned.points, registration: { reference_scan_id: referenceScanId, drift_nm: [drift.dx, drift.dy], support: drift.support, shift: aligned.shift } }
}

/**
 * The scan a blueprint was planned on: that of its newest route, else the scan it was drawn on,
 * else the build's newest plan scan with a fit.
 */
export async function planningScanOf(db: Db, blueprint: BlueprintRow): Promise<number | null> {
  const route = await db.query.routes.findFirst({ where: and(eq(schema.routes.blueprint_id, blueprint.id), isNotNull(schema.routes.scan_id)), orderBy: desc(schema.routes.id) })
  if (route?.scan_id) return route.scan_id
  if (blueprint.scan_id) return blueprint.scan_id
  if (!blueprint.build_id) return null
  const scans = await db.query.scans.findMany({ where: and(eq(schema.scans.build_id, blueprint.build_id), eq(schema.scans.purpose, 'plan')), orderBy: desc(schema.scans.id) })
  for (const s of scans) if (await latestFit(db, s.id)) return s.id
  return null
}
