// Parking spots for breaking a cycle of moves that block each other: the nearest free lattice site
// (or grid point without a lattice), by rings around the atom, away from every atom, every
// blueprint site and every pending start, reachable by a shortest path that keeps the clearance.
import type { Occupancy } from './clearance'
import { zoneContains } from './geometry'
import type { PointGrid } from './grid'
import type { Metric } from './metric'
import type { Point } from './types'

export interface ParkingQuery {
  occ: Occupancy
  metric: Metric
  atom: number
  from: Point
  /** Lattice origin, so that spots fall on real lattice sites. */
  origin?: Point
  /** Point sets a spot must stay away from (blueprint sites, pending starts). */
  avoid: PointGrid[]
  /** Ids in `avoid` grids that do not count (the atom's own start). */
  ignoreInAvoid?: (grid: number, id: number) => boolean
  maxRadius_nm?: number
}

/** A path from `from` to a parking spot, or null when none is found within maxRadius_nm. */
export function findParking(q: ParkingQuery): Point[] | null {
  const { occ, metric, atom, from } = q
  const c = occ.clearance_nm
  const keep = Math.max(2 * c, 0.6)
  let b1: Point, b2: Point, o: Point
  if (metric.kind === 'lattice' && metric.basis) {
    [b1, b2] = metric.basis
    o = q.origin ?? from
  }
  else {
    const h = Math.max(c, 0.25)
    b1 = [h, 0]; b2 = [0, h]; o = from
  }
  const det = b1[0] * b2[1] - b1[1] * b2[0]
  const rx = from[0] - o[0], ry = from[1] - o[1]
  const i0 = Math.round((rx * b2[1] - ry * b2[0]) / det), j0 = Math.round((b1[0] * ry - b1[1] * rx) / det)
  const step = Math.min(Math.hypot(b1[0], b1[1]), Math.hypot(b2[0], b2[1]))
  const maxR = Math.ceil((q.maxRadius_nm ?? 12) / step)
  const isFree = (x: number, y: number) => {
    for (const z of occ.zones) if (zoneContains(z, x, y)) return false
    let ok = true
    occ.grid.inRadius(x, y, keep, (id) => { if (id !== atom) ok = false })
    if (!ok) return false
    q.avoid.forEach((g, gi) => {
      if (!ok) return
      g.inRadius(x, y, keep, (id) => { if (!q.ignoreInAvoid?.(gi, id)) ok = false })
    })
    return ok
  }
  for (let r = 2; r <= maxR; r++) {
    const ring: Array<[number, number, number]> = []
    for (let di = -r; di <= r; di++) {
      for (let dj = -r; dj <= r; dj++) {
        if (Math.max(Math.abs(di), Math.abs(dj)) !== r) continue
        const x = o[0] + (i0 + di) * b1[0] + (j0 + dj) * b2[0], y = o[1] + (i0 + di) * b1[1] + (j0 + dj) * b2[1]
        ring.push([metric.norm(x - from[0], y - from[1]), x, y])
      }
    }
    ring.sort((a, b) => a[0] - b[0])
    for (const [, x, y] of ring) {
      if (!isFree(x, y)) continue
      const path = metric.directPaths(from[0], from[1], x, y).find(p => occ.blocker(atom, p) === -1)
      if (path) return path
    }
  }
  return null
}
