import { eq } from 'drizzle-orm'
import { forecastMoves } from '#shared/logbook'
import type { Db } from './db'
import type { LoadedRun } from './runs'

// What GET /api/runs/:runId answers: the run, the route being followed with its frame, every
// logbook entry with its author, the derived state, the plan's history and a forecast from the
// lab's success rates.

export async function runView(db: Db, loaded: LoadedRun, role: string) {
  const { run, routes, snaps, entries, state } = loaded
  const current = routes.get(run.current_route_id)!
  const snap = snaps.get(current.id)!
  const result = routeResult(current)
  const input = routeInput(current)
  const [blueprint, scan, build] = await Promise.all([
    db.query.blueprints.findFirst({ where: eq(schema.blueprints.id, current.blueprint_id) }),
    current.scan_id ? db.query.scans.findFirst({ where: eq(schema.scans.id, current.scan_id) }) : undefined,
    run.build_id ? db.query.builds.findFirst({ where: eq(schema.builds.id, run.build_id) }) : undefined,
  ])
  const sample = blueprint ? await db.query.samples.findFirst({ where: eq(schema.samples.id, blueprint.sample_id) }) : undefined
  const names = await userNames(db, [run.started_by, ...(run.closed_by ? [run.closed_by] : []), ...entries.map(e => e.author_id), ...[...routes.values()].map(r => r.created_by)])
  const checks = await runChecks(db, run.id)
  const perMove = result.time?.per_move_s ?? []
  const done = new Set(state.done_moves)
  const remaining = snap.moves.map((m, i) => ({ i, length_nm: m.length_nm, estimate_s: perMove[i] ?? m.estimate_s ?? 0 }))
    .filter(m => !done.has(m.i))
  const rates = await labRates(db, run.lab_id, sample?.id)
  return {
    role,
    run: { ...run, started_by_name: names.get(run.started_by) ?? '', closed_by_name: run.closed_by ? names.get(run.closed_by) ?? '' : null },
    build: build ? { id: build.id, name: build.name } : null,
    sample: sample ? { id: sample.id, name: sample.name, surface: sample.surface, adsorbate: sample.adsorbate, temperature_K: sample.temperature_K } : null,
    blueprint: blueprint ? { id: blueprint.id, name: blueprint.name, version: blueprint.version, site_count: blueprint.site_count } : null,
    frame: scan ? { scan_id: scan.id, filename: scan.filename, size_x_nm: scan.size_x_nm, size_y_nm: scan.size_y_nm, offset_x_nm: scan.offset_x_nm, offset_y_nm: scan.offset_y_nm, rotation_deg: scan.rotation_deg } : null,
    route: {
      id: current.id, parent_id: current.parent_id, created_at: current.created_at,
      moves: snap.moves.map((m, i) => ({ atom: m.atom, atom_id: snap.atom_ids[m.atom] ?? m.atom, site: m.site, path: m.path, length_nm: m.length_nm, kind: m.kind ?? 'direct', estimate_s: perMove[i] ?? null })),
      sites: snap.sites, atoms: snap.atoms, atom_ids: snap.atom_ids, lattice: input.lattice ?? null,
      unfilled_sites: result.unfilled_sites ?? [], warnings: result.warnings ?? [], total_length_nm: current.total_length_nm,
      time_s: result.time?.total_s ?? null,
    },
    entries: entries.map(e => ({ ...e, author: names.get(e.author_id) ?? '', superseded_by: state.superseded_by[e.id] ?? null })),
    state,
    history: state.chain.map((id) => {
      const r = routes.get(id)!
      const meta = routeMeta(r)
      return { id, parent_id: r.parent_id, created_at: r.created_at, source: meta.source ?? 'plan', reason: meta.reason ?? null, base_seq: meta.run_id === run.id ? meta.base_seq ?? 0 : 0, scan_id: r.scan_id, move_count: r.move_count, total_length_nm: r.total_length_nm, created_by: names.get(r.created_by) ?? '' }
    }),
    checks: checks.map(c => ({ id: c.id, scan_id: c.scan_id, blueprint_id: c.blueprint_id, fidelity: c.fidelity, rms_nm: c.rms_nm, tolerance_nm: c.tolerance_nm, created_at: c.created_at })),
    forecast: forecastMoves(remaining, rates),
    rates: { attempts: rates.attempts, placed: rates.placed, rate: rates.rate, enough: rates.enough, min_attempts: rates.min_attempts },
  }
}
