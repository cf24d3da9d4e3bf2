import { orientationFromFFT } from '#shared/lattice/orientation'
import { LatticeFitSave } from '#shared/schemas/lattice'

// Registers the substrate lattice to a scan and saves it as a new version: fitted from the
// scan's latest marks, placed by hand, or locked/unlocked. A locked lattice is not re-fitted.
export default defineEventHandler(async (event) => {
  const { db, scan, access } = await scanForCaller(event, 'member')
  const body = await readBody400(event, LatticeFitSave)
  const latest = await latestFit(db, scan.id)
  const version = (latest?.version ?? 0) + 1
  let row: typeof schema.latticeFits.$inferInsert

  if (body.mode === 'lock') {
    if (!latest) throw createError({ statusCode: 400, message: 'locked: there is no lattice to lock yet', data: { field: 'locked' } })
    row = { ...latest, id: undefined, version, locked: body.locked, created_by: access.userId, created_at: undefined }
  }
  else if (body.mode === 'hand') {
    const fit = await compute400(() => handLattice(body))
    row = { scan_id: scan.id, version, surface: fit.surface, site: fit.site, source: 'hand', locked: body.locked ?? false, result: fit, residual_nm: null, created_by: access.userId }
  }
  else {
    if (latest?.locked) throw createError({ statusCode: 409, message: 'The lattice of this scan is locked. Unlock it before fitting again.', data: { field: 'mode' } })
    const marks = await latestMarks(db, scan.id)
    if (!marks || marks.count < 3) throw createError({ statusCode: 400, message: 'marks: the fit needs at least 3 marks on the scan', data: { field: 'marks' } })
    let hint = body.rotation_hint_deg
    if (body.use_fft && hint === undefined) {
      const grid = await loadGrid(scan)
      hint = await compute400(() => orientationFromFFT(grid.data, grid.width, grid.height, [scan.size_x_nm / scan.width_px, scan.size_y_nm / scan.height_px]).rotation_deg)
    }
    const result = await runCompute<{ surface: string, site: string, residual_nm: number } & Record<string, unknown>>({
      kind: 'lattice-fit',
      input: { surface: body.surface, site: body.site, affine: body.affine ?? true, marks: marks.marks.map(m => [m.x_nm, m.y_nm]), ...(hint !== undefined && { rotation_hint_deg: hint }) },
    })
    row = { scan_id: scan.id, version, surface: result.surface, site: result.site, source: 'fit', locked: false, result: { ...result, marks_version: marks.version }, residual_nm: result.residual_nm, created_by: access.userId }
  }
  // A fit fixes the lattice only up to a lattice translation (its origin is just a site near the
  // marks' centre): keep the origin on the site nearest the previous version's origin, so a
  // blueprint drawn on this scan stays on the same atoms. A lattice placed by hand keeps the
  // origin it was given.
  if (latest && body.mode === 'fit' && latest.surface === row.surface && latest.site === row.site) {
    row.result = anchorOrigin(row.result as never, (latest.result as { origin: [number, number] }).origin)
  }
  const [saved] = await db.insert(schema.latticeFits).values(row).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: `lattice.${body.mode}`, target: `scan:${scan.id}`, detail: { version } })
  setResponseStatus(event, 201)
  return saved
})
