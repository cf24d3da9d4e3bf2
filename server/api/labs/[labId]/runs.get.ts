import { and, count, desc, eq, inArray, isNotNull, notInArray } from 'drizzle-orm'
import { z } from 'zod'

const Query = z.object({
  build: z.coerce.number().int().positive().optional(),
  state: z.enum(['open', 'closed']).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(50),
})

// The lab's build runs, newest first, with their build, who started them, how many moves were
// logged and placed, and the fidelity of the latest as-built check recorded against each.
export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'viewer')
  const q = parseQuery400(event, Query)
  const db = await useDb()
  const r = schema.buildRuns
  const runs = await db.select({
    id: r.id, build_id: r.build_id, build_name: schema.builds.name, route_id: r.route_id, current_route_id: r.current_route_id,
    state: r.state, started_at: r.started_at, closed_at: r.closed_at, started_by: schema.users.name, moves_total: schema.routes.move_count,
  }).from(r)
    .innerJoin(schema.users, eq(schema.users.id, r.started_by))
    .innerJoin(schema.routes, eq(schema.routes.id, r.current_route_id))
    .leftJoin(schema.builds, eq(schema.builds.id, r.build_id))
    .where(and(eq(r.lab_id, access.labId), q.build ? eq(r.build_id, q.build) : undefined, q.state ? eq(r.state, q.state) : undefined))
    .orderBy(desc(r.started_at), desc(r.id))
    .limit(q.limit)
  const ids = runs.map(x => x.id)
  if (!ids.length) return []
  const e = schema.logbookEntries
  // Effective entries only: an entry that a later one corrects is not counted.
  const corrected = db.select({ id: e.supersedes }).from(e).where(and(inArray(e.run_id, ids), isNotNull(e.supersedes)))
  const tallies = await db.select({ run_id: e.run_id, outcome: e.outcome, n: count() }).from(e)
    .where(and(inArray(e.run_id, ids), notInArray(e.id, corrected)))
    .groupBy(e.run_id, e.outcome)
  const checks = await db.select({ run_id: schema.asBuiltChecks.run_id, fidelity: schema.asBuiltChecks.fidelity, created_at: schema.asBuiltChecks.created_at, id: schema.asBuiltChecks.id })
    .from(schema.asBuiltChecks).where(inArray(schema.asBuiltChecks.run_id, ids)).orderBy(desc(schema.asBuiltChecks.created_at), desc(schema.asBuiltChecks.id))
  return runs.map((run) => {
    const mine = tallies.filter(t => t.run_id === run.id)
    return {
      ...run,
      entries: mine.reduce((s, t) => s + t.n, 0),
      placed: mine.find(t => t.outcome === 'placed')?.n ?? 0,
      fidelity: checks.find(c => c.run_id === run.id)?.fidelity ?? null,
    }
  })
})
