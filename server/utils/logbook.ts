import { and, eq, sql } from 'drizzle-orm'
import type { EntryInput } from '#shared/logbook'
import type { Db } from './db'
import type { EntryRow } from './runs'

// Appending to a run's logbook. Entries are never updated or deleted. Each append reads the run,
// checks the entry against what it sees (current move, expected seq, the entry a correction
// supersedes) and inserts with seq = last + 1 only while the run is still open on the same route;
// the unique (run, seq) index turns a concurrent append into a retry with a fresh read, so that
// entries from several operators all land, in order, with contiguous seq. The unique
// (run, idempotency_key) index makes a retried request return the entry it already created.

const MAX_TRIES = 40

function conflict(message: string, data: Record<string, unknown>) {
  return createError({ statusCode: 409, message, data })
}

async function byKey(db: Db, runId: number, key: string): Promise<EntryRow | undefined> {
  return db.query.logbookEntries.findFirst({ where: and(eq(schema.logbookEntries.run_id, runId), eq(schema.logbookEntries.idempotency_key, key)) })
}

function replayOf(existing: EntryRow, body: EntryInput) {
  if (existing.move_index !== body.move_index || existing.outcome !== body.outcome || (existing.supersedes ?? undefined) !== body.supersedes) {
    throw conflict(`idempotency_key: this key was already used for entry ${existing.seq} (move ${existing.move_index + 1}, ${existing.outcome}). Send a new key for a new entry.`, { field: 'idempotency_key', seq: existing.seq })
  }
  return { entry: existing, replayed: true }
}

const isUnique = (e: unknown) => /UNIQUE/i.test(String((e as Error)?.message ?? '')) || /UNIQUE/i.test(String((e as { cause?: Error })?.cause?.message ?? ''))

export async function appendEntry(db: Db, runId: number, userId: number, body: EntryInput): Promise<{ entry: EntryRow, replayed: boolean }> {
  let firstRoute: number | undefined
  for (let attempt = 0; attempt < MAX_TRIES; attempt++) {
    const existing = await byKey(db, runId, body.idempotency_key)
    if (existing) return replayOf(existing, body)
    const { run, state, entries } = await loadRun(db, runId)
    firstRoute ??= run.current_route_id
    if (run.state !== 'open') throw conflict('This run is closed: nothing more can be logged in it. Start a new run to go on.', { field: 'run', state: run.state })
    if (body.expected_seq !== undefined && body.expected_seq !== state.last_seq) {
      const behind = state.last_seq - body.expected_seq
      throw conflict(`The logbook has ${behind > 0 ? `${behind} entr${behind === 1 ? 'y' : 'ies'} you have not seen yet` : 'changed'}: refresh before logging. Nothing was logged.`, { field: 'expected_seq', last_seq: state.last_seq })
    }
    let routeId = run.current_route_id
    if (body.supersedes !== undefined) {
      const target = entries.find(e => e.id === body.supersedes)
      if (!target) throw createError({ statusCode: 400, message: `supersedes: there is no entry ${body.supersedes} in this run`, data: { field: 'supersedes' } })
      const by = state.superseded_by[target.id]
      if (by !== undefined) throw conflict(`Entry ${target.seq} was already corrected by entry ${entries.find(e => e.id === by)?.seq ?? by}: refresh and correct that one instead.`, { field: 'supersedes', last_seq: state.last_seq })
      if (target.move_index !== body.move_index) throw createError({ statusCode: 400, message: `move_index: a correction keeps the move of the entry it corrects (move ${target.move_index + 1})`, data: { field: 'move_index' } })
      routeId = target.route_id
    }
    else {
      const expectRoute = body.route_id ?? firstRoute
      if (run.current_route_id !== expectRoute) throw conflict('The remaining moves were re-planned meanwhile: refresh to see the new plan. Nothing was logged.', { field: 'route_id', current_route_id: run.current_route_id, last_seq: state.last_seq })
      if (state.current_move === null) throw conflict('Every move of the current plan has an outcome: re-plan the remaining sites or close the run.', { field: 'move_index', current_move: null, last_seq: state.last_seq })
      if (body.move_index !== state.current_move) {
        throw conflict(`Move ${body.move_index + 1} is not the current move (move ${state.current_move + 1} is): refresh the run. Nothing was logged.`, { field: 'move_index', current_move: state.current_move, last_seq: state.last_seq })
      }
    }
    try {
      const res = await db.run(sql`INSERT INTO logbook_entries (run_id, seq, route_id, move_index, outcome, params, position, note, supersedes, idempotency_key, author_id, created_at)
        SELECT ${runId}, ${state.last_seq + 1}, ${routeId}, ${body.move_index}, ${body.outcome}, ${JSON.stringify(body.params ?? {})},
          ${body.position ? JSON.stringify(body.position) : null}, ${body.note ?? ''}, ${body.supersedes ?? null}, ${body.idempotency_key}, ${userId}, ${Date.now()}
        WHERE EXISTS (SELECT 1 FROM build_runs WHERE id = ${runId} AND state = 'open' AND current_route_id = ${run.current_route_id})`)
      // No row: the run was closed or re-planned between the read and the insert; read again.
      if (res.rowsAffected === 0) continue
    }
    catch (e) {
      if (isUnique(e)) continue
      throw e
    }
    const entry = await byKey(db, runId, body.idempotency_key)
    if (entry) return { entry, replayed: false }
  }
  throw createError({ statusCode: 503, message: 'The logbook is very busy right now; nothing was logged. Try again.' })
}
