import { z } from 'zod'

export const BuildInput = z.object({
  name: z.string({ error: 'a name is required' }).trim().min(1, 'a name is required').max(120, 'at most 120 characters'),
  notes: z.string().max(5000, 'at most 5000 characters').optional(),
})
