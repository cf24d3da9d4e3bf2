import type { H3Event } from 'h3'
import { and, desc, eq } from 'drizzle-orm'
import { expandBlueprint } from '#shared/blueprint/expand'
import type { FitFrame } from '#shared/blueprint/frame'
import { frameMap, scanRectInIdeal } from '#shared/blueprint/frame-map'
import type { Bounds } from '#shared/blueprint/schema'
import type { Role } from '#shared/roles'
import type { Db } from './db'

export type BlueprintRow = typeof schema.blueprints.$inferSelect

/** The blueprint version behind an id, for a caller with at least `role` in its lab. */
export async function blueprintForCaller(event: H3Event, role: Role) {
  await requireUserId(event)
  const id = idParam(event, 'blueprintId')
  const db = await useDb()
  const blueprint = await db.query.blueprints.findFirst({ where: eq(schema.blueprints.id, id) })
  if (!blueprint) throw createError({ statusCode: 404, message: 'No such blueprint' })
  const access = await requireRowLab(event, blueprint.lab_id, role, 'blueprint')
  return { db, blueprint, access }
}

export async function latestInLineage(db: Db, lineage: number) {
  return db.query.blueprints.findFirst({ where: eq(schema.blueprints.lineage, lineage), orderBy: desc(schema.blueprints.version) })
}

export async function versionsOf(db: Db, lineage: number) {
  return db.select({ id: schema.blueprints.id, version: schema.blueprints.version, name: schema.blueprints.name, site_count: schema.blueprints.site_count, created_at: schema.blueprints.created_at, author: schema.users.name })
    .from(schema.blueprints).innerJoin(schema.users, eq(schema.users.id, schema.blueprints.created_by))
    .where(eq(schema.blueprints.lineage, lineage)).orderBy(desc(schema.blueprints.version))
}

/** Expands the shapes to sites in the ideal frame (throws InputError for a bad shape). */
export function expandRow(row: Pick<BlueprintRow, 'shapes' | 'surface' | 'site' | 'min_spacing_nm'>, bounds?: Bounds) {
  return expandBlueprint(row.shapes as Parameters<typeof expandBlueprint>[0], row.surface, row.site, { ...(row.min_spacing_nm && { minSpacing_nm: row.min_spacing_nm }), ...(bounds && { bounds }) })
}

/** The rectangle of a scan of the lab, in the blueprint's ideal frame through the scan's latest lattice fit. */
export async function scanBoundsInIdeal(db: Db, labId: number, scanId: number, surface: string): Promise<Bounds> {
  const scan = await db.query.scans.findFirst({ where: and(eq(schema.scans.id, scanId), eq(schema.scans.lab_id, labId)) })
  if (!scan) throw createError({ statusCode: 400, message: 'scan_id: no such scan in this lab', data: { field: 'scan_id' } })
  const fit = await latestFit(db, scan.id)
  if (!fit) throw createError({ statusCode: 400, message: 'scan_id: this scan has no lattice fit to place the blueprint with', data: { field: 'scan_id' } })
  return compute400(() => scanRectInIdeal(frameMap(fit.result as unknown as FitFrame, surface, fit.site), scan.size_x_nm, scan.size_y_nm))
}

export async function buildBlueprints(db: Db, labId: number, buildId: number) {
  const rows = await db.select().from(schema.blueprints)
    .where(and(eq(schema.blueprints.lab_id, labId), eq(schema.blueprints.build_id, buildId)))
    .orderBy(desc(schema.blueprints.version))
  // Latest version of each lineage, newest lineage first.
  const latest = new Map<number, BlueprintRow>()
  for (const r of rows) if (!latest.has(r.lineage)) latest.set(r.lineage, r)
  return [...latest.values()].sort((a, b) => b.created_at.getTime() - a.created_at.getTime())
}
