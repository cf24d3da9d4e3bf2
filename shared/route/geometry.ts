// Planar primitives for path checks: point–segment distance by clamped projection, even–odd
// point-in-polygon (ray crossing), and segment–polygon intersection by orientation tests.
import type { Point } from './types'

/** Squared distance from (qx, qy) to the segment (ax, ay)–(bx, by). */
export function segPointDist2(ax: number, ay: number, bx: number, by: number, qx: number, qy: number): number {
  const dx = bx - ax, dy = by - ay
  const L2 = dx * dx + dy * dy
  let t = L2 > 0 ? ((qx - ax) * dx + (qy - ay) * dy) / L2 : 0
  if (t < 0) t = 0
  else if (t > 1) t = 1
  const ex = ax + t * dx - qx, ey = ay + t * dy - qy
  return ex * ex + ey * ey
}

/** Closest distance from q to a polyline. */
export function pathPointDist(path: Point[], qx: number, qy: number): number {
  let best = Infinity
  for (let i = 1; i < path.length; i++) {
    const a = path[i - 1]!, b = path[i]!
    const d2 = segPointDist2(a[0], a[1], b[0], b[1], qx, qy)
    if (d2 < best) best = d2
  }
  if (path.length === 1) best = (path[0]![0] - qx) ** 2 + (path[0]![1] - qy) ** 2
  return Math.sqrt(best)
}

export function pointInPolygon(poly: Point[], x: number, y: number): boolean {
  let inside = false
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i]!, [xj, yj] = poly[j]!
    if ((yi > y) !== (yj > y) && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside
  }
  return inside
}

function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax)
}

function onSegment(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): boolean {
  return Math.min(ax, bx) <= cx && cx <= Math.max(ax, bx) && Math.min(ay, by) <= cy && cy <= Math.max(ay, by)
}

/** Closed-segment intersection test (touching counts). */
export function segmentsIntersect(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): boolean {
  const o1 = orient(ax, ay, bx, by, cx, cy), o2 = orient(ax, ay, bx, by, dx, dy)
  const o3 = orient(cx, cy, dx, dy, ax, ay), o4 = orient(cx, cy, dx, dy, bx, by)
  if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) return true
  if (o1 === 0 && onSegment(ax, ay, bx, by, cx, cy)) return true
  if (o2 === 0 && onSegment(ax, ay, bx, by, dx, dy)) return true
  if (o3 === 0 && onSegment(cx, cy, dx, dy, ax, ay)) return true
  if (o4 === 0 && onSegment(cx, cy, dx, dy, bx, by)) return true
  return false
}

/** A keep-out polygon with its bounding box, for cheap rejection. */
export interface Zone {
  poly: Point[]
  xmin: number
  xmax: number
  ymin: number
  ymax: number
  perimeter_nm: number
}

export function makeZone(poly: Point[]): Zone {
  let xmin = Infinity, xmax = -Infinity, ymin = Infinity, ymax = -Infinity, per = 0
  poly.forEach(([x, y], i) => {
    xmin = Math.min(xmin, x); xmax = Math.max(xmax, x)
    ymin = Math.min(ymin, y); ymax = Math.max(ymax, y)
    const [x2, y2] = poly[(i + 1) % poly.length]!
    per += Math.hypot(x2 - x, y2 - y)
  })
  return { poly, xmin, xmax, ymin, ymax, perimeter_nm: per }
}

export function zoneContains(z: Zone, x: number, y: number): boolean {
  return x >= z.xmin && x <= z.xmax && y >= z.ymin && y <= z.ymax && pointInPolygon(z.poly, x, y)
}

/** Whether the segment a–b enters the polygon (crosses or touches its boundary, or lies inside). */
export function segmentEntersZone(z: Zone, ax: number, ay: number, bx: number, by: number): boolean {
  if (Math.max(ax, bx) < z.xmin || Math.min(ax, bx) > z.xmax || Math.max(ay, by) < z.ymin || Math.min(ay, by) > z.ymax) return false
  if (zoneContains(z, ax, ay) || zoneContains(z, bx, by)) return true
  const p = z.poly
  for (let i = 0, j = p.length - 1; i < p.length; j = i++) {
    if (segmentsIntersect(ax, ay, bx, by, p[j]![0], p[j]![1], p[i]![0], p[i]![1])) return true
  }
  return false
}

export function pathEntersZones(zones: Zone[], path: Point[]): boolean {
  for (const z of zones) {
    for (let i = 1; i < path.length; i++) {
      if (segmentEntersZone(z, path[i - 1]![0], path[i - 1]![1], path[i]![0], path[i]![1])) return true
    }
  }
  return false
}
