// Move ordering by topological sort (Kahn 1962) of a precedence graph built from the clearance
// rule: if move k's path brushes past atom j's start, j moves first; if it brushes past j's site,
// k moves first. Ties go to sites nearer the blueprint's centre (interior before outline), then
// by angle (round a ring in sequence); a move that must precede another inherits its priority,
// and no move runs ahead of the innermost unfinished band of 2·clearance, so that a move left
// waiting is resolved while the structure around it is still open rather than walled in. Every
// move is re-checked against the positions at its turn; cycles are broken by an A* detour (not
// repeated until an atom came or went nearby), or by parking an atom and finishing it last.
import type { Clock } from './clock'
import { CLEARANCE_EPS_NM, type Occupancy } from './clearance'
import { detourMargin, findDetour } from './detour'
import { segPointDist2 } from './geometry'
import { PointGrid, type Bounds } from './grid'
import type { Metric } from './metric'
import { findParking } from './parking'
import { inheritPriority, KeyHeap } from './priority'
import type { MoveKind, Point } from './types'

export interface Task { atom: number, site: number }

export interface PlannedMove {
  atom: number
  site: number
  path: Point[]
  kind: MoveKind
  detour: boolean
  /** How the planner got to this move (diagnostics): in order, retried, cycle break, parking, forced. */
  phase: 'ready' | 'retry' | 'cycle' | 'park' | 'forced'
}

export interface PlanInput {
  atoms: Point[]
  sites: Point[]
  tasks: Task[]
  metric: Metric
  occ: Occupancy
  bounds: Bounds
  origin?: Point
  clock?: Clock
  /** The assignment's cost of a pair (atom, site): moves may trade sites where this sum is unchanged. */
  pairCost?: (atom: number, site: number) => number
}

const PENDING = 0, PARKED = 1, DONE = 2
const BAND_SLACK = 0

