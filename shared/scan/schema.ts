// Input schema of POST /api/compute/detect (API contract in the README). The scalar fields go through zod;
// the height array (up to 8192² numbers) is checked by one plain loop inside the schema's
// refinement, because a zod array of numbers costs several times more (figures in
// tests/bench/scan.bench.ts). Every issue's path names the field, e.g. ['data', 1234].
import { z } from 'zod'
import { InputError } from '../errors'
import { MAX_SIDE } from './grid'
import type { DetectParams } from './detect'

const side = (field: string) => z
  .number({ error: `${field} must be a number` })
  .int(`${field} must be a whole number`)
  .min(1, `${field} must be at least 1`)
  .max(MAX_SIDE, `${field} must be at most ${MAX_SIDE}`)

const positiveNm = (field: string) => z
  .number({ error: `${field} must be a finite number (nm)` })
  .positive(`${field} must be greater than 0 nm`)

const pixelSize = z.union([
  positiveNm('pixel_nm'),
  z.tuple([positiveNm('pixel_nm[0]'), positiveNm('pixel_nm[1]')], { error: 'pixel_nm must be [px, py] in nm' }),
], { error: 'pixel_nm must be a number of nm or [px, py]' })

/** Reports at most this many bad cells, so a wholly bad array does not produce millions of issues. */
const MAX_DATA_ISSUES = 10

export const DetectInput = z.object({
  width: side('width'),
  height: side('height'),
  data: z.custom<number[]>(v => Array.isArray(v), { error: 'data must be an array of heights in nm' }),
  pixel_nm: pixelSize,
  fwhm_nm: positiveNm('fwhm_nm').max(100, 'fwhm_nm must be at most 100 nm').optional(),
  min_height_nm: z.number({ error: 'min_height_nm must be a finite number (nm)' }).min(0, 'min_height_nm must be ≥ 0').optional(),
  threshold_k: z.number({ error: 'threshold_k must be a finite number' }).positive('threshold_k must be greater than 0').optional(),
  min_separation_nm: z.number({ error: 'min_separation_nm must be a finite number (nm)' }).min(0, 'min_separation_nm must be ≥ 0').optional(),
}, { error: 'the body must be an object with width, height, data and pixel_nm' }).superRefine((v, ctx) => {
  const n = v.width * v.height
  if (v.data.length !== n) {
    ctx.addIssue({ code: 'custom', path: ['data'], message: `data holds ${v.data.length} values but width × height = ${n}` })
    return
  }
  let bad = 0
  const d = v.data
  for (let i = 0; i < n; i++) {
    const x = d[i]
    // typeof + finite test in one loop: no per-element closure or issue object unless bad.
    if (typeof x !== 'number' || !Number.isFinite(x)) {
      ctx.addIssue({ code: 'custom', path: ['data', i], message: `data[${i}] (row ${Math.floor(i / v.width)}, column ${i % v.width}) must be a finite number of nm` })
      if (++bad >= MAX_DATA_ISSUES) return
    }
  }
})

export type DetectInputT = z.infer<typeof DetectInput>

/** 'data[12]', 'pixel_nm[1]', 'width' … from a zod issue path. */
export function fieldOf(path: readonly PropertyKey[]): string {
  return path.reduce<string>((s, k) => (typeof k === 'number' ? `${s}[${k}]` : s ? `${s}.${String(k)}` : String(k)), '')
}

/** Parses a request body into detector parameters, throwing InputError for the first problem. */
export function parseDetectInput(body: unknown): DetectParams {
  const r = DetectInput.safeParse(body)
  if (!r.success) {
    const issue = r.error.issues[0]!
    throw new InputError(fieldOf(issue.path) || 'body', issue.message)
  }
  return r.data
}
