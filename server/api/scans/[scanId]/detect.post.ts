import { DetectRequest } from '#shared/schemas/scan'

// Detects adatoms on the stored grid and saves them as a new version of the scan's marks.
export default defineEventHandler(async (event) => {
  const { db, scan, access } = await scanForCaller(event, 'member')
  const params = await readBody400(event, DetectRequest)
  const grid = await loadGrid(scan)
  const result = await runCompute<{ marks: { x_nm: number, y_nm: number, height_nm: number, score: number }[] }>({
    kind: 'detect-grid',
    input: { ...grid, pixel_nm: [scan.size_x_nm / scan.width_px, scan.size_y_nm / scan.height_px], ...params },
  })
  const saved = await saveMarkSet(db, { scanId: scan.id, userId: access.userId, marks: result.marks, baseVersion: null, source: 'detect', params })
  await audit(db, { labId: access.labId, userId: access.userId, action: 'marks.detect', target: `scan:${scan.id}`, detail: { count: saved.count, version: saved.version, params } })
  return { version: saved.version, marks: saved.marks }
})
