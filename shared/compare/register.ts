// Registration of one scan to another of the same area. A lattice fit knows its lattice only up
// to a lattice translation (its origin is one site among many), so a blueprint carried into a
// later scan through that scan's own fit may land a whole number of cells away from where it was
// planned. Atoms that were not moved between the scans share one displacement (the drift): the
// densest cluster of pairwise displacements between the two scans' marks finds it (a Hough-style
// vote), and the blueprint is then shifted by the lattice vector that brings it onto where the
// planned sites have drifted to.
import { InputError } from '../errors'

type Pt = readonly [number, number]

export interface Drift { dx: number, dy: number, support: number }

/**
 * The common displacement of `before` → `after`: every pair closer than `max_nm` votes for its
 * displacement in bins of `bin_nm`; the best 3 × 3 neighbourhood of bins wins and its pairs are
 * averaged. `support` is the number of pairs in it (0 when nothing agrees).
 */
export function scanDrift(before: readonly Pt[], after: readonly Pt[], opts: { max_nm?: number, bin_nm?: number } = {}): Drift {
  const max = opts.max_nm ?? 20
  const bin = opts.bin_nm ?? 0.1
  if (!(max > 0) || !(bin > 0)) throw new InputError('max_nm', 'max_nm and bin_nm must be above 0')
  // A grid over `after` keeps the pair search local.
  const cell = max
  const grid = new Map<string, number[]>()
  after.forEach((p, k) => {
    const key = `${Math.floor(p[0] / cell)},${Math.floor(p[1] / cell)}`
    const list = grid.get(key)
    if (list) list.push(k)
    else grid.set(key, [k])
  })
  const votes = new Map<string, number>()
  const pairs: Array<[number, number]> = []
  for (const p of before) {
    const cx = Math.floor(p[0] / cell), cy = Math.floor(p[1] / cell)
    for (let gx = cx - 1; gx <= cx + 1; gx++) {
      for (let gy = cy - 1; gy <= cy + 1; gy++) {
        for (const k of grid.get(`${gx},${gy}`) ?? []) {
          const dx = after[k]![0] - p[0], dy = after[k]![1] - p[1]
          if (dx * dx + dy * dy > max * max) continue
          const key = `${Math.round(dx / bin)},${Math.round(dy / bin)}`
          votes.set(key, (votes.get(key) ?? 0) + 1)
          pairs.push([dx, dy])
        }
      }
    }
  }
  let best: [number, number] | null = null
  let bestCount = 0
  for (const key of votes.keys()) {
    const [i, j] = key.split(',').map(Number) as [number, number]
    let n = 0
    for (let di = -1; di <= 1; di++) for (let dj = -1; dj <= 1; dj++) n += votes.get(`${i + di},${j + dj}`) ?? 0
    if (n > bestCount || (n === bestCount && best && Math.hypot(i, j) < Math.hypot(best[0], best[1]))) {
      bestCount = n
      best = [i, j]
    }
  }
  if (!best) return { dx: 0, dy: 0, support: 0 }
  const cx = best[0] * bin, cy = best[1] * bin
  let sx = 0, sy = 0, n = 0
  for (const [dx, dy] of pairs) {
    if (Math.abs(dx - cx) <= 1.5 * bin && Math.abs(dy - cy) <= 1.5 * bin) {
      sx += dx; sy += dy; n++
    }
  }
  return { dx: sx / n, dy: sy / n, support: n }
}

/**
 * `raw` shifted by the lattice vector i·a1 + j·a2 that brings it closest, on average, to
 * `expected` (both lists in the same order). Returns the shifted points and (i, j).
 */
export function alignByLatticeVector(raw: readonly Pt[], expected: readonly Pt[], a1: Pt, a2: Pt): { points: [number, number][], shift: [number, number] } {
  if (raw.length !== expected.length || raw.length === 0) throw new InputError('expected', 'expected must hold one point per site')
  const det = a1[0] * a2[1] - a1[1] * a2[0]
  if (!(Math.abs(det) > 1e-12)) throw new InputError('a2', 'a1 and a2 must not be parallel')
  let mx = 0, my = 0
  raw.forEach((p, k) => {
    mx += expected[k]![0] - p[0]; my += expected[k]![1] - p[1]
  })
  mx /= raw.length; my /= raw.length
  const i = Math.round((mx * a2[1] - my * a2[0]) / det)
  const j = Math.round((a1[0] * my - a1[1] * mx) / det)
  const tx = i * a1[0] + j * a2[0], ty = i * a1[1] + j * a2[1]
  return { points: raw.map(p => [p[0] + tx, p[1] + ty]), shift: [i, j] }
}
