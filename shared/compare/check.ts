// As-built check (POST /api/compute/check): blueprint sites against the adatoms
// found in the after-scan by optimal one-to-one matching within a tolerance (matching.ts),
// RMS deviation over the placed sites and fidelity = placed / sites.
import { InputError } from '../errors'
import { matchWithin } from './matching'
import { CheckInput } from './schema'
import { parseOrThrow } from '../validate'

export const DEFAULT_TOLERANCE_nm = 0.1
export const DEFAULT_NEAR_nm = 0.5
/** Largest cost matrix (rows × columns) one component may need before the check refuses. */
export const MAX_COMPONENT_CELLS = 1_000_000
/** Candidate pairs collected at most (≈ 16 bytes each). */
export const MAX_CANDIDATES = 2_000_000

export type SiteStatus = 'placed' | 'off-site' | 'missing'

export interface OffSite { site: number, found: number, offset: [number, number], distance_nm: number }

export interface CheckOutput {
  placed: number[]
  missing: number[]
  extra: number[]
  /** √(mean d²) over placed sites; null when nothing was placed */
  rms_nm: number | null
  fidelity: number
  /** [siteIndex, foundIndex, distance_nm] for each placed site */
  pairs: [number, number, number][]
  /** missing sites paired one-to-one with an unmatched found atom within near_nm (a subset of
   * missing × extra); offset = found − site */
  off_site: OffSite[]
  site_status: SiteStatus[]
  /** mean (found − site) over placed sites: a systematic shift hints at a registration error */
  mean_offset_nm: [number, number] | null
  tolerance_nm: number
  near_nm: number
  warnings: string[]
}

export function checkAsBuilt(raw: unknown): CheckOutput {
  const input = parseOrThrow(CheckInput, raw)
  const { sites, found } = input
  const tol = input.tolerance_nm ?? DEFAULT_TOLERANCE_nm
  const near = input.near_nm ?? DEFAULT_NEAR_nm
  const warnings: string[] = []
  const allSites = sites.map((_, i) => i)
  const allFound = found.map((_, j) => j)

  const m1 = matchWithin(sites, allSites, found, allFound, tol, { maxCells: MAX_COMPONENT_CELLS, oversize: 'skip', maxCandidates: MAX_CANDIDATES })
  if (m1.truncated || m1.oversizeComponents > 0) {
    throw new InputError('tolerance_nm', `a tolerance of ${tol} nm links sites and atoms into clusters too large to match optimally `
      + `(more than ${m1.truncated ? `${MAX_CANDIDATES} candidate pairs` : `${MAX_COMPONENT_CELLS} cost entries in one cluster`}); `
      + 'use a tolerance below half the site spacing')
  }
  const pairs = m1.pairs
  const status: SiteStatus[] = sites.map(() => 'missing')
  const foundUsed = new Uint8Array(found.length)
  let sum2 = 0
  let sx = 0
  let sy = 0
  for (const [i, j, d] of pairs) {
    status[i] = 'placed'
    foundUsed[j] = 1
    sum2 += d * d
    sx += found[j]![0] - sites[i]![0]
    sy += found[j]![1] - sites[i]![1]
  }
  const placed = pairs.map(p => p[0])
  const missing = allSites.filter(i => status[i] === 'missing')
  const extra = allFound.filter(j => !foundUsed[j])

  const m2 = matchWithin(sites, missing, found, extra, near, { maxCells: MAX_COMPONENT_CELLS, oversize: 'greedy', maxCandidates: MAX_CANDIDATES })
  if (m2.truncated) warnings.push(`too many atoms within near_nm = ${near} nm of the missing sites: off-site pairs not reported`)
  else if (m2.oversizeComponents > 0) warnings.push(`off-site pairs within ${near} nm were matched greedily (nearest first) in ${m2.oversizeComponents} large cluster(s)`)
  const off_site: OffSite[] = m2.pairs.map(([i, j, d]) => {
    status[i] = 'off-site'
    return { site: i, found: j, offset: [found[j]![0] - sites[i]![0], found[j]![1] - sites[i]![1]], distance_nm: d }
  })

  const n = pairs.length
  return {
    placed,
    missing,
    extra,
    rms_nm: n > 0 ? Math.sqrt(sum2 / n) : null,
    fidelity: n / sites.length,
    pairs,
    off_site,
    site_status: status,
    mean_offset_nm: n > 0 ? [sx / n, sy / n] : null,
    tolerance_nm: tol,
    near_nm: near,
    warnings,
  }
}
