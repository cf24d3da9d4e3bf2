// Path metric of lateral manipulation: straight line, or drags along the lattice's shortest
// vectors (Lagrange–Gauss basis reduction), where the length of a displacement is the polygonal
// norm ‖Δ‖ = α + β for Δ = α·e_k + β·e_{k+1} between the two bracketing unit directions.
import type { LatticeFrame, Point } from './types'

/** Relative tolerance for calling b1 ± b2 as short as b2 (a fitted lattice is never exact). */
export const DIRECTION_LENGTH_TOL = 0.05
/** Segments whose direction differs from an allowed one by less than this (rad) count as along it. */
export const DIRECTION_ANGLE_TOL = 1e-6

export interface Metric {
  kind: 'straight' | 'lattice'
  /** Allowed unit directions sorted by angle (lattice only; empty for straight lines). */
  dirs: Point[]
  /** Lattice step vector for each direction (same order as dirs). */
  steps: Point[]
  /** Reduced lattice basis (lattice only): every step is an integer combination of it. */
  basis?: [Point, Point]
  norm: (dx: number, dy: number) => number
  /** The one or two shortest paths from p to s (each at most two straight segments). */
  directPaths: (px: number, py: number, sx: number, sy: number) => Point[][]
}

/** Lagrange–Gauss reduction: b1 is a shortest lattice vector, b2 a shortest one independent of it. */
export function reduceBasis(a1: Point, a2: Point): [Point, Point] {
  let [ux, uy] = a1
  let [vx, vy] = a2
  for (let iter = 0; iter < 100; iter++) {
    if (ux * ux + uy * uy > vx * vx + vy * vy) {
      const tx = ux, ty = uy
      ux = vx; uy = vy; vx = tx; vy = ty
    }
    const mu = Math.round((ux * vx + uy * vy) / (ux * ux + uy * uy))
    if (mu === 0) break
    vx -= mu * ux
    vy -= mu * uy
  }
  return [[ux, uy], [vx, vy]]
}

/**
 * Allowed drag directions: ±b1, ±b2 and those of ±(b1 ± b2) that are as short as b2 — six
 * close-packed directions on a hexagonal lattice, four edges on a square one, the two axes on a
 * rectangular one. Returned as lattice step vectors sorted by angle in [0, 2π).
 */
export function latticeSteps(a1: Point, a2: Point): Point[] {
  const [b1, b2] = reduceBasis(a1, a2)
  const l2 = Math.hypot(b2[0], b2[1])
  const steps: Point[] = [b1, b2, [-b1[0], -b1[1]], [-b2[0], -b2[1]]]
  for (const s of [1, -1]) {
    const v: Point = [b1[0] + s * b2[0], b1[1] + s * b2[1]]
    if (Math.abs(Math.hypot(v[0], v[1]) - l2) <= DIRECTION_LENGTH_TOL * l2) steps.push(v, [-v[0], -v[1]])
  }
  const angle = (p: Point) => (Math.atan2(p[1], p[0]) + 2 * Math.PI) % (2 * Math.PI)
  return steps.sort((p, q) => angle(p) - angle(q))
}

export function straightMetric(): Metric {
  return {
    kind: 'straight',
    dirs: [],
    steps: [],
    norm: (dx, dy) => Math.sqrt(dx * dx + dy * dy),
    directPaths: (px, py, sx, sy) => [[[px, py], [sx, sy]]],
  }
}

export function latticeMetric(lattice: Pick<LatticeFrame, 'a1' | 'a2'>): Metric {
  const steps = latticeSteps(lattice.a1, lattice.a2)
  const n = steps.length
  const ex = new Float64Array(n), ey = new Float64Array(n)
  steps.forEach(([x, y], k) => {
    const l = Math.hypot(x, y)
    ex[k] = x / l
    ey[k] = y / l
  })
  // Dual vertices w_k with w_k·e_k = w_k·e_{k+1} = 1: ‖Δ‖ = max_k Δ·w_k (support function of
  // the polar polygon), which picks the bracketing sector without any atan2.
  const wx = new Float64Array(n), wy = new Float64Array(n), det = new Float64Array(n)
  for (let k = 0; k < n; k++) {
    const k1 = (k + 1) % n
    const d = ex[k]! * ey[k1]! - ey[k]! * ex[k1]!
    det[k] = d
    wx[k] = (ey[k1]! - ey[k]!) / d
    wy[k] = (ex[k]! - ex[k1]!) / d
  }
  const sector = (dx: number, dy: number) => {
    let best = 0, bestV = -Infinity
    for (let k = 0; k < n; k++) {
      const v = dx * wx[k]! + dy * wy[k]!
      if (v > bestV) { bestV = v; best = k }
    }
    return best
  }
  const norm = (dx: number, dy: number) => {
    let bestV = 0
    for (let k = 0; k < n; k++) {
      const v = dx * wx[k]! + dy * wy[k]!
      if (v > bestV) bestV = v
    }
    return bestV
  }
  const directPaths = (px: number, py: number, sx: number, sy: number): Point[][] => {
    const dx = sx - px, dy = sy - py
    const k = sector(dx, dy)
    const k1 = (k + 1) % n
    // Δ = α e_k + β e_{k1}, by Cramer's rule.
    const alpha = (dx * ey[k1]! - dy * ex[k1]!) / det[k]!
    const beta = (ex[k]! * dy - ey[k]! * dx) / det[k]!
    const scale = Math.abs(dx) + Math.abs(dy)
    if (alpha <= 1e-12 * scale || beta <= 1e-12 * scale) return [[[px, py], [sx, sy]]]
    return [
      [[px, py], [px + alpha * ex[k]!, py + alpha * ey[k]!], [sx, sy]],
      [[px, py], [px + beta * ex[k1]!, py + beta * ey[k1]!], [sx, sy]],
    ]
  }
  const basis = reduceBasis(lattice.a1, lattice.a2)
  return { kind: 'lattice', dirs: steps.map((_, k) => [ex[k]!, ey[k]!] as Point), steps, basis, norm, directPaths }
}

export function makeMetric(lattice?: Pick<LatticeFrame, 'a1' | 'a2'>): Metric {
  return lattice ? latticeMetric(lattice) : straightMetric()
}

/** Length of a polyline, nm. */
export function pathLength(path: Point[]): number {
  let L = 0
  for (let i = 1; i < path.length; i++) L += Math.hypot(path[i]![0] - path[i - 1]![0], path[i]![1] - path[i - 1]![1])
  return L
}

/** Drops zero-length segments and joins consecutive segments that run in the same direction. */
export function simplifyPath(path: Point[], eps_nm = 1e-9): Point[] {
  const out: Point[] = []
  for (const p of path) {
    const last = out[out.length - 1]
    if (last && Math.hypot(p[0] - last[0], p[1] - last[1]) <= eps_nm) continue
    if (out.length >= 2) {
      const a = out[out.length - 2]!, b = last!
      const ux = b[0] - a[0], uy = b[1] - a[1], vx = p[0] - b[0], vy = p[1] - b[1]
      const cross = ux * vy - uy * vx, dot = ux * vx + uy * vy
      if (dot > 0 && Math.abs(cross) <= 1e-9 * Math.hypot(ux, uy) * Math.hypot(vx, vy)) {
        out[out.length - 1] = [p[0], p[1]]
        continue
      }
    }
    out.push([p[0], p[1]])
  }
  if (out.length === 1) out.push([out[0]![0], out[0]![1]])
  return out
}
