import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import { toScanFrame, type FitFrame } from '#shared/blueprint/frame'
import { forecastMoves } from '#shared/logbook'
import type { Role } from '#shared/roles'
import { MAX_ROUTE_POINTS, validateRouteInput } from '#shared/route/schema'
import type { Point, RouteOutput } from '#shared/route/types'
import { withLabDefaults } from '#shared/schemas/lab'
import type { RouteOptionsSaved } from '#shared/types/route'
import type { BlueprintRow } from './blueprints'
import type { Db } from './db'
import type { ScanRow } from './scans'

// Saved routes: the plan context they are solved from (a scan's latest marks, the blueprint's
// sites through that scan's latest lattice fit), the solve in the worker pool with a time limit,
// progress as server-sent events when the client asks for them, and the saved row.

export type RouteDbRow = typeof schema.routes.$inferSelect

const bad = (field: string, message: string) => createError({ statusCode: 400, message: `${field}: ${message}`, data: { field } })

/** The route behind an id, for a caller with at least `role` in its lab (401/404/403 otherwise). */
export async function routeForCaller(event: H3Event, role: Role) {
  await requireUserId(event)
  const id = idParam(event, 'routeId')
  const db = await useDb()
  const route = await db.query.routes.findFirst({ where: eq(schema.routes.id, id) })
  if (!route) throw createError({ statusCode: 404, message: 'No such route' })
  const access = await requireRowLab(event, route.lab_id, role, 'route')
  return { db, route, access }
}

export interface PlanFromScan {
  scan: ScanRow
  marksVersion: number
  atoms: Point[]
  sites: Point[]
  siteKeys: Array<[number, number, number]>
  lattice: { a1: Point, a2: Point, origin: Point }
  fit: { id: number, version: number }
}

/**
 * Atoms from a scan's latest marks, sites from the blueprint through the scan's latest lattice fit
 * (registered to `referenceScanId` when the plan was made on another scan: a re-plan from a newer
 * scan keeps the structure where it was being built).
 */
export async function planFromScan(db: Db, blueprint: BlueprintRow, scanId: number, referenceScanId?: number | null): Promise<PlanFromScan> {
  const scan = await db.query.scans.findFirst({ where: eq(schema.scans.id, scanId) })
  if (!scan || scan.lab_id !== blueprint.lab_id) throw createError({ statusCode: 404, message: 'scan_id: no such scan in this lab', data: { field: 'scan_id' } })
  if (scan.sample_id !== blueprint.sample_id) throw bad('scan_id', `scan ${scan.id} is of another sample than the blueprint`)
  const fit = await latestFit(db, scan.id)
  if (!fit) throw bad('lattice_fit', `scan ${scan.id} has no lattice fit yet: register the lattice before solving a route`)
  if (fit.surface !== blueprint.surface || fit.site !== blueprint.site) {
    throw bad('lattice_fit', `the lattice fit of scan ${scan.id} registers ${fit.site} sites of ${fit.surface}, the blueprint is drawn on ${blueprint.site} sites of ${blueprint.surface}`)
  }
  const marks = await latestMarks(db, scan.id)
  if (!marks || marks.count === 0) throw bad('marks', `scan ${scan.id} has no marks yet: detect or add the adatoms first`)
  const expanded = await compute400(() => expandRow(blueprint))
  if (!expanded.sites.length) throw bad('sites', 'the blueprint has no sites')
  if (marks.count + expanded.sites.length > MAX_ROUTE_POINTS) {
    throw bad('marks', `${marks.count} marks and ${expanded.sites.length} sites exceed the route limit of ${MAX_ROUTE_POINTS} atoms + sites`)
  }
  const frame = fit.result as unknown as FitFrame
  // Registered to the given scan, else to the scan the blueprint was drawn on.
  referenceScanId ??= blueprint.scan_id
  const sites = referenceScanId && referenceScanId !== scan.id
    ? (await registeredSitesOn(db, blueprint, scan, fit, referenceScanId)).sites
    : await compute400(() => toScanFrame(expanded.sites, frame)) as Point[]
  return {
    scan,
    marksVersion: marks.version,
    atoms: marks.marks.map(m => [m.x_nm, m.y_nm] as Point),
    sites,
    siteKeys: expanded.sites.map(s => [s.i, s.j, s.b ?? 0] as [number, number, number]),
    lattice: { a1: frame.a1 as Point, a2: frame.a2 as Point, origin: frame.origin as Point },
    fit: { id: fit.id, version: fit.version },
  }
}

