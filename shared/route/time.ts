// Instrument-time estimate of a route: drag time length/tip speed, a fixed overhead per move
// (approach to the manipulation setpoint, retract, settle), and a check scan after every k moves.
import type { TimeEstimate, TimeSettings } from './types'

// Same defaults as the lab settings (shared/schemas/lab.ts); common practice, changeable per lab.
export const DEFAULT_TIME: TimeSettings = {
  tip_speed_nm_s: 2,
  overhead_s_per_move: 20,
  check_every_moves: 10,
  check_scan_s: 120,
}

export function estimateTime(moves: ReadonlyArray<{ length_nm: number }>, settings: Partial<TimeSettings> = {}): TimeEstimate {
  const s = { ...DEFAULT_TIME, ...settings }
  const per_move_s: number[] = []
  let drag_s = 0, scans = 0
  moves.forEach((m, i) => {
    const drag = s.tip_speed_nm_s > 0 ? m.length_nm / s.tip_speed_nm_s : 0
    drag_s += drag
    let t = drag + s.overhead_s_per_move
    if (s.check_every_moves > 0 && (i + 1) % s.check_every_moves === 0) { t += s.check_scan_s; scans++ }
    per_move_s.push(t)
  })
  const overhead_s = s.overhead_s_per_move * moves.length
  const scan_s = scans * s.check_scan_s
  return { total_s: drag_s + overhead_s + scan_s, drag_s, overhead_s, scans, scan_s, per_move_s }
}
