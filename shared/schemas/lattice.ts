// Saving a lattice fit of a scan: fitted from its marks (optionally seeded by the scan's Fourier
// transform), placed by hand, or locked/unlocked as it is.
import { z } from 'zod'

const vec = z.tuple([z.number().finite(), z.number().finite()], { error: 'expected a vector [x, y] in nm' })

export const LatticeFitSave = z.discriminatedUnion('mode', [
  z.object({
    mode: z.literal('fit'),
    surface: z.string().trim().min(1, 'a surface is required'),
    site: z.string().trim().min(1).optional(),
    affine: z.boolean().optional(),
    rotation_hint_deg: z.number().finite().optional(),
    use_fft: z.boolean().optional(),
  }),
  z.object({
    mode: z.literal('hand'),
    surface: z.string().trim().min(1, 'a surface is required'),
    site: z.string().trim().min(1),
    a1: vec,
    a2: vec,
    origin: vec,
    basis: z.array(vec).max(16).optional(),
    locked: z.boolean().optional(),
  }),
  z.object({ mode: z.literal('lock'), locked: z.boolean() }),
], { error: 'mode must be fit, hand or lock' })
export type LatticeFitSave = z.infer<typeof LatticeFitSave>
