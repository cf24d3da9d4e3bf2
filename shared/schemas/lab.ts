// Per-lab instrument settings: what the route's time estimate is computed from.
import { z } from 'zod'

const positive = (what: string) => z.number({ error: `${what} must be a number` }).finite().gt(0, `${what} must be above 0`)

export const LabSettings = z.object({
  // Lateral drag speed of the tip in nm/s (common practice: a few nm/s at manipulation setpoints).
  tip_speed_nm_s: positive('tip speed').max(1000),
  // Approach to manipulation setpoint, retract to imaging setpoint, settle: seconds per move.
  overhead_s_per_move: z.number().finite().min(0).max(3600),
  // A check scan after every k moves, taking check_scan_s seconds.
  check_every_moves: z.number().int().min(0).max(10000),
  check_scan_s: z.number().finite().min(0).max(36000),
})
export type LabSettings = z.infer<typeof LabSettings>

export const DEFAULT_LAB_SETTINGS: LabSettings = {
  tip_speed_nm_s: 2,
  overhead_s_per_move: 20,
  check_every_moves: 10,
  check_scan_s: 120,
}

export function withLabDefaults(settings: unknown): LabSettings {
  const parsed = LabSettings.partial().safeParse(settings ?? {})
  return { ...DEFAULT_LAB_SETTINGS, ...(parsed.success ? parsed.data : {}) }
}
