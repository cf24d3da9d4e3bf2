import { eq } from 'drizzle-orm'
import { siteContext } from '#shared/blueprint/context'
import { BlueprintSave } from '#shared/schemas/blueprint'

// Saves a blueprint: a new lineage, or a new version of an existing one. The shapes are expanded
// first, so a shape that cannot be built is refused and nothing is saved half-way. Editing from an
// older version than the latest is refused (409) rather than silently overwriting. With scan_id,
// chains must stay inside that scan (its rectangle through its latest lattice fit).
export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'member')
  const db = await useDb()
  const build = await buildInLab(db, access.labId, idParam(event, 'buildId'))
  const body = await readBody400(event, BlueprintSave)
  // The site type is stored resolved (the surface's default when none was named).
  const site = await compute400(() => siteContext(body.surface, body.site).site.name)
  const bounds = body.scan_id === undefined ? undefined : await scanBoundsInIdeal(db, access.labId, body.scan_id, body.surface)
  const expanded = await compute400(() => expandRow({ shapes: body.shapes, surface: body.surface, site, min_spacing_nm: body.min_spacing_nm ?? null }, bounds))
  let version = 1
  let lineage: number | undefined
  let drawnOn = body.scan_id ?? null
  if (body.lineage !== undefined) {
    const latest = await latestInLineage(db, body.lineage)
    if (!latest || latest.lab_id !== access.labId || latest.build_id !== build.id) throw createError({ statusCode: 404, message: 'No such blueprint' })
    if (body.base_version !== undefined && body.base_version !== latest.version) {
      throw createError({ statusCode: 409, message: `Version ${latest.version} of this blueprint was saved meanwhile (you edited version ${body.base_version}). Open the latest version; your edit was not saved.`, data: { field: 'base_version', current: latest.version } })
    }
    lineage = body.lineage
    version = latest.version + 1
    drawnOn ??= latest.scan_id
  }
  const [row] = await db.insert(schema.blueprints).values({
    lab_id: access.labId, sample_id: build.sample_id, build_id: build.id, scan_id: drawnOn,
    lineage: lineage ?? 0, version, name: body.name, surface: body.surface, site,
    min_spacing_nm: body.min_spacing_nm ?? null, shapes: body.shapes, site_count: expanded.sites.length, created_by: access.userId,
  }).returning()
  let saved = row!
  if (lineage === undefined) {
    // A new lineage is named after its first version's id.
    const [named] = await db.update(schema.blueprints).set({ lineage: saved.id }).where(eq(schema.blueprints.id, saved.id)).returning()
    saved = named!
  }
  await audit(db, { labId: access.labId, userId: access.userId, action: 'blueprint.save', target: `blueprint:${saved.id}`, detail: { lineage: saved.lineage, version, sites: expanded.sites.length } })
  setResponseStatus(event, 201)
  return { ...saved, duplicates: expanded.duplicates.length }
})
