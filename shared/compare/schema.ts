// Input schema (zod) of the as-built check: blueprint sites against found adatom positions, nm.
import { z } from 'zod'

export const CHECK_LIMITS = { points: 100_000, tolerance_nm: 5, near_nm: 20 } as const

const coord = z.number({ error: 'coordinates must be finite numbers (nm)' })
const point = z.tuple([coord, coord], { error: 'must be a point [x, y] in nm' })

/**
 * POST /api/compute/check (API contract in the README), with one added optional field:
 *   near_nm   radius for the off-site search (default 0.5 nm): a missing site with an unmatched
 *             found atom within near_nm is reported in off_site with the offset.
 */
export const CheckInput = z.object({
  sites: z.array(point).min(1, 'a blueprint with 0 sites cannot be checked').max(CHECK_LIMITS.points, `at most ${CHECK_LIMITS.points} sites`),
  found: z.array(point).max(CHECK_LIMITS.points, `at most ${CHECK_LIMITS.points} found atoms`),
  tolerance_nm: z.number({ error: 'must be a number (nm)' }).gt(0, 'must be > 0 nm').max(CHECK_LIMITS.tolerance_nm, `must be ≤ ${CHECK_LIMITS.tolerance_nm} nm`).optional(),
  near_nm: z.number({ error: 'must be a number (nm)' }).gt(0, 'must be > 0 nm').max(CHECK_LIMITS.near_nm, `must be ≤ ${CHECK_LIMITS.near_nm} nm`).optional(),
})
export type CheckInput = z.input<typeof CheckInput>
