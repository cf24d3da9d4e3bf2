// Independent replay checker for solved routes. Written apart from shared/route on purpose: it
// imports none of the solver's geometry, derives the allowed drag directions by enumerating short
// lattice vectors, and checks every path point against every other atom by brute force with the
// exact point–segment distance (clamped projection).

type P = [number, number]

export interface ReplayProblem {
  atoms: P[]
  sites: P[]
  lattice?: { a1: P, a2: P, origin: P }
  clearance_nm?: number
  locked?: number[]
  excluded?: number[]
  keep_out?: P[][]
}

export interface ReplayRoute {
  assignment: Array<[number, number]>
  moves: Array<{ atom: number, site: number, path: P[], length_nm: number }>
  warnings?: Array<{ kind: string, move: number, near_atom?: number }>
}

export interface Violation { move: number, atom: number, near: number, closest: number, required: number }

export interface ReplayReport {
  violations: Violation[]
  /** Violations the route did not report in its warnings. */
  unreported: Violation[]
  /** Assigned sites whose atom does not end within 0.05 nm of it. */
  unfilled: number[]
  lockedMoved: number[]
  excludedUsed: number[]
  offDirection: Array<{ move: number, segment: number }>
  keepOutEntered: number[]
  badLengths: number[]
  /** Sites assigned twice or atoms used twice. */
  duplicates: number
}

function segDist(a: P, b: P, q: P): number {
  const dx = b[0] - a[0], dy = b[1] - a[1]
  const L2 = dx * dx + dy * dy
  const t = L2 === 0 ? 0 : Math.max(0, Math.min(1, ((q[0] - a[0]) * dx + (q[1] - a[1]) * dy) / L2))
  return Math.hypot(a[0] + t * dx - q[0], a[1] + t * dy - q[1])
}

/** Allowed directions: the shortest lattice vectors, plus the next shortest if those are collinear. */
export function allowedDirections(a1: P, a2: P): P[] {
  const vs: Array<{ v: P, l: number }> = []
  for (let i = -3; i <= 3; i++) {
    for (let j = -3; j <= 3; j++) {
      if (i === 0 && j === 0) continue
      const v: P = [i * a1[0] + j * a2[0], i * a1[1] + j * a2[1]]
      vs.push({ v, l: Math.hypot(v[0], v[1]) })
    }
  }
  vs.sort((x, y) => x.l - y.l)
  const L1 = vs[0]!.l
  const first = vs.filter(x => x.l <= L1 * 1.05)
  const collinear = first.every(x => Math.abs(x.v[0] * first[0]!.v[1] - x.v[1] * first[0]!.v[0]) < 1e-9 * L1 * L1)
  let dirs = first
  if (collinear) {
    const rest = vs.filter(x => Math.abs(x.v[0] * first[0]!.v[1] - x.v[1] * first[0]!.v[0]) > 1e-9 * L1 * x.l)
    const L2 = rest[0]!.l
    dirs = [...first, ...rest.filter(x => x.l <= L2 * 1.05)]
  }
  return dirs.map(x => [x.v[0] / x.l, x.v[1] / x.l] as P)
}

function inside(poly: P[], x: number, y: number): boolean {
  let c = false
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i]!, [xj, yj] = poly[j]!
    if ((yi > y) !== (yj > y) && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) c = !c
  }
  return c
}

function cross(o: P, a: P, b: P): number { return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]) }

function segmentsCross(a: P, b: P, c: P, d: P): boolean {
  const d1 = cross(c, d, a), d2 = cross(c, d, b), d3 = cross(a, b, c), d4 = cross(a, b, d)
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true
  return segDist(a, b, c) < 1e-12 || segDist(a, b, d) < 1e-12 || segDist(c, d, a) < 1e-12 || segDist(c, d, b) < 1e-12
}

export function replayRoute(problem: ReplayProblem, route: ReplayRoute): ReplayReport {
  const clearance = problem.clearance_nm ?? 0.5
  const pos: P[] = problem.atoms.map(p => [p[0], p[1]])
  const locked = new Set(problem.locked ?? []), excluded = new Set(problem.excluded ?? [])
  const dirs = problem.lattice ? allowedDirections(problem.lattice.a1, problem.lattice.a2) : undefined
  const rep: ReplayReport = { violations: [], unreported: [], unfilled: [], lockedMoved: [], excludedUsed: [], offDirection: [], keepOutEntered: [], badLengths: [], duplicates: 0 }
  route.moves.forEach((mv, mi) => {
    if (locked.has(mv.atom)) rep.lockedMoved.push(mv.atom)
    if (excluded.has(mv.atom)) rep.excludedUsed.push(mv.atom)
    const path = mv.path
    const p = path[0]!, s = path[path.length - 1]!
    if (Math.hypot(p[0] - pos[mv.atom]![0], p[1] - pos[mv.atom]![1]) > 1e-9) rep.badLengths.push(mi)
    let len = 0
    for (let k = 1; k < path.length; k++) {
      const a = path[k - 1]!, b = path[k]!
      const L = Math.hypot(b[0] - a[0], b[1] - a[1])
      len += L
      if (dirs && L > 1e-9) {
        const ux = (b[0] - a[0]) / L, uy = (b[1] - a[1]) / L
        if (!dirs.some(d => Math.abs(d[0] * uy - d[1] * ux) < 1e-6 && d[0] * ux + d[1] * uy > 0)) rep.offDirection.push({ move: mi, segment: k - 1 })
      }
      for (const poly of problem.keep_out ?? []) {
        const hit = inside(poly, a[0], a[1]) || inside(poly, b[0], b[1])
          || poly.some((c, i) => segmentsCross(a, b, c, poly[(i + 1) % poly.length]!))
        if (hit && !rep.keepOutEntered.includes(mi)) rep.keepOutEntered.push(mi)
      }
    }
    if (Math.abs(len - mv.length_nm) > 1e-6 * (1 + len)) rep.badLengths.push(mi)
    pos.forEach((q, qi) => {
      if (qi === mv.atom) return
      const required = Math.min(clearance, Math.hypot(q[0] - p[0], q[1] - p[1]), Math.hypot(q[0] - s[0], q[1] - s[1]))
      let closest = Infinity
      for (let k = 1; k < path.length; k++) closest = Math.min(closest, segDist(path[k - 1]!, path[k]!, q))
      if (path.length === 1) closest = Math.hypot(q[0] - p[0], q[1] - p[1])
      if (closest < required - 1e-7) {
        const v = { move: mi, atom: mv.atom, near: qi, closest, required }
        rep.violations.push(v)
        if (!route.warnings?.some(w => w.move === mi && w.near_atom === qi)) rep.unreported.push(v)
      }
    })
    pos[mv.atom] = [s[0], s[1]]
  })
  const seenS = new Set<number>(), seenA = new Set<number>()
  for (const [a, s] of route.assignment) {
    if (seenS.has(s) || seenA.has(a)) rep.duplicates++
    seenS.add(s); seenA.add(a)
    if (excluded.has(a)) rep.excludedUsed.push(a)
    const site = problem.sites[s]!, at = pos[a]!
    if (Math.hypot(site[0] - at[0], site[1] - at[1]) > 0.05 + 1e-9) rep.unfilled.push(s)
  }
  return rep
}
