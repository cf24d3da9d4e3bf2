// Detours by A* search (Hart, Nilsson, Raphael 1968) over the lattice translated to the atom's
// start — edges are single lattice steps along the allowed drag directions — or, without a
// lattice, over an 8-connected square grid; the admissible heuristic is the metric length to the
// site. The found path is then shortened greedily by shortest-path shortcuts that stay free.
import type { Occupancy } from './clearance'
import { segmentEntersZone } from './geometry'
import { simplifyPath, type Metric } from './metric'
import type { Point } from './types'
import { KeyHeap } from './priority'

export interface DetourOptions {
  maxNodes?: number
}

function gridSteps(metric: Metric, clearance_nm: number, span_nm: number): { b1: Point, b2: Point, steps: Array<[number, number]> } {
  if (metric.kind === 'lattice' && metric.basis) {
    const [b1, b2] = metric.basis
    const det = b1[0] * b2[1] - b1[1] * b2[0]
    const steps = metric.steps.map(([x, y]) => [Math.round((x * b2[1] - y * b2[0]) / det), Math.round((b1[0] * y - b1[1] * x) / det)] as [number, number])
    return { b1, b2, steps }
  }
  const h = Math.max(clearance_nm / 2, span_nm / 300, 0.02)
  return { b1: [h, 0], b2: [0, h], steps: [[1, 0], [1, 1], [0, 1], [-1, 1], [-1, 0], [-1, -1], [0, -1], [1, -1]] }
}

/** Half-width the search region extends beyond the box of start and site. */
export function detourMargin(clearance_nm: number, span_nm: number): number {
  return Math.max(3, 4 * clearance_nm, 0.5 * span_nm)
}

export function findDetour(occ: Occupancy, metric: Metric, atom: number, p: Point, s: Point, opts: DetourOptions = {}): Point[] | null {
  const c = occ.clearance_nm
  const span = Math.hypot(s[0] - p[0], s[1] - p[1])
  const { b1, b2, steps } = gridSteps(metric, c, span)
  const margin = detourMargin(c, span)
  const xmin = Math.min(p[0], s[0]) - margin, xmax = Math.max(p[0], s[0]) + margin
  const ymin = Math.min(p[1], s[1]) - margin, ymax = Math.max(p[1], s[1]) + margin
  const maxNodes = opts.maxNodes ?? 2500
  const zones = occ.zones
  const segOk = (ax: number, ay: number, bx: number, by: number) => {
    for (const z of zones) if (segmentEntersZone(z, ax, ay, bx, by)) return false
    return occ.segmentBlocker(atom, p, s, ax, ay, bx, by) === -1
  }
  const pathOk = (path: Point[]) => {
    for (let k = 1; k < path.length; k++) if (!segOk(path[k - 1]![0], path[k - 1]![1], path[k]![0], path[k]![1])) return false
    return true
  }
  const OFF = 32768
  const key = (i: number, j: number) => (i + OFF) * 65536 + (j + OFF)
  const index = new Map<number, number>()
  const gi: number[] = [0], gj: number[] = [0], gs: number[] = [0], par: number[] = [-1], closed: boolean[] = [false]
  const X = (n: number) => p[0] + gi[n]! * b1[0] + gj[n]! * b2[0]
  const Y = (n: number) => p[1] + gi[n]! * b1[1] + gj[n]! * b2[1]
  index.set(key(0, 0), 0)
  const open = new KeyHeap()
  open.push(metric.norm(s[0] - p[0], s[1] - p[1]), 0)
  let goal = -1, connector: Point[] = []
  while (open.size > 0) {
    const n = open.pop()
    if (closed[n]) continue
    closed[n] = true
    const nx = X(n), ny = Y(n)
    for (const cand of metric.directPaths(nx, ny, s[0], s[1])) {
      if (pathOk(cand)) { goal = n; connector = cand; break }
    }
    if (goal >= 0) break
    if (gi.length > maxNodes) break
    for (const [di, dj] of steps) {
      const i2 = gi[n]! + di, j2 = gj[n]! + dj
      const x2 = p[0] + i2 * b1[0] + j2 * b2[0], y2 = p[1] + i2 * b1[1] + j2 * b2[1]
      if (x2 < xmin || x2 > xmax || y2 < ymin || y2 > ymax) continue
      const kk = key(i2, j2)
      let m = index.get(kk)
      if (m !== undefined && closed[m]) continue
      const g2 = gs[n]! + Math.hypot(x2 - nx, y2 - ny)
      if (m !== undefined && g2 >= gs[m]!) continue
      if (!segOk(nx, ny, x2, y2)) continue
      if (m === undefined) {
        m = gi.length
        gi.push(i2); gj.push(j2); gs.push(g2)
        par.push(n); closed.push(false)
        index.set(kk, m)
      }
      else {
        gs[m] = g2; par[m] = n
      }
      open.push(g2 + metric.norm(s[0] - x2, s[1] - y2), m)
    }
  }
  if (goal < 0) return null
  const chain: Point[] = []
  for (let n = goal; n >= 0; n = par[n]!) chain.push([X(n), Y(n)])
  chain.reverse()
  chain[0] = [p[0], p[1]]
  const raw = [...chain, ...connector.slice(1)]
  return shortcut(raw, metric, pathOk)
}

/** Greedy string pulling: from each kept point jump to the farthest point whose shortest path is free. */
export function shortcut(path: Point[], metric: Metric, pathOk: (p: Point[]) => boolean): Point[] {
  const out: Point[] = [path[0]!]
  let i = 0
  while (i < path.length - 1) {
    let next = i + 1, via: Point[] = [path[i]!, path[i + 1]!]
    for (let j = Math.min(path.length - 1, i + 60); j > i + 1; j--) {
      const a = path[i]!, b = path[j]!
      const found = metric.directPaths(a[0], a[1], b[0], b[1]).find(pathOk)
      if (found) { next = j; via = found; break }
    }
    out.push(...via.slice(1))
    i = next
  }
  return simplifyPath(out)
}
