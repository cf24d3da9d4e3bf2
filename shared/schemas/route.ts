// Solving and re-planning a saved route: what the client sends. Atoms come from a scan's marks
// (or, for a re-plan, their current positions), sites from the blueprint through the scan's
// lattice fit; the solver's own input rules (shared/route/schema.ts) apply on top.
import { z } from 'zod'
import { MAX_ROUTE_POINTS } from '../route/schema'

const finite = z.number({ error: 'must be a finite number' })
const Pt = z.tuple([finite, finite], { error: 'a point is written [x, y] in nm' })
const index = z.number({ error: 'must be an index' }).int('must be a whole number').min(0, 'must not be negative')
const id = (what: string) => z.number({ error: `${what} must be the id of a ${what.replace(/_id$/, '')}` }).int().positive()

const SolveOptions = {
  clearance_nm: z.number({ error: 'must be a number in nm' }).min(0, 'must not be negative').max(100, 'at most 100 nm').optional(),
  cost: z.enum(['distance', 'squared'], { error: 'must be \'distance\' or \'squared\'' }).optional(),
  /** Mark indices (in the scan's latest marks, or in `atoms` for a re-plan) that never move. */
  locked: z.array(index).max(MAX_ROUTE_POINTS).optional(),
  /** Mark indices not to be used; they stay where they are as obstacles. */
  excluded: z.array(index).max(MAX_ROUTE_POINTS).optional(),
  /** Polygons (scan frame, nm) that no path may enter. */
  keep_out: z.array(z.array(Pt).min(3, 'a polygon needs at least 3 corners').max(1000, 'at most 1000 corners'), { error: 'keep_out must be a list of polygons' }).max(100, 'at most 100 polygons').optional(),
}

export const RouteSolveBody = z.object({
  scan_id: id('scan_id'),
  ...SolveOptions,
})
export type RouteSolveBody = z.infer<typeof RouteSolveBody>

export const RouteReplanBody = z.object({
  /** Current positions of all atoms (scan frame of the route's scan, nm)… */
  atoms: z.array(Pt, { error: 'atoms must be a list of [x, y]' }).min(1, 'at least one atom is needed').max(MAX_ROUTE_POINTS, `at most ${MAX_ROUTE_POINTS} atoms`).optional(),
  /** …or a newer scan of the same sample whose latest marks and lattice fit are used. */
  scan_id: id('scan_id').optional(),
  /** [siteIndex, atomIndex] pairs already satisfied: the atom stays on that site. */
  placed: z.array(z.tuple([index, index], { error: 'a placed pair is written [siteIndex, atomIndex]' }), { error: 'placed must be a list of [siteIndex, atomIndex]' }).max(MAX_ROUTE_POINTS),
  ...SolveOptions,
}).superRefine((v, ctx) => {
  if (v.atoms && v.scan_id !== undefined) ctx.addIssue({ code: 'custom', path: ['scan_id'], message: 'give either atoms or scan_id, not both' })
  if (!v.atoms && v.scan_id === undefined) ctx.addIssue({ code: 'custom', path: ['atoms'], message: 'give the atoms\' current positions (atoms) or a newer scan (scan_id)' })
})
export type RouteReplanBody = z.infer<typeof RouteReplanBody>
