// Final replay of a move list under the clearance rule (every path point at least
// min(clearance, d_start, d_end) from every other atom as it stands) and the keep-out polygons;
// whatever cannot be honoured becomes a warning instead of passing silently.
import { Occupancy } from './clearance'
import { pathEntersZones, type Zone } from './geometry'
import type { Bounds } from './grid'
import type { Point, RouteWarning } from './types'

export function checkMoves(
  atoms: Point[], moves: Array<{ atom: number, path: Point[] }>, clearance_nm: number, zones: Zone[], bounds: Bounds,
): RouteWarning[] {
  const occ = new Occupancy(atoms, bounds, clearance_nm, [])
  const warnings: RouteWarning[] = []
  moves.forEach((mv, i) => {
    if (zones.length > 0 && pathEntersZones(zones, mv.path)) {
      warnings.push({ kind: 'keep-out', move: i, atom: mv.atom, message: `move ${i} (atom ${mv.atom}) enters a keep-out polygon` })
    }
    for (const a of occ.approaches(mv.atom, mv.path)) {
      warnings.push({
        kind: 'clearance', move: i, atom: mv.atom, near_atom: a.near, closest_nm: a.closest_nm, required_nm: a.required_nm,
        message: `move ${i} (atom ${mv.atom}) passes ${a.closest_nm.toFixed(3)} nm from atom ${a.near}; the rule asks for ${a.required_nm.toFixed(3)} nm`,
      })
    }
    const end = mv.path[mv.path.length - 1]!
    occ.move(mv.atom, end[0], end[1])
  })
  return warnings
}
