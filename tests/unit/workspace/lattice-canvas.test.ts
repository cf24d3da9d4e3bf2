// Hand-placement handle geometry, by hand computation.
import { describe, expect, it } from 'vitest'
import { KNOB_PX, handKnob, knobTurn } from '../../../utils/lattice-canvas'

describe('rotation knob', () => {
  const lat = { a1: [0.2, 0.2] as [number, number], origin: [5, 5] as [number, number] }
  it('sits KNOB_PX screen px from the origin along a1', () => {
    const [x, y] = handKnob(lat, 10)
    expect(Math.hypot(x - 5, y - 5) * 10).toBeCloseTo(KNOB_PX, 10)
    expect(Math.atan2(y - 5, x - 5) * 180 / Math.PI).toBeCloseTo(45, 10)
  })
  it('turns a1 (at 45°) to point at the pointer: to 90° is +45°, to −135° is 180° (wrapped)', () => {
    expect(knobTurn(lat, [5, 9])).toBeCloseTo(45, 10)
    expect(Math.abs(knobTurn(lat, [3, 3]))).toBeCloseTo(180, 10)
    expect(knobTurn(lat, [9, 1])).toBeCloseTo(-90, 10)
  })
})
