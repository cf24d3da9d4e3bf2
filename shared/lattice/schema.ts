// Input validation for POST /api/compute/lattice-fit (API contract in the README), shared by server and client.
import { z } from 'zod'
import { InputError } from '../errors'

const finite = (what: string) => z.number({ error: `${what} must be a finite number` }).refine(Number.isFinite, `${what} must be a finite number`)

export const Point = z.tuple([finite('x (nm)'), finite('y (nm)')], { error: 'expected a point [x, y] in nm' })

export const LatticeFitInput = z.object({
  surface: z.string({ error: 'surface must be a surface id such as "Cu(111)"' }).min(1, 'surface must not be empty'),
  site: z.string().min(1).optional(),
  marks: z.array(Point, { error: 'marks must be a list of [x, y] points in nm' })
    .min(3, 'a lattice fit needs at least 3 marks')
    .max(100_000, 'at most 100 000 marks'),
  affine: z.boolean().optional(),
  rotation_hint_deg: finite('rotation_hint_deg').optional(),
})

export type LatticeFitInput = z.infer<typeof LatticeFitInput>

/** Zod issue path → field name in the house form: ['marks', 3, 0] → 'marks[3][0]'. */
export function issueField(path: readonly PropertyKey[]): string {
  let out = ''
  for (const p of path) out += typeof p === 'number' ? `[${p}]` : out ? `.${String(p)}` : String(p)
  return out || 'body'
}

/** Parse a request body; throws InputError naming the first bad field. */
export function parseLatticeFitInput(body: unknown): LatticeFitInput {
  const r = LatticeFitInput.safeParse(body)
  if (!r.success) {
    const issue = r.error.issues[0]!
    throw new InputError(issueField(issue.path), issue.message)
  }
  return r.data
}
