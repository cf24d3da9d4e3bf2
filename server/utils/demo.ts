import { count } from 'drizzle-orm'
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
  await db.insert(schema.samples).values([
    { lab_id: lab!.id, name: 'AG-07 cobalt corral crystal', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5, notes: 'Sputter/anneal ×4, Co dosed at 8 K. Terrace widths 60–120 nm.', created_by: owner!.id },
    { lab_id: lab!.id, name: 'CU-12 chain tests', surface: 'Cu(111)', adsorbate: 'Fe', temperature_K: 4.3, notes: 'Fe from e-beam evaporator; low coverage.', created_by: member!.id },
  ])
  await audit(db, { labId: lab!.id, userId: owner!.id, action: 'demo.seed', target: `lab:${lab!.id}` })
  console.info('[tessera] demo lab seeded: demo@tessera.test / viewer@tessera.test, password tessera-demo')
}
