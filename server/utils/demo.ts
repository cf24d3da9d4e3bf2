import { count, eq } from 'drizzle-orm'
import { encodeFloat32Grid } from '#shared/scan/gridfile'
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
  const base = `${ids.labId}:${ids.sampleId}:demo-topograph`
  const grid = Buffer.from(encodeFloat32Grid(scan))
  await useStorage('scans').setItemRaw(`${base}:original`, grid)
  await useStorage('scans').setItemRaw(`${base}:grid`, grid)
  const [row] = await db.insert(schema.scans).values({
    lab_id: ids.labId, sample_id: ids.sampleId, build_id: build!.id, purpose: 'plan', filename: 'AG-07_night3_0001.tsg', format: 'text-float32',
    storage_key: `${base}:original`, grid_key: `${base}:grid`, bytes: grid.length, width_px: scan.width, height_px: scan.height,
    size_x_nm: size_nm, size_y_nm: size_nm, offset_x_nm: 120, offset_y_nm: -45, rotation_deg: 0, bias_V: -0.1, setpoint_A: 5e-11,
    taken_at: new Date(Date.now() - 3 * 3600_000), notes: 'Tip conditioned on bare Ag; Co adatoms imaged at −100 mV, 50 pA.', created_by: ids.userId,
  }).returning()
  await db.insert(schema.markSets).values({ scan_id: row!.id, version: 1, source: 'detect', marks: marks.map(a => ({ ...a, score: 40 })), count: marks.length, created_by: ids.userId })
  await db.insert(schema.latticeFits).values({ scan_id: row!.id, version: 1, surface: fit.surface, site: fit.site, source: 'fit', result: { ...fit }, residual_nm: fit.residual_nm, created_by: ids.userId })
  const [bp] = await db.insert(schema.blueprints).values({
    lab_id: ids.labId, sample_id: ids.sampleId, build_id: build!.id, lineage: 0, version: 1, name: 'Ring 24', surface: 'Ag(111)', site: 'fcc',
    shapes: [{ type: 'ring', center: [0, 0], radius_nm: 3.5, n: 24 }], site_count: 24, created_by: ids.userId,
  }).returning()
  await db.update(schema.blueprints).set({ lineage: bp!.id }).where(eq(schema.blueprints.id, bp!.id))
}
