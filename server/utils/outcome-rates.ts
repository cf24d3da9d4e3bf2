import { and, eq, isNotNull, sql } from 'drizzle-orm'
import { latticeSymmetry, moveDirection, tallyRates, type Attempt, type Rates } from '#shared/logbook'
import type { Db } from './db'

// The lab's move success rates from its logbooks (effective entries: a corrected entry counts once,
// as corrected), optionally for one sample. Forecasts use them once the lab has logged at least
// MIN_ATTEMPTS_FOR_FORECAST (30) attempts; see shared/logbook/rates.ts. The move's length and end
// points are read inside SQLite (json_extract), so that a run page polling every few seconds does
// not pull every route's whole move list into the server.
//
// Saved routes carry a forecast from these rates whenever they are read (routeView in
// server/utils/routes.ts), so it improves as the lab logs more moves.

type Pt = [number, number]
const parse = <T>(v: unknown): T | null => {
  if (typeof v !== 'string') return null
  try {
    return JSON.parse(v) as T
  }
  catch {
    return null
  }
}

export async function labRates(db: Db, labId: number, sampleId?: number): Promise<Rates> {
  const e = schema.logbookEntries
  const r = schema.routes
  const move = sql`'$.moves[' || ${e.move_index} || ']'`
  const rows = await db.select({
    id: e.id, outcome: e.outcome, params: e.params, run_params: schema.buildRuns.params,
    length_nm: sql<number | null>`json_extract(${r.result}, ${move} || '.length_nm')`,
    p0: sql<string | null>`json_extract(${r.result}, ${move} || '.path[0]')`,
    p1: sql<string | null>`json_extract(${r.result}, ${move} || '.path[#-1]')`,
    lattice: sql<string | null>`coalesce(json_extract(${r.options}, '$.input.lattice'), json_extract(${r.result}, '$.lattice'), json_extract(${r.options}, '$.lattice'))`,
  }).from(e)
    .innerJoin(schema.buildRuns, eq(schema.buildRuns.id, e.run_id))
    .innerJoin(r, eq(r.id, e.route_id))
    .innerJoin(schema.blueprints, eq(schema.blueprints.id, r.blueprint_id))
    .where(and(eq(schema.buildRuns.lab_id, labId), sampleId ? eq(schema.blueprints.sample_id, sampleId) : undefined))
  const corrected = new Set((await db.select({ s: e.supersedes }).from(e)
    .innerJoin(schema.buildRuns, eq(schema.buildRuns.id, e.run_id))
    .where(and(eq(schema.buildRuns.lab_id, labId), isNotNull(e.supersedes)))).map(x => x.s))
  const attempts: Attempt[] = []
  for (const row of rows) {
    if (corrected.has(row.id) || typeof row.length_nm !== 'number') continue
    const lattice = parse<{ a1: Pt, a2: Pt }>(row.lattice)
    const p0 = parse<Pt>(row.p0), p1 = parse<Pt>(row.p1)
    const symmetry = lattice ? latticeSymmetry(lattice.a1, lattice.a2) : null
    const p = { ...row.run_params, ...row.params } as { bias_V?: number, setpoint_A?: number }
    attempts.push({
      outcome: row.outcome,
      length_nm: row.length_nm,
      symmetry_deg: symmetry,
      angle_deg: lattice && symmetry && p0 && p1 ? moveDirection([p0, p1], lattice.a1, symmetry) : null,
      bias_V: typeof p.bias_V === 'number' ? p.bias_V : null,
      setpoint_A: typeof p.setpoint_A === 'number' ? p.setpoint_A : null,
    })
  }
  return tallyRates(attempts)
}
