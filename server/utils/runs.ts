import type { H3Event } from 'h3'
import { and, asc, desc, eq, inArray } from 'drizzle-orm'
import type { Role } from '#shared/roles'
import { deriveRunState, type EntrySnap, type RouteSnap, type RunState } from '#shared/logbook'
import type { Db } from './db'
import type { RouteDbRow } from './routes'

// Build runs: loading a run with the routes it followed and its logbook, and deriving where it
// stands (shared/logbook does the derivation; this file only reads the rows).

export type RunRow = typeof schema.buildRuns.$inferSelect
export type EntryRow = typeof schema.logbookEntries.$inferSelect

/** The run behind :runId for a caller with at least `role` in its lab (401/404/403). */
export async function runForCaller(event: H3Event, role: Role) {
  await requireUserId(event)
  const id = idParam(event, 'runId')
  const db = await useDb()
  const run = await db.query.buildRuns.findFirst({ where: eq(schema.buildRuns.id, id) })
  if (!run) throw createError({ statusCode: 404, message: 'No such run' })
  const access = await requireRowLab(event, run.lab_id, role, 'run')
  return { db, run, access }
}

export async function runEntries(db: Db, runId: number): Promise<EntryRow[]> {
  return db.select().from(schema.logbookEntries).where(eq(schema.logbookEntries.run_id, runId)).orderBy(asc(schema.logbookEntries.seq))
}

/** The routes from the run's first route to its current one (following parent links). */
export async function runRoutes(db: Db, run: Pick<RunRow, 'route_id' | 'current_route_id'>): Promise<Map<number, RouteDbRow>> {
  const rows = new Map<number, RouteDbRow>()
  let id: number | null = run.current_route_id
  while (id !== null && !rows.has(id)) {
    const row: RouteDbRow | undefined = await db.query.routes.findFirst({ where: eq(schema.routes.id, id) })
    if (!row) break
    rows.set(id, row)
    if (id === run.route_id) break
    id = row.parent_id
  }
  return rows
}

export function entrySnap(e: EntryRow): EntrySnap {
  return { id: e.id, seq: e.seq, route_id: e.route_id, move_index: e.move_index, outcome: e.outcome, position: e.position ?? null, supersedes: e.supersedes ?? null }
}

export interface LoadedRun { run: RunRow, routes: Map<number, RouteDbRow>, snaps: Map<number, RouteSnap>, entries: EntryRow[], state: RunState }

/** A fresh read of the run, its routes and entries, with the derived state. */
export async function loadRun(db: Db, runId: number): Promise<LoadedRun> {
  const run = await db.query.buildRuns.findFirst({ where: eq(schema.buildRuns.id, runId) })
  if (!run) throw createError({ statusCode: 404, message: 'No such run' })
  const [routes, entries] = await Promise.all([runRoutes(db, run), runEntries(db, run.id)])
  const snaps = new Map([...routes].map(([id, r]) => [id, routeSnap(r, run.id)]))
  const state = deriveRunState(snaps, run.route_id, run.current_route_id, entries.map(entrySnap))
  return { run, routes, snaps, entries, state }
}

/** Names of users by id, for authors in the logbook. */
export async function userNames(db: Db, ids: number[]): Promise<Map<number, string>> {
  const unique = [...new Set(ids)]
  if (!unique.length) return new Map()
  const rows = await db.select({ id: schema.users.id, name: schema.users.name }).from(schema.users).where(inArray(schema.users.id, unique))
  return new Map(rows.map(r => [r.id, r.name]))
}

/** As-built checks recorded against a run, newest first. */
export async function runChecks(db: Db, runId: number) {
  return db.select().from(schema.asBuiltChecks).where(eq(schema.asBuiltChecks.run_id, runId)).orderBy(desc(schema.asBuiltChecks.created_at), desc(schema.asBuiltChecks.id))
}

export async function latestRunCheck(db: Db, labId: number, runId: number) {
  return db.query.asBuiltChecks.findFirst({ where: and(eq(schema.asBuiltChecks.lab_id, labId), eq(schema.asBuiltChecks.run_id, runId)), orderBy: [desc(schema.asBuiltChecks.created_at), desc(schema.asBuiltChecks.id)] })
}
