// Request bodies of the night: starting a build run, logging an outcome, re-planning, closing,
// and the as-built check. Bias in V, tunnelling current in A, speeds in nm/s, lengths in nm.
import { z } from 'zod'
import { OUTCOMES } from './types'

const finite = (what: string) => z.number({ error: `${what} must be a number` }).finite(`${what} must be a finite number`)

export const ManipulationParams = z.object({
  bias_V: finite('bias_V').min(-10, 'bias_V must lie within ±10 V').max(10, 'bias_V must lie within ±10 V').optional(),
  setpoint_A: finite('setpoint_A').gt(0, 'setpoint_A must be above 0 A').lt(1e-3, 'setpoint_A must be below 1 mA').optional(),
  tip_speed_nm_s: finite('tip_speed_nm_s').gt(0, 'tip_speed_nm_s must be above 0').max(1000, 'tip_speed_nm_s must be at most 1000 nm/s').optional(),
}).strict()
export type ManipulationParams = z.infer<typeof ManipulationParams>

export const RunStart = z.object({
  notes: z.string().max(5000, 'at most 5000 characters').optional(),
  params: ManipulationParams.optional(),
})

const point = z.tuple([finite('x (nm)'), finite('y (nm)')], { error: 'expected a point [x, y] in nm' })

export const EntryInput = z.object({
  move_index: z.number({ error: 'move_index must be a number' }).int('move_index must be a whole number').min(0, 'move_index must not be negative'),
  outcome: z.enum(OUTCOMES, { error: `outcome must be one of ${OUTCOMES.join(', ')}` }),
  params: ManipulationParams.optional(),
  note: z.string().max(2000, 'at most 2000 characters').optional(),
  position: point.optional(),
  supersedes: z.number().int().positive('supersedes must be an entry id').optional(),
  /** The route the client was looking at: a move index means nothing on another plan. */
  route_id: z.number().int().positive().optional(),
  idempotency_key: z.string({ error: 'idempotency_key is required' }).min(8, 'idempotency_key must have at least 8 characters').max(100, 'idempotency_key must have at most 100 characters'),
  expected_seq: z.number().int().min(0).optional(),
}).superRefine((v, ctx) => {
  if (v.outcome === 'off-site' && !v.position) ctx.addIssue({ code: 'custom', path: ['position'], message: 'an off-site outcome needs the position where the atom went' })
  if (v.outcome !== 'off-site' && v.position) ctx.addIssue({ code: 'custom', path: ['position'], message: 'only an off-site outcome records where the atom went' })
})
export type EntryInput = z.infer<typeof EntryInput>

export const ReplanRequest = z.object({
  /** Re-plan from a newer scan's marks instead of the logbook's positions. */
  scan_id: z.number().int().positive().optional(),
  /** With scan_id: a mark this close to a site counts as placed there (nm). */
  tolerance_nm: z.number().finite().gt(0, 'must be above 0 nm').max(1, 'at most 1 nm').optional(),
  expected_seq: z.number().int().min(0).optional(),
})

export const RunClose = z.object({
  note: z.string().max(5000, 'at most 5000 characters').optional(),
  /** The overlay picture the client rendered, PNG as base64 (a data: URL is accepted). */
  picture_png: z.string().max(8_000_000, 'the picture must be below 6 MB').optional(),
})

export const CheckRequest = z.object({
  scan_id: z.number({ error: 'scan_id is required' }).int().positive(),
  tolerance_nm: z.number().finite().gt(0, 'must be above 0 nm').max(5, 'at most 5 nm').optional(),
  near_nm: z.number().finite().gt(0, 'must be above 0 nm').max(20, 'at most 20 nm').optional(),
  run_id: z.number().int().positive().optional(),
})