export interface SolveJob {
  labId: number
  userId: number
  blueprintId: number
  scanId: number | null
  parentId: number | null
  input: { atoms: Point[], sites: Point[], lattice: PlanFromScan['lattice'] | null, clearance_nm?: number, cost?: 'distance' | 'squared' }
  siteKeys: Array<[number, number, number]>
  /** Solver options besides the time settings (which come from the lab). */
  options: { locked?: number[], excluded?: number[], keep_out?: Point[][], placed?: Array<[number, number]> }
  saved: Omit<RouteOptionsSaved, 'time' | 'time_limit_ms'>
}

function wantsStream(event: H3Event) {
  return (getRequestHeader(event, 'accept') ?? '').includes('text/event-stream')
}

function errorBody(e: unknown) {
  const err = e as { statusCode?: number, message?: string, data?: unknown }
  return { statusCode: err.statusCode ?? 500, message: err.message ?? 'The route could not be solved', data: err.data }
}

/**
 * Solves in the worker pool and saves the route as a new row. With `Accept: text/event-stream`
 * the answer is a stream of `progress` events ({ fraction, stage, elapsed_ms }, also once a
 * second while the solver works) ending in one `result` event (the saved route) or one `error`
 * event ({ statusCode, message, data }); otherwise 201 with the saved route as JSON.
 * Input problems are found before the stream opens, so they are plain 400 answers either way.
 */
export async function solveAndSave(event: H3Event, db: Db, job: SolveJob) {
  const lab = await db.query.labs.findFirst({ where: eq(schema.labs.id, job.labId) })
  const time = withLabDefaults(lab?.settings)
  const limit = Number(useRuntimeConfig().routeTimeLimitMs) || 180_000
  const { lattice, ...rest } = job.input
  const input = { ...rest, ...(lattice && { lattice }) }
  await compute400(() => validateRouteInput({ ...input, ...job.options }))
  const kind = job.options.placed ? 'replan' as const : 'route' as const
  const started = Date.now()

  const run = async (onProgress?: (fraction: number, stage: string) => void) => {
    const out = await runCompute<RouteOutput>({ kind, input: kind === 'replan' ? { ...input, placed: job.options.placed } : input, options: { ...job.options, time } }, { timeout_ms: limit, onProgress })
    const result = { ...out, atoms: job.input.atoms, sites: job.input.sites, site_keys: job.siteKeys, lattice, timings: { solver_ms: out.solver_ms, wall_ms: Date.now() - started } }
    const [row] = await db.insert(schema.routes).values({
      lab_id: job.labId, blueprint_id: job.blueprintId, scan_id: job.scanId, parent_id: job.parentId,
      options: { ...job.saved, time, time_limit_ms: limit }, result,
      move_count: out.moves.length, total_length_nm: out.total_length_nm, solver_ms: out.solver_ms, created_by: job.userId,
    }).returning()
    await audit(db, { labId: job.labId, userId: job.userId, action: kind === 'replan' ? 'route.replan' : 'route.solve', target: `route:${row!.id}`, detail: { blueprint_id: job.blueprintId, parent_id: job.parentId, moves: out.moves.length } })
    return routeView(db, row!)
  }

  if (!wantsStream(event)) {
    const view = await run()
    setResponseStatus(event, 201)
    return view
  }
  const stream = createEventStream(event)
  const send = (name: string, data: unknown) => void stream.push({ event: name, data: JSON.stringify(data) })
  let last = { fraction: 0, stage: 'queued' }
  const tick = () => send('progress', { ...last, elapsed_ms: Date.now() - started })
  tick()
  const beat = setInterval(tick, 1000)
  run((fraction, stage) => {
    last = { fraction, stage }
    tick()
  })
    .then(view => send('result', view))
    .catch(e => send('error', errorBody(e)))
    .finally(() => {
      clearInterval(beat)
      void stream.close()
    })
  return stream.send()
}

/**
 * A saved route with its blueprint version and author, as the API returns it, and a forecast
 * from the lab's logged success rates on this sample (null figures until enough moves exist):
 * the expected number of placed atoms and the time with retries.
 */
export async function routeView(db: Db, row: RouteDbRow) {
  const [bp, author] = await Promise.all([
    db.query.blueprints.findFirst({ where: eq(schema.blueprints.id, row.blueprint_id), columns: { id: true, lineage: true, version: true, name: true, sample_id: true } }),
    db.query.users.findFirst({ where: eq(schema.users.id, row.created_by), columns: { name: true } }),
  ])
  const moves = ((row.result as { moves?: { length_nm: number, estimate_s?: number }[] }).moves ?? [])
  const forecast = forecastMoves(moves, await labRates(db, row.lab_id, bp?.sample_id))
  return { ...row, blueprint: bp ?? null, author: author?.name ?? null, forecast }
}