/** Plans the moves; may trade sites between moves at equal cost, so read the final pairs from tasks. */
export function planMoves(inp: PlanInput): PlannedMove[] {
  const { tasks, metric, occ, sites, clock } = inp
  const T = tasks.length
  const c = occ.clearance_nm
  const cell = Math.max(c, 0.25)
  const startGrid = new PointGrid(inp.bounds, cell, T), siteGrid = new PointGrid(inp.bounds, cell, T)
  const allSites = new PointGrid(inp.bounds, cell, sites.length)
  sites.forEach((s, i) => allSites.insert(i, s[0], s[1]))
  const isTaskAtom = new Uint8Array(occ.grid.xs.length)
  const taskOfAtom = new Int32Array(occ.grid.xs.length).fill(-1)
  tasks.forEach((t, k) => {
    startGrid.insert(k, occ.x(t.atom), occ.y(t.atom))
    const s = sites[t.site]!
    siteGrid.insert(k, s[0], s[1])
    isTaskAtom[t.atom] = 1
    taskOfAtom[t.atom] = k
  })
  // Precedence graph from the better of the (one or two) shortest paths of each move.
  // succA[j]: moves whose path passes j's start; succB[k]: moves whose site k's path passes.
  const succA: number[][] = Array.from({ length: T }, () => [])
  const succB: number[][] = Array.from({ length: T }, () => [])
  const indegA = new Int32Array(T), indegB = new Int32Array(T)
  const stamp = new Int32Array(T).fill(-1)
  let mark = 0
  const near = (grid: PointGrid, k: number, path: Point[], out: number[]) => {
    mark++
    const p = path[0]!, s = path[path.length - 1]!
    for (let i = 1; i < path.length; i++) {
      const a = path[i - 1]!, b = path[i]!
      grid.nearSegment(a[0], a[1], b[0], b[1], c, (j) => {
        if (j === k || stamp[j] === mark) return false
        const qx = grid.xs[j]!, qy = grid.ys[j]!
        const thr = Math.min(c, Math.hypot(qx - p[0], qy - p[1]), Math.hypot(qx - s[0], qy - s[1])) - CLEARANCE_EPS_NM
        if (thr > 0 && segPointDist2(a[0], a[1], b[0], b[1], qx, qy) < thr * thr) { stamp[j] = mark; out.push(j) }
        return false
      })
    }
  }
  const analyse = (k: number) => {
    const t = tasks[k]!, s = sites[t.site]!
    let best: { A: number[], B: number[], score: number } | undefined
    for (const cand of metric.directPaths(occ.x(t.atom), occ.y(t.atom), s[0], s[1])) {
      const blockedStatic = occ.blocker(t.atom, cand, q => isTaskAtom[q] === 1) !== -1
      const A: number[] = [], B: number[] = []
      near(startGrid, k, cand, A)
      near(siteGrid, k, cand, B)
      const score = (blockedStatic ? 1e6 : 0) + A.length + B.length
      if (!best || score < best.score) best = { A, B, score }
    }
    return best!
  }
  // Atoms are identical, so two moves may trade sites when that costs nothing. Where atom j sits on
  // k's path and so does j's site (j must go first and last at once), the trade often lets j take
  // k's farther site at equal total length (collinear moves, ties of the lattice norm).
  if (inp.pairCost) {
    const cost = inp.pairCost
    for (let pass = 0; pass < 3; pass++) {
      let swaps = 0
      for (let k = 0; k < T; k++) {
        if ((k & 255) === 0) clock?.check()
        const info = analyse(k)
        for (const j of info.A) {
          if (!info.B.includes(j)) continue
          const tk = tasks[k]!, tj = tasks[j]!
          const before = cost(tk.atom, tk.site) + cost(tj.atom, tj.site)
          const after = cost(tk.atom, tj.site) + cost(tj.atom, tk.site)
          if (after > before + 1e-9 * (1 + before)) continue
          const sk = tk.site
          tk.site = tj.site
          tj.site = sk
          siteGrid.move(k, sites[tk.site]![0], sites[tk.site]![1])
          siteGrid.move(j, sites[tj.site]![0], sites[tj.site]![1])
          swaps++
          break
        }
      }
      if (swaps === 0) break
    }
  }
  // Priority: interior first (bands of 2·clearance around the centroid of the target sites), then
  // angle. An atom that starts among the sites goes by its start instead when that is further in:
  // once the structure around it is built it could not get out.
  let cx = 0, cy = 0
  for (const t of tasks) { cx += sites[t.site]![0]; cy += sites[t.site]![1] }
  cx /= Math.max(T, 1); cy /= Math.max(T, 1)
  const key = new Float64Array(T)
  const amid = Math.max(2 * c, 1)
  tasks.forEach((t, k) => {
    const [x, y] = sites[t.site]!
    let r = Math.hypot(x - cx, y - cy)
    const ax = occ.x(t.atom), ay = occ.y(t.atom)
    let among = false
    allSites.inRadius(ax, ay, amid, () => { among = true })
    if (among) r = Math.min(r, Math.hypot(ax - cx, ay - cy))
    key[k] = Math.floor(r / (2 * cell)) + (Math.atan2(y - cy, x - cx) + Math.PI) / (2 * Math.PI + 1e-9)
  })

  for (let k = 0; k < T; k++) {
    if ((k & 255) === 0) clock?.check()
    const best = analyse(k)
    for (const j of best.A) { succA[j]!.push(k); indegA[k] = indegA[k]! + 1 }
    for (const j of best.B) { succB[k]!.push(j); indegB[j] = indegB[j]! + 1 }
  }
  inheritPriority(key, succA, succB)

  const state = new Uint8Array(T)
  // Positions vacated or filled so far (x, y pairs), and per move where a failed detour search stood.
  const changed: number[] = []
  const failAt = new Int32Array(T).fill(-1), failBox = new Float64Array(6 * T)
  const attempts = new Int32Array(T)
  const moves: PlannedMove[] = []
  const ready = new KeyHeap()
  for (let k = 0; k < T; k++) if (indegA[k]! + indegB[k]! === 0) ready.push(key[k]!, k)
  let done = 0

  const release = (k: number) => {
    for (const j of succA[k]!) {
      indegA[j] = indegA[j]! - 1
      if (state[j] === PENDING && indegA[j]! + indegB[j]! === 0) ready.push(key[j]!, j)
    }
    for (const j of succB[k]!) {
      indegB[j] = indegB[j]! - 1
      if (state[j] === PENDING && indegA[j]! + indegB[j]! === 0) ready.push(key[j]!, j)
    }
    succA[k] = []
    succB[k] = []
  }

  const commit = (k: number, path: Point[], kind: MoveKind, detour: boolean, phase: PlannedMove['phase']) => {
    const t = tasks[k]!, s = sites[t.site]!
    moves.push({ atom: t.atom, site: t.site, path, kind, detour, phase })
    changed.push(occ.x(t.atom), occ.y(t.atom), s[0], s[1])
    occ.move(t.atom, s[0], s[1])
    if (state[k] === PENDING) startGrid.remove(k)
    siteGrid.remove(k)
    state[k] = DONE
    done++
    openInBand[band[k]!]!--
    release(k)
  }

  const tryDirect = (k: number, phase: PlannedMove['phase']): number => {
    const t = tasks[k]!, s = sites[t.site]!
    let first = -1
    for (const cand of metric.directPaths(occ.x(t.atom), occ.y(t.atom), s[0], s[1])) {
      const b = occ.blocker(t.atom, cand)
      if (b === -1) { commit(k, cand, state[k] === PARKED ? 'final-from-parking' : 'direct', false, phase); return -1 }
      if (first < 0 && b >= 0) first = b
    }
    return first >= 0 ? first : -3
  }
  const tryExec = (k: number, phase: PlannedMove['phase']): boolean => {
    if (tryDirect(k, phase) === -1) return true
    const t = tasks[k]!, s = sites[t.site]!
    const px = occ.x(t.atom), py = occ.y(t.atom)
    if (!worthRetry(k, px, py)) return false
    const d = findDetour(occ, metric, t.atom, [px, py], [s[0], s[1]])
    if (d) { commit(k, d, state[k] === PARKED ? 'final-from-parking' : 'detour', true, phase); return true }
    // The search is deterministic: repeat it only once an atom has come or gone near this move.
    const margin = detourMargin(c, Math.hypot(s[0] - px, s[1] - py)) + c
    failAt[k] = changed.length
    failBox.set([Math.min(px, s[0]) - margin, Math.max(px, s[0]) + margin, Math.min(py, s[1]) - margin, Math.max(py, s[1]) + margin, px, py], 6 * k)
    return false
  }
  function worthRetry(k: number, px: number, py: number): boolean {
    const f = failAt[k]!
    if (f < 0) return true
    const o = 6 * k
    if (failBox[o + 4] !== px || failBox[o + 5] !== py) return true
    for (let i = f; i < changed.length; i += 2) {
      const x = changed[i]!, y = changed[i + 1]!
      if (x >= failBox[o]! && x <= failBox[o + 1]! && y >= failBox[o + 2]! && y <= failBox[o + 3]!) return true
    }
    failAt[k] = changed.length
    return false
  }

  const park = (j: number): boolean => {
    const t = tasks[j]!
    const from: Point = [occ.x(t.atom), occ.y(t.atom)]
    const path = findParking({
      occ, metric, atom: t.atom, from, origin: inp.origin,
      avoid: [allSites, startGrid],
      ignoreInAvoid: (g, id) => g === 1 && id === j,
    })
    if (!path) return false
    const end = path[path.length - 1]!
    moves.push({ atom: t.atom, site: t.site, path, kind: 'parking', detour: false, phase: 'park' })
    changed.push(from[0], from[1], end[0], end[1])
    occ.move(t.atom, end[0], end[1])
    startGrid.remove(j)
    state[j] = PARKED
    parked.push(j)
    // Its start is vacated and its original path will not be used: those waiting on it may go.
    release(j)
    return true
  }

  // Moves may run ahead of the innermost unfinished band by at most BAND_SLACK bands: a move left
  // waiting (a cycle, a blocked path) is resolved while the structure around it is still open,
  // instead of after it has been walled in.
  const band = Int32Array.from(key, x => Math.floor(x))
  let maxBand = 0
  for (let k = 0; k < T; k++) if (band[k]! > maxBand) maxBand = band[k]!
  const openInBand = new Int32Array(maxBand + 2)
  for (let k = 0; k < T; k++) openInBand[band[k]!]!++
  let lowBand = 0, extra = 0
  const inner = () => {
    while (lowBand <= maxBand && openInBand[lowBand] === 0) { lowBand++; extra = 0 }
    return lowBand + BAND_SLACK + extra
  }
  let deferred: number[] = []
  const parked: number[] = []
  let iter = 0
  while (done < T) {
    if ((++iter & 15) === 0) clock?.check()
    if (ready.size > 0 && Math.floor(ready.topKey) <= inner()) {
      const k = ready.pop()
      if (state[k] !== PENDING) continue
      if (!tryExec(k, 'ready')) { attempts[k] = attempts[k]! + 1; deferred.push(k) }
      continue
    }
    let progress = false
    for (const k of parked) if (state[k] === PARKED && tryExec(k, 'retry')) progress = true
    const retry = deferred
    deferred = []
    for (const k of retry) {
      if (state[k] !== PENDING) continue
      if (attempts[k]! < 3 && tryExec(k, 'retry')) progress = true
      else { attempts[k] = attempts[k]! + 1; deferred.push(k) }
    }
    if (progress) continue
    // A cycle (or only stuck moves) remains: try the moves whose waiting is least costly to skip.
    const pending: number[] = []
    const lim = inner()
    for (let k = 0; k < T; k++) if (state[k] === PENDING && band[k]! <= lim) pending.push(k)
    if (pending.length === 0 && lim < maxBand) {
      // Only parked atoms wait in the inner bands: let the build go on outwards.
      extra++
      continue
    }
    if (pending.length === 0) {
      // Only parked atoms are left and none can reach its site: finish them as well as possible.
      for (const k of parked) if (state[k] === PARKED) forceCommit(k)
      continue
    }
    pending.sort((a, b) => (indegB[a]! - indegB[b]!) || (indegA[a]! - indegA[b]!) || (key[a]! - key[b]!))
    for (const k of pending.slice(0, 6)) {
      if (attempts[k]! >= 3) continue
      if (tryExec(k, 'cycle')) { progress = true; break }
      attempts[k] = attempts[k]! + 1
    }
    if (progress) continue
    // Park an atom whose start blocks the first such move, or the move's own atom.
    const k0 = pending[0]!
    const t0 = tasks[k0]!, s0 = sites[t0.site]!
    const blk = occ.blocker(t0.atom, metric.directPaths(occ.x(t0.atom), occ.y(t0.atom), s0[0], s0[1])[0]!)
    const j = blk >= 0 ? taskOfAtom[blk]! : -1
    if (j >= 0 && state[j] === PENDING && park(j)) continue
    if (attempts[k0]! < 6 && parked.length < Math.max(2, 0.05 * T) && park(k0)) { attempts[k0] = attempts[k0]! + 1; continue }
    forceCommit(k0)
  }
  return moves

  // No clearance-keeping path exists (e.g. sites closer than the clearance leave no way in): take
  // the shortest path anyway; the final check reports the approaches as warnings.
  function forceCommit(k: number) {
    const t = tasks[k]!, s = sites[t.site]!
    const cands = metric.directPaths(occ.x(t.atom), occ.y(t.atom), s[0], s[1])
    let best = cands[0]!, bestN = Infinity
    for (const cnd of cands) {
      const n = occ.approaches(t.atom, cnd).length
      if (n < bestN) { bestN = n; best = cnd }
    }
    commit(k, best, state[k] === PARKED ? 'final-from-parking' : 'direct', false, 'forced')
  }
}
