// Input rules of POST /api/compute/route, shared by the server route and the solver's worker so
// that both reject the same bodies with the same field names (e.g. 'atoms.3.0').
import { z } from 'zod'
import { InputError } from '../errors'

/** Atoms plus sites in one request; 10 000 + 10 000 is the largest plan the solver is sized for. */
export const MAX_ROUTE_POINTS = 20000
export const MAX_KEEP_OUT = 100
export const MAX_KEEP_OUT_VERTICES = 1000

const coord = z.number({ error: 'must be a finite number' })
const Pt = z.tuple([coord, coord], { error: 'a point is written [x, y]' })
const index = z.number({ error: 'must be an index' }).int('must be a whole number').min(0, 'must not be negative')
const nonNeg = (what: string) => z.number({ error: `${what} must be a number` }).min(0, `${what} must not be negative`)

export const TimeSettingsInput = z.object({
  tip_speed_nm_s: z.number({ error: 'must be a number' }).gt(0, 'must be above 0'),
  overhead_s_per_move: nonNeg('overhead'),
  check_every_moves: index,
  check_scan_s: nonNeg('scan time'),
}).partial()

export const RouteInput = z.object({
  atoms: z.array(Pt, { error: 'atoms must be a list of [x, y]' }).min(1, 'at least one atom is needed').max(MAX_ROUTE_POINTS, `at most ${MAX_ROUTE_POINTS} atoms`),
  sites: z.array(Pt, { error: 'sites must be a list of [x, y]' }).min(1, 'at least one site is needed').max(MAX_ROUTE_POINTS, `at most ${MAX_ROUTE_POINTS} sites`),
  lattice: z.object({ a1: Pt, a2: Pt, origin: Pt }).optional(),
  clearance_nm: z.number({ error: 'must be a number' }).min(0, 'must not be negative').max(100, 'at most 100 nm').optional(),
  cost: z.enum(['distance', 'squared'], { error: 'must be \'distance\' or \'squared\'' }).optional(),
  locked: z.array(index).optional(),
  excluded: z.array(index).optional(),
  keep_out: z.array(z.array(Pt).min(3, 'a polygon needs at least 3 corners').max(MAX_KEEP_OUT_VERTICES)).max(MAX_KEEP_OUT).optional(),
  time: TimeSettingsInput.optional(),
  /** Re-plan: [siteIndex, atomIndex] pairs already satisfied. */
  placed: z.array(z.tuple([index, index])).optional(),
}).superRefine((v, ctx) => {
  if (v.atoms.length + v.sites.length > MAX_ROUTE_POINTS) {
    ctx.addIssue({ code: 'custom', path: ['atoms'], message: `atoms + sites must not exceed ${MAX_ROUTE_POINTS} (got ${v.atoms.length + v.sites.length})` })
  }
  if (v.lattice) {
    const { a1, a2 } = v.lattice
    const l1 = Math.hypot(a1[0], a1[1]), l2 = Math.hypot(a2[0], a2[1])
    if (l1 < 1e-3) ctx.addIssue({ code: 'custom', path: ['lattice', 'a1'], message: 'a1 must be a vector of non-zero length' })
    else if (l2 < 1e-3) ctx.addIssue({ code: 'custom', path: ['lattice', 'a2'], message: 'a2 must be a vector of non-zero length' })
    else if (Math.abs(a1[0] * a2[1] - a1[1] * a2[0]) < 1e-6 * l1 * l2) {
      ctx.addIssue({ code: 'custom', path: ['lattice', 'a2'], message: 'a1 and a2 must not be parallel' })
    }
  }
  for (const name of ['locked', 'excluded'] as const) {
    v[name]?.forEach((i, k) => {
      if (i >= v.atoms.length) ctx.addIssue({ code: 'custom', path: [name, k], message: `atom ${i} does not exist (there are ${v.atoms.length})` })
    })
  }
  const seenSite = new Set<number>(), seenAtom = new Set<number>()
  v.placed?.forEach(([s, a], k) => {
    if (s >= v.sites.length) ctx.addIssue({ code: 'custom', path: ['placed', k, 0], message: `site ${s} does not exist` })
    if (a >= v.atoms.length) ctx.addIssue({ code: 'custom', path: ['placed', k, 1], message: `atom ${a} does not exist` })
    if (seenSite.has(s)) ctx.addIssue({ code: 'custom', path: ['placed', k, 0], message: `site ${s} is placed twice` })
    if (seenAtom.has(a)) ctx.addIssue({ code: 'custom', path: ['placed', k, 1], message: `atom ${a} is placed twice` })
    seenSite.add(s)
    seenAtom.add(a)
  })
})

export type RouteInput = z.infer<typeof RouteInput>

/** Parses a raw body; throws InputError naming the first offending field, e.g. 'atoms.3.0'. */
export function validateRouteInput(raw: unknown): RouteInput {
  const r = RouteInput.safeParse(raw)
  if (r.success) return r.data
  const issue = r.error.issues[0]!
  const field = issue.path.length ? issue.path.map(String).join('.') : 'body'
  throw new InputError(field, issue.message)
}
