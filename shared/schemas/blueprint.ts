// Saving a blueprint: its shapes (validated and expanded by shared/blueprint before anything is
// stored) and, for an edit, the lineage and the version the editor started from.
import { z } from 'zod'
import { Shape } from '../blueprint/schema'

export const BlueprintSave = z.object({
  name: z.string().trim().min(1, 'a name is required').max(120, 'at most 120 characters'),
  surface: z.string().trim().min(1, 'a surface is required'),
  site: z.string().trim().min(1).optional(),
  shapes: z.array(Shape).min(1, 'a blueprint needs at least one shape').max(500, 'at most 500 shapes'),
  min_spacing_nm: z.number().finite().gt(0, 'must be above 0 nm').max(100).optional(),
  lineage: z.number().int().positive().optional(),
  base_version: z.number().int().positive().optional(),
  /** A scan of the lab with a lattice fit: chains must then stay inside that scan. */
  scan_id: z.number().int().positive().optional(),
})
export type BlueprintSave = z.infer<typeof BlueprintSave>
