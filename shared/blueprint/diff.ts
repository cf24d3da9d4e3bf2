// Difference of two blueprint versions, site by site (sites are compared by their lattice
// indices (i, j, b), so a site counts as the same wherever the shape that made it lies).
import { siteKey } from './expand'

export interface SiteRef { i: number, j: number, b: number, x_nm: number, y_nm: number }

export interface SiteDiff<T extends SiteRef> {
  /** In `next`, not in `prev`. */
  added: T[]
  /** In `prev`, not in `next`. */
  removed: T[]
  kept: number
}

export function diffSites<T extends SiteRef>(prev: readonly T[], next: readonly T[]): SiteDiff<T> {
  const before = new Set(prev.map(s => siteKey(s.i, s.j, s.b)))
  const after = new Set(next.map(s => siteKey(s.i, s.j, s.b)))
  const added = next.filter(s => !before.has(siteKey(s.i, s.j, s.b)))
  const removed = prev.filter(s => !after.has(siteKey(s.i, s.j, s.b)))
  // Count distinct kept sites (a list may repeat a site; each key counts once).
  let kept = 0
  for (const k of after) if (before.has(k)) kept++
  return { added, removed, kept }
}
