// Scan frame ↔ instrument frame, checked with hand-worked points: the scan's centre maps to the
// offset, y turns upwards, and the rotation turns the window counter-clockwise.
import { describe, expect, it } from 'vitest'
import { fromInstrument, toInstrument, type Point } from '../../../shared/logbook'

const win = { size_x_nm: 20, size_y_nm: 10, offset_x_nm: 100, offset_y_nm: 200, rotation_deg: 0 }

describe('toInstrument', () => {
  it('puts the scan centre at the offset and flips y (hand-worked)', () => {
    expect(toInstrument([10, 5], win)).toEqual([100, 200])
    // Top-left corner of the image: half a width left, half a height up.
    expect(toInstrument([0, 0], win)).toEqual([90, 205])
  })

  it('rotates the window counter-clockwise by rotation_deg (hand-worked)', () => {
    const r = { ...win, rotation_deg: 90 }
    // The right edge's middle (u = 10, v = 0) turns onto +y.
    const [x, y] = toInstrument([20, 5], r)
    expect(x).toBeCloseTo(100, 12)
    expect(y).toBeCloseTo(210, 12)
  })

  it('round-trips through fromInstrument', () => {
    const r = { ...win, rotation_deg: -37.5, offset_x_nm: -12.25 }
    for (const p of [[0, 0], [3.2, 7.7], [20, 10]] as Point[]) {
      const back = fromInstrument(toInstrument(p, r), r)
      expect(back[0]).toBeCloseTo(p[0], 10)
      expect(back[1]).toBeCloseTo(p[1], 10)
    }
  })
})
