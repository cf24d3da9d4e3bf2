// The frame of an uploaded scan, as the upload form sends it (multipart text fields, so numbers
// arrive as strings). Lengths in nm, bias in V, setpoint current in A.
import { z } from 'zod'

const num = (field: string) => z.preprocess(
  v => (typeof v === 'string' ? (v.trim() === '' ? undefined : Number(v)) : v),
  z.number({ error: `${field} must be a number` }).finite(`${field} must be a finite number`),
)
const optionalNum = (field: string) => num(field).optional()
const positive = (field: string, max: number) => num(field).refine(v => v > 0, `${field} must be above 0`).refine(v => v <= max, `${field} must be at most ${max}`)

export const ScanFrameInput = z.object({
  size_x_nm: positive('size_x_nm', 100_000),
  size_y_nm: positive('size_y_nm', 100_000),
  offset_x_nm: optionalNum('offset_x_nm'),
  offset_y_nm: optionalNum('offset_y_nm'),
  rotation_deg: optionalNum('rotation_deg').refine(v => v === undefined || Math.abs(v) <= 360, 'rotation_deg must lie within ±360°'),
  bias_V: optionalNum('bias_V').refine(v => v === undefined || Math.abs(v) <= 10, 'bias_V must lie within ±10 V'),
  setpoint_A: optionalNum('setpoint_A').refine(v => v === undefined || (v > 0 && v < 1e-3), 'setpoint_A must be a current above 0 A and below 1 mA'),
  nm_per_level: optionalNum('nm_per_level'),
  z_range_nm: optionalNum('z_range_nm'),
  height_factor: optionalNum('height_factor'),
  taken_at: z.preprocess(v => (v === '' ? undefined : v), z.iso.datetime({ offset: true, local: true, error: 'taken_at must be a date and time' }).optional()),
  notes: z.string().max(5000, 'notes: at most 5000 characters').optional(),
  purpose: z.enum(['plan', 'after'], { error: 'purpose must be plan or after' }).optional(),
  build_id: optionalNum('build_id').refine(v => v === undefined || (Number.isInteger(v) && v > 0), 'build_id must be an id'),
})
export type ScanFrameInput = z.infer<typeof ScanFrameInput>

// Non-destructive processing saved with a scan; the original file and stored grid are untouched.
export const ScanProcessing = z.object({
  plane: z.boolean().default(true),
  lines: z.enum(['none', 'median-diff', 'poly0', 'poly1', 'poly2', 'poly3']).default('median-diff'),
  colormap: z.enum(['grey', 'kiln', 'fjord']).default('grey'),
  low_pct: z.number().min(0).max(50).default(0.5),
  high_pct: z.number().min(50).max(100).default(99.5),
  invert: z.boolean().default(false),
})
export type ScanProcessing = z.infer<typeof ScanProcessing>
export const DEFAULT_PROCESSING: ScanProcessing = ScanProcessing.parse({})

export const MarkInput = z.object({
  x_nm: z.number().finite(),
  y_nm: z.number().finite(),
  height_nm: z.number().finite().default(0),
  score: z.number().finite().default(0),
  species: z.string().trim().max(24, 'species: at most 24 characters').optional(),
})
export const MarksSave = z.object({
  marks: z.array(MarkInput).max(200_000, 'at most 200 000 marks'),
  base_version: z.number().int().min(0),
})
export const DetectRequest = z.object({
  fwhm_nm: z.number().finite().gt(0, 'fwhm_nm must be above 0').max(50).optional(),
  min_height_nm: z.number().finite().min(0, 'min_height_nm must be ≥ 0').max(100).optional(),
  threshold_k: z.number().finite().gt(0).max(100).optional(),
})
