// Spacing rules for a blueprint: pairs closer than the minimum spacing (atoms closer than about
// two nearest-neighbour distances interact and may dimerise — common practice), duplicate sites,
// sites outside the bounds. Pairs come from a uniform-grid index, O(N) for bounded density.
import { InputError } from '../errors'
import { GridIndex } from '../lattice/grid-index'
import { type Surface, resolveSurface } from '../lattice/surfaces'
import { checkFinite, defaultMinSpacing, insideBounds, validateBounds } from './context'
import type { Bounds } from './schema'

export interface RuleIssue {
  kind: 'too-close' | 'duplicate' | 'outside'
  /** One index for 'outside', two (a < b) for pairs. */
  sites: number[]
  distance_nm?: number
}

export interface RuleOptions {
  /** Default 2 × the surface's nearest-neighbour distance; needs `surface` then. */
  minSpacing_nm?: number
  surface?: string | Surface
  bounds?: Bounds
}

/** Two sites count as the same site below this separation (nm). */
export const SAME_SITE_NM = 1e-6

export function checkRules(sites: readonly { x_nm: number, y_nm: number }[], opts: RuleOptions = {}): RuleIssue[] {
  if (!Array.isArray(sites)) throw new InputError('sites', 'sites must be a list')
  let minSpacing: number
  if (opts.minSpacing_nm !== undefined) minSpacing = checkFinite(opts.minSpacing_nm, 'minSpacing_nm')
  else if (opts.surface !== undefined) minSpacing = defaultMinSpacing(resolveSurface(opts.surface))
  else throw new InputError('minSpacing_nm', 'give minSpacing_nm or a surface to take the default from')
  if (!(minSpacing >= 0)) throw new InputError('minSpacing_nm', 'minSpacing_nm must not be negative')
  if (opts.bounds) validateBounds(opts.bounds)
  const xy = new Float64Array(sites.length * 2)
  sites.forEach((s, k) => {
    xy[2 * k] = checkFinite(s?.x_nm, `sites[${k}].x_nm`)
    xy[2 * k + 1] = checkFinite(s?.y_nm, `sites[${k}].y_nm`)
  })
  const issues: RuleIssue[] = []
  const index = new GridIndex(xy, Math.max(minSpacing, 1e-3), 'sites')
  const radius = Math.max(minSpacing, SAME_SITE_NM)
  index.forEachPairWithin(radius, (a, b, d) => {
    if (d < SAME_SITE_NM) issues.push({ kind: 'duplicate', sites: [a, b], distance_nm: d })
    else if (d < minSpacing * (1 - 1e-9)) issues.push({ kind: 'too-close', sites: [a, b], distance_nm: d })
  })
  if (opts.bounds) {
    for (let k = 0; k < sites.length; k++) {
      if (!insideBounds(xy[2 * k]!, xy[2 * k + 1]!, opts.bounds)) issues.push({ kind: 'outside', sites: [k] })
    }
  }
  const order = { 'duplicate': 0, 'too-close': 1, 'outside': 2 }
  issues.sort((p, q) => order[p.kind] - order[q.kind] || p.sites[0]! - q.sites[0]! || (p.sites[1] ?? 0) - (q.sites[1] ?? 0))
  return issues
}
