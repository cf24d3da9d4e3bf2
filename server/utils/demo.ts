import { count, eq } from 'drizzle-orm'
import { expandBlueprint } from '#shared/blueprint/expand'
import { toScanFrame } from '#shared/blueprint/frame'
import { checkAsBuilt } from '#shared/compare/check'
import { alignByLatticeVector } from '#shared/compare/register'
import { solveRoute } from '#shared/route/solve'
import { encodeFloat32Grid } from '#shared/scan/gridfile'
import { DEFAULT_LAB_SETTINGS } from '#shared/schemas/lab'
import type { Db } from './db'

// The demo scenario (fictional): the Fenwick Low-Temperature STM group, an Ag(111) crystal with
// cobalt adatoms at 5 K. Seeded once, on an empty database only.
export const DEMO_PASSWORD = 'tessera-demo'

export async function seedDemo(db: Db) {
  const [row] = await db.select({ n: count() }).from(schema.users)
  if ((row?.n ?? 0) > 0) return
  const hash = await hashPassword(DEMO_PASSWORD)
  const [owner] = await db.insert(schema.users).values({ email: 'demo@tessera.test', name: 'Ines Halvorsen', password_hash: hash }).returning()
  const [viewer] = await db.insert(schema.users).values({ email: 'viewer@tessera.test', name: 'Pavel Ruiz', password_hash: hash }).returning()
  const [member] = await db.insert(schema.users).values({ email: 'night-shift@tessera.test', name: 'Oda Mbeki', password_hash: hash }).returning()
  const [lab] = await db.insert(schema.labs).values({ name: 'Fenwick Low-T STM group' }).returning()
  await db.insert(schema.memberships).values([
    { lab_id: lab!.id, user_id: owner!.id, role: 'owner' },
    { lab_id: lab!.id, user_id: member!.id, role: 'member' },
    { lab_id: lab!.id, user_id: viewer!.id, role: 'viewer' },
  ])
  const [ag] = await db.insert(schema.samples).values([
    { lab_id: lab!.id, name: 'AG-07 cobalt corral crystal', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5, notes: 'Sputter/anneal ×4, Co dosed at 8 K. Terrace widths 60–120 nm.', created_by: owner!.id },
    { lab_id: lab!.id, name: 'CU-12 chain tests', surface: 'Cu(111)', adsorbate: 'Fe', temperature_K: 4.3, notes: 'Fe from e-beam evaporator; low coverage.', created_by: member!.id },
  ]).returning()
  await seedDemoBuild(db, { labId: lab!.id, sampleId: ag!.id, userId: owner!.id })
  await audit(db, { labId: lab!.id, userId: owner!.id, action: 'demo.seed', target: `lab:${lab!.id}` })
  console.info('[tessera] demo lab seeded: demo@tessera.test / viewer@tessera.test, password tessera-demo')
}

// A build in progress on the Ag crystal: the night's starting scan with its marks and lattice
// fit, and a blueprint for a 24-atom ring, so every later step has something to work on.
async function seedDemoBuild(db: Db, ids: { labId: number, sampleId: number, userId: number }) {
  const { scan, marks, fit, size_nm } = demoTopograph()
  const [build] = await db.insert(schema.builds).values({ lab_id: ids.labId, sample_id: ids.sampleId, name: 'Ring of 24, R ≈ 3.5 nm', notes: 'First corral on AG-07; compare with the hard-wall levels.', created_by: ids.userId }).returning()
  const row = await storeDemoScan(db, { ...ids, buildId: build!.id, name: 'AG-07_night3_0001.tsg', purpose: 'plan', grid: scan, size_nm, takenAt: new Date(Date.now() - 26 * 3600_000), notes: 'Tip conditioned on bare Ag; Co adatoms imaged at −100 mV, 50 pA.' })
  await db.insert(schema.markSets).values({ scan_id: row.id, version: 1, source: 'detect', marks: marks.map(a => ({ ...a, score: 40 })), count: marks.length, created_by: ids.userId })
  await db.insert(schema.latticeFits).values({ scan_id: row.id, version: 1, surface: fit.surface, site: fit.site, source: 'fit', result: { ...fit }, residual_nm: fit.residual_nm, created_by: ids.userId })
  const [bp] = await db.insert(schema.blueprints).values({
    lab_id: ids.labId, sample_id: ids.sampleId, build_id: build!.id, scan_id: row.id, lineage: 0, version: 1, name: 'Ring 24', surface: 'Ag(111)', site: 'fcc',
    shapes: [{ type: 'ring', center: [0, 0], radius_nm: 3.5, n: 24 }], site_count: 24, created_by: ids.userId,
  }).returning()
  await db.update(schema.blueprints).set({ lineage: bp!.id }).where(eq(schema.blueprints.id, bp!.id))
  await seedDemoNight(db, { ...ids, buildId: build!.id, blueprintId: bp!.id, scanId: row.id, marks, fit, size_nm })
}

