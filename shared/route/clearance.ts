// The route's clearance rule: while atom a drags from p to s, every path point keeps at least
// min(clearance, |q − p|, |q − s|) from every other atom q where it stands at that moment
// (exact point–segment distances over a uniform-grid index of current positions).
import { pathEntersZones, segPointDist2, type Zone } from './geometry'
import { PointGrid, type Bounds } from './grid'
import type { Point } from './types'

/** Rounding slack: a distance this much below the threshold still counts as keeping it. */
export const CLEARANCE_EPS_NM = 1e-9

export interface Approach { near: number, closest_nm: number, required_nm: number }

export class Occupancy {
  readonly grid: PointGrid
  constructor(atoms: Point[], bounds: Bounds, readonly clearance_nm: number, readonly zones: Zone[]) {
    const pad = Math.max(4 * clearance_nm, 2)
    const b = { xmin: bounds.xmin - pad, xmax: bounds.xmax + pad, ymin: bounds.ymin - pad, ymax: bounds.ymax + pad }
    this.grid = new PointGrid(b, Math.max(clearance_nm, 0.25), atoms.length)
    atoms.forEach((p, i) => this.grid.insert(i, p[0], p[1]))
  }

  x(i: number): number { return this.grid.xs[i]! }
  y(i: number): number { return this.grid.ys[i]! }

  move(atom: number, x: number, y: number): void {
    this.grid.move(atom, x, y)
  }

  /**
   * First atom that `atom`'s path would brush past (-1: none, -2: the path enters a keep-out).
   * Thresholds use the move's first and last points p, s (default: the path's own ends);
   * `ignore` marks atoms not to test (e.g. to look at static obstacles only).
   */
  blocker(atom: number, path: Point[], ignore?: (q: number) => boolean, p: Point = path[0]!, s: Point = path[path.length - 1]!): number {
    if (this.zones.length > 0 && pathEntersZones(this.zones, path)) return -2
    for (let k = 1; k < path.length; k++) {
      const a = path[k - 1]!, b = path[k]!
      const hit = this.segmentBlocker(atom, p, s, a[0], a[1], b[0], b[1], ignore)
      if (hit !== -1) return hit
    }
    return -1
  }

  /** The same test for one segment a–b of a move from p to s (zones not included). */
  segmentBlocker(atom: number, p: Point, s: Point, ax: number, ay: number, bx: number, by: number, ignore?: (q: number) => boolean): number {
    const c = this.clearance_nm
    if (c <= 0) return -1
    const g = this.grid
    let hit = -1
    g.nearSegment(ax, ay, bx, by, c, (q) => {
      if (q === atom || (ignore && ignore(q))) return false
      const qx = g.xs[q]!, qy = g.ys[q]!
      const thr = Math.min(c, Math.hypot(qx - p[0], qy - p[1]), Math.hypot(qx - s[0], qy - s[1])) - CLEARANCE_EPS_NM
      if (thr <= 0) return false
      if (segPointDist2(ax, ay, bx, by, qx, qy) < thr * thr) { hit = q; return true }
      return false
    })
    return hit
  }

  /** Every atom the path comes closer to than the rule allows, with the closest approach. */
  approaches(atom: number, path: Point[]): Approach[] {
    const c = this.clearance_nm
    const out = new Map<number, Approach>()
    if (c <= 0) return []
    const p = path[0]!, s = path[path.length - 1]!
    const g = this.grid
    for (let k = 1; k < path.length; k++) {
      const a = path[k - 1]!, b = path[k]!
      g.nearSegment(a[0], a[1], b[0], b[1], c, (q) => {
        if (q === atom) return false
        const qx = g.xs[q]!, qy = g.ys[q]!
        const req = Math.min(c, Math.hypot(qx - p[0], qy - p[1]), Math.hypot(qx - s[0], qy - s[1]))
        const d = Math.sqrt(segPointDist2(a[0], a[1], b[0], b[1], qx, qy))
        if (d < req - CLEARANCE_EPS_NM) {
          const prev = out.get(q)
          if (!prev || d < prev.closest_nm) out.set(q, { near: q, closest_nm: d, required_nm: req })
        }
        return false
      })
    }
    return [...out.values()]
  }
}
