// The instrument-frame transform against hand-computed cases: p = offset + R(θ)·(u, v), with
// (u, v) the scan-frame point relative to the anchor and v flipped for an upward y axis.
// Every expected value below is worked out by hand in the comment beside it.
import { describe, expect, it } from 'vitest'
import { fromInstrumentFrame, toInstrumentFrame, type FrameConvention, type ScanWindow, type XY } from '../../../shared/export/frame'

const close = (got: XY[], want: XY[]) => {
  expect(got).toHaveLength(want.length)
  got.forEach((p, k) => {
    expect(p[0]).toBeCloseTo(want[k]![0], 10)
    expect(p[1]).toBeCloseTo(want[k]![1], 10)
  })
}

describe('toInstrumentFrame', () => {
  it('turns a 10 nm window by 90° about its centre and shifts it to (100, 50) nm', () => {
    const w: ScanWindow = { size_x_nm: 10, size_y_nm: 10, offset_x_nm: 100, offset_y_nm: 50, rotation_deg: 90 }
    // (5, 5): the centre itself → the offset (100, 50).
    // (10, 0): top-right corner, u = 5, v = +5 (up) → (100 + 5·0 − 5·1, 50 + 5·1 + 5·0) = (95, 55).
    // (0, 10): bottom-left corner, u = −5, v = −5 → (100 + 0 − (−5)·1, 50 + (−5)·1 + 0) = (105, 45).
    close(toInstrumentFrame([[5, 5], [10, 0], [0, 10]], w), [[100, 50], [95, 55], [105, 45]])
  })

  it('turns by 30° about the top-left corner with y down the image', () => {
    const w: ScanWindow = { size_x_nm: 12, size_y_nm: 6, offset_x_nm: -20, offset_y_nm: 8, rotation_deg: 30 }
    const c: FrameConvention = { anchor: 'corner', y_axis: 'down' }
    // cos 30° = √3/2, sin 30° = 1/2.
    // (2, 0): u = 2, v = 0 → (−20 + 2·√3/2, 8 + 2·½) = (−20 + √3, 9).
    // (0, 4): u = 0, v = 4 → (−20 − 4·½, 8 + 4·√3/2) = (−22, 8 + 2√3).
    close(toInstrumentFrame([[2, 0], [0, 4]], w, c), [[-20 + Math.sqrt(3), 9], [-22, 8 + 2 * Math.sqrt(3)]])
  })

  it('turns by −45° and maps an unrotated window by its centre alone', () => {
    const w: ScanWindow = { size_x_nm: 8, size_y_nm: 8, offset_x_nm: 1, offset_y_nm: 2, rotation_deg: -45 }
    // (8, 4): u = 4, v = 0 → (1 + 4·cos(−45°), 2 + 4·sin(−45°)) = (1 + 2√2, 2 − 2√2).
    close(toInstrumentFrame([[8, 4]], w), [[1 + 2 * Math.SQRT2, 2 - 2 * Math.SQRT2]])
    const flat: ScanWindow = { size_x_nm: 20, size_y_nm: 16, offset_x_nm: 0, offset_y_nm: 0, rotation_deg: 0 }
    // θ = 0: (0, 0) is the top-left corner, u = −10, v = +8 (up) → (−10, 8); (20, 16) → (10, −8).
    close(toInstrumentFrame([[0, 0], [20, 16]], flat), [[-10, 8], [10, -8]])
  })

  it('keeps lengths (a rigid motion): a 3-4-5 triangle stays 3-4-5', () => {
    const w: ScanWindow = { size_x_nm: 30, size_y_nm: 30, offset_x_nm: 7, offset_y_nm: -3, rotation_deg: 17 }
    const [a, b, c] = toInstrumentFrame([[1, 1], [4, 1], [4, 5]], w)
    expect(Math.hypot(b![0] - a![0], b![1] - a![1])).toBeCloseTo(3, 12)
    expect(Math.hypot(c![0] - b![0], c![1] - b![1])).toBeCloseTo(4, 12)
    expect(Math.hypot(c![0] - a![0], c![1] - a![1])).toBeCloseTo(5, 12)
  })
})

describe('fromInstrumentFrame', () => {
  it('takes the hand-computed instrument points of the 90° case back to the scan frame', () => {
    const w: ScanWindow = { size_x_nm: 10, size_y_nm: 10, offset_x_nm: 100, offset_y_nm: 50, rotation_deg: 90 }
    close(fromInstrumentFrame([[100, 50], [95, 55], [105, 45]], w), [[5, 5], [10, 0], [0, 10]])
    const c: FrameConvention = { anchor: 'corner', y_axis: 'down' }
    const w30: ScanWindow = { size_x_nm: 12, size_y_nm: 6, offset_x_nm: -20, offset_y_nm: 8, rotation_deg: 30 }
    close(fromInstrumentFrame([[-22, 8 + 2 * Math.sqrt(3)]], w30, c), [[0, 4]])
  })
})