// Last night on the same build: the route solved, 24 moves logged (two atoms needed a second
// try, one tip change), the run closed, and the morning's as-built check with one site missed.
async function seedDemoNight(db: Db, o: { labId: number, sampleId: number, userId: number, buildId: number, blueprintId: number, scanId: number, marks: { x_nm: number, y_nm: number }[], fit: ReturnType<typeof demoTopograph>['fit'], size_nm: number }) {
  const expanded = expandBlueprint([{ type: 'ring', center: [0, 0], radius_nm: 3.5, n: 24 }], 'Ag(111)', 'fcc')
  const sites = toScanFrame(expanded.sites, o.fit) as [number, number][]
  const atoms = o.marks.map(m => [m.x_nm, m.y_nm] as [number, number])
  const lattice = { a1: o.fit.a1, a2: o.fit.a2, origin: o.fit.origin }
  const time = DEFAULT_LAB_SETTINGS
  const result = solveRoute({ atoms, sites, lattice, clearance_nm: 0.5 }, { time })
  const route = await saveRoute(db, { labId: o.labId, blueprintId: o.blueprintId, scanId: o.scanId, userId: o.userId, input: { atoms, sites, lattice, clearance_nm: 0.5, time }, result, meta: { source: 'plan' } })
  const started = new Date(Date.now() - 24 * 3600_000)
  const [run] = await db.insert(schema.buildRuns).values({
    lab_id: o.labId, build_id: o.buildId, route_id: route.id, current_route_id: route.id, state: 'closed',
    params: { bias_V: -0.005, setpoint_A: 5e-8, tip_speed_nm_s: 2 }, notes: 'Tip shaped on bare Ag before the run.',
    started_by: o.userId, started_at: started, closed_at: new Date(started.getTime() + 5 * 3600_000), closed_by: o.userId,
  }).returning()
  let seq = 0
  const entry = (move_index: number, outcome: typeof schema.OUTCOMES[number], note = '') => ({
    run_id: run!.id, seq: ++seq, route_id: route.id, move_index, outcome, note, idempotency_key: `demo-${seq}`,
    author_id: o.userId, created_at: new Date(started.getTime() + seq * 9 * 60_000), params: {},
  })
  const entries = result.moves.flatMap((_, k) => [
    ...(k === 6 || k === 15 ? [entry(k, 'stayed', 'atom did not follow; 10 % more current')] : []),
    ...(k === 11 ? [entry(k, 'tip-change', 'tip changed on approach; reshaped on bare Ag')] : []),
    entry(k, 'placed'),
  ])
  await db.insert(schema.logbookEntries).values(entries)
  // The morning's after-scan: every ring site filled but one, whose atom stopped a site short.
  const final = atoms.map(p => [...p] as [number, number])
  for (const m of result.moves) final[m.atom] = [...m.path.at(-1)!] as [number, number]
  const missed = result.moves[9]!.atom
  final[missed] = [final[missed]![0] + o.fit.a1[0], final[missed]![1] + o.fit.a1[1]]
  // As detected on the after-scan: each atom within a few pm of where it sits.
  const seen = final.map(([x, y], k) => [x + 0.006 * Math.sin(1.7 * k), y + 0.006 * Math.cos(2.3 * k)] as [number, number])
  const after = demoAfterScan(seen, o.size_nm)
  const afterScan = await storeDemoScan(db, { ...o, name: 'AG-07_night3_after.tsg', purpose: 'after', grid: after.scan, takenAt: new Date(started.getTime() + 5.5 * 3600_000), notes: 'After the ring: same tip, same setpoint.' })
  await db.insert(schema.markSets).values({ scan_id: afterScan.id, version: 1, source: 'detect', marks: after.atoms.map(a => ({ ...a, score: 40 })), count: after.atoms.length, created_by: o.userId })
  await db.insert(schema.latticeFits).values({ scan_id: afterScan.id, version: 1, surface: after.fit.surface, site: after.fit.site, source: 'fit', result: { ...after.fit }, residual_nm: after.fit.residual_nm, created_by: o.userId })
  // The after-scan's fit has its own origin: register the blueprint to where it was planned (no
  // drift between the two demo scans).
  const afterSites = alignByLatticeVector(toScanFrame(expanded.sites, after.fit) as [number, number][], sites, after.fit.a1, after.fit.a2).points
  const check = checkAsBuilt({ sites: afterSites, found: seen, tolerance_nm: 0.1 })
  await db.insert(schema.asBuiltChecks).values({
    lab_id: o.labId, blueprint_id: o.blueprintId, scan_id: afterScan.id, run_id: run!.id, tolerance_nm: 0.1,
    result: { ...check, sites: afterSites, found: seen } as unknown as Record<string, unknown>, fidelity: check.fidelity, rms_nm: check.rms_nm, created_by: o.userId,
  })
}

async function storeDemoScan(db: Db, o: { labId: number, sampleId: number, userId: number, buildId: number, name: string, purpose: 'plan' | 'after', grid: { width: number, height: number, data: Float32Array }, size_nm: number, takenAt: Date, notes: string }) {
  const base = `${o.labId}:${o.sampleId}:demo-${o.purpose}`
  const bytes = Buffer.from(encodeFloat32Grid(o.grid))
  await useStorage('scans').setItemRaw(`${base}:original`, bytes)
  await useStorage('scans').setItemRaw(`${base}:grid`, bytes)
  const [row] = await db.insert(schema.scans).values({
    lab_id: o.labId, sample_id: o.sampleId, build_id: o.buildId, purpose: o.purpose, filename: o.name, format: 'text-float32',
    storage_key: `${base}:original`, grid_key: `${base}:grid`, bytes: bytes.length, width_px: o.grid.width, height_px: o.grid.height,
    size_x_nm: o.size_nm, size_y_nm: o.size_nm, offset_x_nm: 120, offset_y_nm: -45, rotation_deg: 0, bias_V: -0.1, setpoint_A: 5e-11,
    taken_at: o.takenAt, notes: o.notes, created_by: o.userId,
  }).returning()
  return row!
}
