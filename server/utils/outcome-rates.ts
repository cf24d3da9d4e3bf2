import { and, eq, inArray, isNotNull } from 'drizzle-orm'
import { latticeSymmetry, moveDirection, tallyRates, type Attempt, type Rates } from '#shared/logbook'
import type { Db } from './db'
import type { RouteRow } from './route-rows'

// The lab's move success rates from its logbooks (effective entries: a corrected entry counts once,
// as corrected), optionally for one sample. Forecasts use them once the lab has logged at least
// MIN_ATTEMPTS_FOR_FORECAST (30) attempts; see shared/logbook/rates.ts.
//
// Wiring into route saving: after a route is solved, call
//   const rates = await labRates(db, labId, sampleId)
//   const forecast = forecastMoves(result.moves.map((m, i) => ({ length_nm: m.length_nm, estimate_s: result.time.per_move_s[i] })), rates)
// and return `forecast` beside the route (expected_placed, expected_s; null until enough attempts).

type Pt = [number, number]

export async function labRates(db: Db, labId: number, sampleId?: number): Promise<Rates> {
  const e = schema.logbookEntries
  const rows = await db.select({
    id: e.id, route_id: e.route_id, move_index: e.move_index, outcome: e.outcome, params: e.params, supersedes: e.supersedes,
    run_params: schema.buildRuns.params, sample_id: schema.blueprints.sample_id,
  }).from(e)
    .innerJoin(schema.buildRuns, eq(schema.buildRuns.id, e.run_id))
    .innerJoin(schema.routes, eq(schema.routes.id, e.route_id))
    .innerJoin(schema.blueprints, eq(schema.blueprints.id, schema.routes.blueprint_id))
    .where(and(eq(schema.buildRuns.lab_id, labId), sampleId ? eq(schema.blueprints.sample_id, sampleId) : undefined))
  const corrected = new Set((await db.select({ s: e.supersedes }).from(e)
    .innerJoin(schema.buildRuns, eq(schema.buildRuns.id, e.run_id))
    .where(and(eq(schema.buildRuns.lab_id, labId), isNotNull(e.supersedes)))).map(r => r.s))
  const effective = rows.filter(r => !corrected.has(r.id))
  const routeIds = [...new Set(effective.map(r => r.route_id))]
  const routes = new Map<number, RouteRow>()
  for (let k = 0; k < routeIds.length; k += 500) {
    for (const r of await db.select().from(schema.routes).where(inArray(schema.routes.id, routeIds.slice(k, k + 500)))) routes.set(r.id, r)
  }
  const attempts: Attempt[] = []
  for (const r of effective) {
    const route = routes.get(r.route_id)
    const move = route ? routeResult(route).moves?.[r.move_index] : undefined
    if (!route || !move) continue
    const lattice = routeInput(route).lattice
    const symmetry = lattice ? latticeSymmetry(lattice.a1, lattice.a2) : null
    const p = { ...r.run_params, ...r.params } as { bias_V?: number, setpoint_A?: number }
    attempts.push({
      outcome: r.outcome,
      length_nm: move.length_nm,
      symmetry_deg: symmetry,
      angle_deg: lattice && symmetry ? moveDirection(move.path as Pt[], lattice.a1, symmetry) : null,
      bias_V: typeof p.bias_V === 'number' ? p.bias_V : null,
      setpoint_A: typeof p.setpoint_A === 'number' ? p.setpoint_A : null,
    })
  }
  return tallyRates(attempts)
}
