// Time estimate: drag length / tip speed + overhead per move + a check scan every k moves
// (closed form, computed by hand below).
import { describe, expect, it } from 'vitest'
import { estimateTime } from '../../../shared/route/index'

describe('estimateTime', () => {
  it('sums drag, overhead and check scans', () => {
    const moves = [1, 2, 3, 4, 5].map(l => ({ length_nm: l }))
    const t = estimateTime(moves, { tip_speed_nm_s: 0.5, overhead_s_per_move: 10, check_every_moves: 2, check_scan_s: 60 })
    // By hand: drag 15 nm / 0.5 nm/s = 30 s; overhead 5 × 10 = 50 s; scans after moves 2 and 4 = 120 s.
    expect(t.drag_s).toBeCloseTo(30, 12)
    expect(t.overhead_s).toBe(50)
    expect(t.scans).toBe(2)
    expect(t.total_s).toBeCloseTo(200, 12)
    expect(t.per_move_s).toEqual([12, 14 + 60, 16, 18 + 60, 20])
  })
  it('no scans when check_every_moves is 0', () => {
    expect(estimateTime([{ length_nm: 2 }], { check_every_moves: 0, tip_speed_nm_s: 2, overhead_s_per_move: 0 }).total_s).toBe(1)
  })
})
