// Route solver: optimal rectangular assignment of atoms to sites in the drag metric (Kuhn–Munkres,
// or shortest augmenting paths with duality pricing at scale), then an ordered move list whose
// paths keep the clearance rule at every moment (see plan.ts), then a replay check and a time estimate.
import { InputError } from '../errors'
import { pairLength, solveAssignment } from './assign'
import { Occupancy } from './clearance'
import { checkMoves } from './check'
import { Clock } from './clock'
import { makeZone, zoneContains } from './geometry'
import { boundsOf, gridOf } from './grid'
import { makeMetric, pathLength } from './metric'
import { planMoves, type Task } from './plan'
import { validateRouteInput, type RouteInput } from './schema'
import { estimateTime } from './time'
import type { Move, Point, RouteOptions, RouteOutput, RouteWarning } from './types'

/** An atom this close to a site already fills it (contract). */
export const ON_SITE_NM = 0.05
export const DEFAULT_CLEARANCE_NM = 0.5

function checkIndices(list: number[] | undefined, n: number, field: string): number[] {
  const out = list ?? []
  out.forEach((i, k) => {
    if (!Number.isInteger(i) || i < 0 || i >= n) throw new InputError(`${field}.${k}`, `atom ${i} does not exist (there are ${n})`)
  })
  return out
}

export function solveRoute(raw: RouteInput | unknown, options: RouteOptions = {}): RouteOutput {
  const clock = new Clock(options.deadline_ms, options.onProgress)
  clock.progress(0, 'validate')
  const inp = validateRouteInput(raw)
  const atoms = inp.atoms as Point[], sites = inp.sites as Point[]
  const nA = atoms.length, nS = sites.length
  const clearance = inp.clearance_nm ?? DEFAULT_CLEARANCE_NM
  const locked = new Set(checkIndices(options.locked ?? inp.locked, nA, 'locked'))
  const excluded = new Set(checkIndices(options.excluded ?? inp.excluded, nA, 'excluded'))
  const placed = options.placed ?? (inp.placed as Array<[number, number]> | undefined) ?? []
  placed.forEach(([s, a], k) => {
    if (!Number.isInteger(s) || s < 0 || s >= nS) throw new InputError(`placed.${k}.0`, `site ${s} does not exist`)
    if (!Number.isInteger(a) || a < 0 || a >= nA) throw new InputError(`placed.${k}.1`, `atom ${a} does not exist`)
  })
  const keepOut = (options.keep_out ?? inp.keep_out ?? []) as Point[][]
  keepOut.forEach((poly, k) => { if (poly.length < 3) throw new InputError(`keep_out.${k}`, 'a polygon needs at least 3 corners') })
  const zones = keepOut.map(makeZone)
  const metric = makeMetric(inp.lattice as { a1: Point, a2: Point } | undefined)
  const bounds = boundsOf(atoms, sites, ...keepOut)
  const warnings: RouteWarning[] = []

  // Sites already filled: re-plan pairs first, then atoms within ON_SITE_NM (nearest pairs first).
  const filledBy = new Int32Array(nS).fill(-1)
  const used = new Uint8Array(nA)
  for (const [s, a] of placed) {
    if (filledBy[s] !== -1 || used[a]) continue
    filledBy[s] = a; used[a] = 1; locked.add(a)
  }
  const siteGrid = gridOf(sites, 2, bounds, ON_SITE_NM)
  const close: Array<[number, number, number]> = []
  atoms.forEach((p, a) => {
    if (used[a] || excluded.has(a)) return
    siteGrid.inRadius(p[0], p[1], ON_SITE_NM, (s, d2) => { close.push([d2, a, s]) })
  })
  close.sort((x, y) => x[0] - y[0])
  for (const [, a, s] of close) if (!used[a] && filledBy[s] === -1) { filledBy[s] = a; used[a] = 1 }

  const freeSites: number[] = [], freeAtoms: number[] = []
  for (let s = 0; s < nS; s++) {
    if (filledBy[s] !== -1) continue
    if (zones.some(z => zoneContains(z, sites[s]![0], sites[s]![1]))) {
      warnings.push({ kind: 'unreachable', move: -1, atom: -1, site: s, message: `site ${s} lies inside a keep-out polygon` })
      continue
    }
    freeSites.push(s)
  }
  for (let a = 0; a < nA; a++) {
    if (used[a] || locked.has(a) || excluded.has(a)) continue
    if (zones.some(z => zoneContains(z, atoms[a]![0], atoms[a]![1]))) continue
    freeAtoms.push(a)
  }

  clock.progress(0.05, 'assign')
  const costKind = inp.cost ?? 'distance'
  const asg = solveAssignment({
    atoms, sites, atomIds: freeAtoms, siteIds: freeSites, metric, cost: costKind, zones,
    mode: options.assignment ?? 'auto', sparseK: options.sparse_k,
  }, clock)

  clock.progress(0.6, 'order')
  const tasks: Task[] = asg.pairs.map(([atom, site]) => ({ atom, site }))
  const occ = new Occupancy(atoms, bounds, clearance, zones)
  const pairCost = (a: number, s: number) => {
    const d = pairLength(metric, zones, atoms[a]![0], atoms[a]![1], sites[s]![0], sites[s]![1])
    return costKind === 'squared' ? d * d : d
  }
  const planned = planMoves({
    atoms, sites, tasks, metric, occ, bounds, clock, pairCost,
    origin: inp.lattice ? (inp.lattice.origin as Point) : undefined,
  })

  clock.progress(0.9, 'check')
  warnings.push(...checkMoves(atoms, planned, clearance, zones, bounds))
  const timeEst = estimateTime(planned.map(m => ({ length_nm: pathLength(m.path) })), options.time ?? inp.time)
  const moves: Move[] = planned.map((m, i) => ({
    atom: m.atom, site: m.site, path: m.path, length_nm: pathLength(m.path), kind: m.kind,
    segments: m.path.length - 1, estimate_s: timeEst.per_move_s[i]!, phase: m.phase,
  }))
  const assignment: Array<[number, number]> = []
  for (let s = 0; s < nS; s++) if (filledBy[s] !== -1) assignment.push([filledBy[s]!, s])
  for (const t of tasks) assignment.push([t.atom, t.site])
  assignment.sort((x, y) => x[1] - y[1])
  const filled = new Uint8Array(nS)
  for (const [, s] of assignment) filled[s] = 1
  const unfilled_sites: number[] = []
  for (let s = 0; s < nS; s++) if (!filled[s]) unfilled_sites.push(s)
  const total = moves.reduce((t, m) => t + m.length_nm, 0)
  const lb = Math.min(asg.lowerBound, total)
  clock.progress(1, 'done')
  return {
    assignment,
    moves,
    total_length_nm: total,
    lower_bound_nm: lb,
    lower_bound_exact: asg.lowerBoundExact,
    unfilled_sites,
    solver_ms: clock.elapsed(),
    parking_moves: moves.filter(m => m.kind === 'parking').length,
    detours: planned.filter(m => m.detour).length,
    warnings,
    exact: asg.exact,
    ratio_to_lower_bound: lb > 0 ? total / lb : total === 0 ? 1 : null,
    // The planner may trade sites between moves at equal cost; report the final pairs' cost.
    assignment_cost: tasks.reduce((t, k) => t + pairCost(k.atom, k.site), 0),
    assignment_method: asg.method,
    directions: metric.dirs,
    time: timeEst,
  }
}
