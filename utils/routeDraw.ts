// Geometry and colour of the route layer: where an atom is along its path, where every moved
// atom stands after k moves, which path a click hits, and the two colour ramps (own palette).
type Pt = [number, number] | number[]
interface MoveLike { atom: number, path: Pt[], length_nm: number }

/** Ramp for execution order: early moves teal, through green and amber, late ones violet. */
export const ORDER_RAMP = ['#4fc3b8', '#63c99a', '#86cd78', '#afcf5c', '#d6c94e', '#eeb84c', '#f29a52', '#ee7d63', '#e0657a', '#c95f95', '#ac63b0', '#8d6ac4']
/** Ramp for length: short drags cool blue, long ones hot red. */
export const LENGTH_RAMP = ['#6fa8dc', '#64b6d0', '#5dc1b8', '#66c797', '#86c975', '#abc65a', '#cfbd4c', '#e6aa48', '#ef914a', '#ef7650', '#e85d58', '#d9475e']

/** Colour bin of each move: by its place in the order, or by its length between the shortest and the longest. */
export function colourBins(moves: readonly MoveLike[], by: 'order' | 'length', bins: number): Uint8Array {
  const out = new Uint8Array(moves.length)
  if (!moves.length) return out
  let lo = Infinity, hi = -Infinity
  if (by === 'length') for (const m of moves) {
    lo = Math.min(lo, m.length_nm)
    hi = Math.max(hi, m.length_nm)
  }
  moves.forEach((m, k) => {
    const f = by === 'order' ? (moves.length > 1 ? k / (moves.length - 1) : 0) : (hi > lo ? (m.length_nm - lo) / (hi - lo) : 0)
    out[k] = Math.min(bins - 1, Math.floor(f * bins))
  })
  return out
}

/** The point a fraction t (0…1) of the way along a polyline, by length. */
export function pointAlong(path: readonly Pt[], t: number): [number, number] {
  const first = path[0]!
  if (path.length < 2 || t <= 0) return [first[0]!, first[1]!]
  let total = 0
  for (let k = 1; k < path.length; k++) total += Math.hypot(path[k]![0]! - path[k - 1]![0]!, path[k]![1]! - path[k - 1]![1]!)
  let left = Math.min(1, t) * total
  for (let k = 1; k < path.length; k++) {
    const a = path[k - 1]!, b = path[k]!
    const d = Math.hypot(b[0]! - a[0]!, b[1]! - a[1]!)
    if (left <= d && d > 0) return [a[0]! + ((b[0]! - a[0]!) * left) / d, a[1]! + ((b[1]! - a[1]!) * left) / d]
    left -= d
  }
  const last = path[path.length - 1]!
  return [last[0]!, last[1]!]
}

/** Where each atom moved so far stands once the first `step` moves are done. */
export function positionsAfter(moves: readonly MoveLike[], step: number): Map<number, [number, number]> {
  const at = new Map<number, [number, number]>()
  for (let k = 0; k < Math.min(step, moves.length); k++) {
    const end = moves[k]!.path[moves[k]!.path.length - 1]!
    at.set(moves[k]!.atom, [end[0]!, end[1]!])
  }
  return at
}

function segDistance(px: number, py: number, a: Pt, b: Pt): number {
  const dx = b[0]! - a[0]!, dy = b[1]! - a[1]!
  const L = dx * dx + dy * dy
  const t = L > 0 ? Math.max(0, Math.min(1, ((px - a[0]!) * dx + (py - a[1]!) * dy) / L)) : 0
  return Math.hypot(px - a[0]! - t * dx, py - a[1]! - t * dy)
}

/** The move whose path passes closest to (x, y), within r; -1 when none does. */
export function moveNear(moves: readonly MoveLike[], x: number, y: number, r: number): number {
  let best = -1, bestD = r
  moves.forEach((m, k) => {
    for (let s = 1; s < m.path.length; s++) {
      const d = segDistance(x, y, m.path[s - 1]!, m.path[s]!)
      if (d <= bestD) {
        bestD = d
        best = k
      }
    }
  })
  return best
}
