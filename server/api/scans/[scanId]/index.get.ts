export default defineEventHandler(async (event) => {
  const { db, scan, access } = await scanForCaller(event, 'viewer')
  const [marks, fit] = await Promise.all([latestMarks(db, scan.id), latestFit(db, scan.id)])
  return {
    scan: publicScan(scan),
    role: access.role,
    marks: marks ? { version: marks.version, count: marks.count, created_at: marks.created_at } : null,
    lattice_fit: fit ?? null,
  }
})
