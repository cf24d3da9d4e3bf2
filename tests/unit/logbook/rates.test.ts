// Success rates and forecasts: the Wilson interval against published worked examples, the
// lattice symmetry and drag direction against hand-worked geometry, and bin tallies by hand.
import { describe, expect, it } from 'vitest'
import { forecastMoves, latticeSymmetry, moveDirection, tallyRates, wilson, type Attempt, type Point } from '../../../shared/logbook'

const deg = (d: number): Point => [Math.cos((d * Math.PI) / 180), Math.sin((d * Math.PI) / 180)]

describe('wilson', () => {
  it('matches the score intervals of Newcombe, Stat. Med. 17, 857 (1998), Table I (from memory)', () => {
    // 81/263 → 0.2553–0.3662; 15/148 → 0.0624–0.1605; 0/20 → 0–0.1611.
    const [a, b] = wilson(81, 263)!
    expect(a).toBeCloseTo(0.2553, 3)
    expect(b).toBeCloseTo(0.3662, 3)
    const [c, d] = wilson(15, 148)!
    expect(c).toBeCloseTo(0.0624, 3)
    expect(d).toBeCloseTo(0.1605, 3)
    const [e, f] = wilson(0, 20)!
    expect(e).toBe(0)
    expect(f).toBeCloseTo(0.1611, 3)
    expect(wilson(0, 0)).toBeNull()
  })
})

describe('lattice geometry', () => {
  it('tells hexagonal, square and rectangular cells apart (standard crystallography)', () => {
    expect(latticeSymmetry([1, 0], deg(120))).toBe(60)
    expect(latticeSymmetry([0.2553, 0], [-0.12765, 0.2211])).toBe(60)
    expect(latticeSymmetry([1, 0], [0, 1])).toBe(90)
    // fcc(110): a/√2 × a (Cu: 0.2553 × 0.361 nm), twofold.
    expect(latticeSymmetry([0.2553, 0], [0, 0.361])).toBe(180)
  })

  it('reduces the drag direction modulo the symmetry, relative to a1 (hand-worked)', () => {
    const a1 = deg(10)
    // Along a2 of a hexagonal cell (10° + 120°): a lattice direction, 0 mod 60.
    expect(moveDirection([[0, 0], deg(130)], a1, 60)).toBeCloseTo(0, 9)
    // 40° absolute is 30° from a1.
    expect(moveDirection([[1, 1], [1 + deg(40)[0], 1 + deg(40)[1]]], a1, 60)).toBeCloseTo(30, 9)
    // 0° absolute is −10° from a1 → 50° mod 60; a path's middle points do not matter.
    expect(moveDirection([[0, 0], [5, 5], deg(0)], a1, 60)).toBeCloseTo(50, 9)
    expect(moveDirection([[0, 0], [0, 0]], a1, 60)).toBeNull()
  })
})

describe('tallyRates and forecastMoves', () => {
  const at = (outcome: Attempt['outcome'], length_nm: number, angle_deg: number | null = 0, bias_V: number | null = null): Attempt => ({ outcome, length_nm, angle_deg, symmetry_deg: angle_deg === null ? null : 60, bias_V, setpoint_A: null })

  it('counts by outcome and by length bin; skipped is not an attempt (hand tally)', () => {
    const r = tallyRates([at('placed', 0.3), at('stayed', 0.4), at('placed', 1.5), at('lost', 1.5), at('skipped', 1.5), at('placed', 20)])
    expect(r.counts).toMatchObject({ placed: 3, stayed: 1, lost: 1, skipped: 1 })
    expect(r.attempts).toBe(5)
    expect(r.rate).toBeCloseTo(3 / 5, 12)
    expect(r.by_length[0]).toMatchObject({ from_nm: 0, to_nm: 0.5, attempts: 2, placed: 1 })
    expect(r.by_length[2]).toMatchObject({ from_nm: 1, to_nm: 2, attempts: 2, placed: 1 })
    expect(r.by_length.at(-1)).toMatchObject({ from_nm: 13, to_nm: null, attempts: 1, placed: 1 })
    expect(r.enough).toBe(false)
  })

  it('bins directions in sixths of the symmetry and groups the bias to 1 mV', () => {
    const r = tallyRates([at('placed', 1, 5, 0.0051), at('stayed', 1, 25, 0.005), at('placed', 1, 59, -0.01)])
    expect(r.by_direction).toHaveLength(1)
    const bins = r.by_direction[0]!.bins
    expect(bins.map(b => b.attempts)).toEqual([1, 0, 1, 0, 0, 1])
    expect(bins[2]).toMatchObject({ from_deg: 20, to_deg: 30, placed: 0 })
    expect(r.by_bias.map(b => [b.value, b.attempts])).toEqual([[-0.01, 1], [0.005, 2]])
  })

  it('forecasts only with at least 30 attempts: expected placed Σp, expected time Σ planned / p', () => {
    const few = tallyRates(Array.from({ length: 29 }, () => at('placed', 1)))
    expect(forecastMoves([{ length_nm: 1, estimate_s: 30 }], few)).toMatchObject({ enough: false, expected_placed: null, planned_s: 30 })
    // 40 attempts, 30 placed, all 1–2 nm: p = 0.75 in that bin (≥ 10 attempts there).
    const many = tallyRates([...Array.from({ length: 30 }, () => at('placed', 1.5)), ...Array.from({ length: 10 }, () => at('stayed', 1.5))])
    const f = forecastMoves([{ length_nm: 1.2, estimate_s: 30 }, { length_nm: 1.8, estimate_s: 60 }], many)
    expect(f.enough).toBe(true)
    expect(f.expected_placed).toBeCloseTo(1.5, 12)
    expect(f.expected_s).toBeCloseTo(90 / 0.75, 9)
    // A 4 nm move falls in an empty bin: the overall rate (also 0.75) applies.
    expect(forecastMoves([{ length_nm: 4, estimate_s: 15 }], many).expected_s).toBeCloseTo(20, 9)
  })
})
