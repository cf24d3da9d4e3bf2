// Histogram, percentiles and robust statistics against brute force on sorted copies (type-7
// quantile, Hyndman & Fan 1996; numpy's default), and the normal consistency of 1.4826·MAD:
// 1/Φ⁻¹(0.75) with Φ⁻¹(0.75) = 0.6744897501960817 (standard normal quartile; A&S Table 26.5).
import { describe, expect, it } from 'vitest'
import { histogram, percentileRange, robustStats } from '../../../shared/scan/contrast'
import { quantileInPlace, selectInPlace } from '../../../shared/scan/select'
import { mulberry32, normalGenerator } from '../../../shared/scan/synthetic'

function type7(sorted: number[], q: number): number {
  const pos = q * (sorted.length - 1)
  const k = Math.floor(pos)
  return k + 1 < sorted.length ? sorted[k]! + (pos - k) * (sorted[k + 1]! - sorted[k]!) : sorted[k]!
}

const rnd = mulberry32(21)
const normal = normalGenerator(rnd)

describe('order statistics', () => {
  it('quickselect finds the k-th smallest, with many ties and sorted input', () => {
    for (const make of [() => Math.floor(rnd() * 5), () => rnd(), () => 0]) {
      const values = Array.from({ length: 501 }, make)
      const sorted = [...values].sort((a, b) => a - b)
      for (const k of [0, 1, 250, 499, 500]) expect(selectInPlace(Float64Array.from(values), k)).toBe(sorted[k])
      const asc = Float64Array.from(sorted)
      expect(selectInPlace(asc, 123)).toBe(sorted[123])
    }
  })

  it('quantiles follow the type-7 definition', () => {
    const values = Array.from({ length: 1000 }, () => normal())
    const sorted = [...values].sort((a, b) => a - b)
    for (const q of [0, 0.005, 0.25, 0.5, 0.737, 0.995, 1]) {
      expect(quantileInPlace(Float64Array.from(values), q)).toBeCloseTo(type7(sorted, q), 12)
    }
    const { lo, hi } = percentileRange(Float32Array.from(values))
    const sorted32 = Array.from(Float32Array.from(values)).sort((a, b) => a - b)
    expect(lo).toBeCloseTo(type7(sorted32, 0.005), 12)
    expect(hi).toBeCloseTo(type7(sorted32, 0.995), 12)
  })
})

describe('histogram', () => {
  it('counts like a brute-force binning, max in the last bin, NaN set aside', () => {
    const values = Array.from({ length: 2000 }, () => normal())
    values.push(Number.NaN)
    const h = histogram(values, 17)
    const finite = values.filter(Number.isFinite)
    const min = Math.min(...finite), max = Math.max(...finite)
    const brute = new Array(17).fill(0)
    for (const v of finite) brute[Math.min(16, Math.floor(((v - min) / (max - min)) * 17))]++
    expect(Array.from(h.counts)).toEqual(brute)
    expect([h.min, h.max, h.nonFinite]).toEqual([min, max, 1])
    const r = histogram([0, 0.5, 1, 2, -1], 2, { min: 0, max: 1 })
    expect(Array.from(r.counts)).toEqual([1, 2])
    expect([r.below, r.above]).toEqual([1, 1])
    expect(() => histogram([1], 0)).toThrow(/bins must be a whole number/)
  })
})

describe('robust statistics', () => {
  it('median and MAD equal their definitions on a sorted copy', () => {
    const values = Array.from({ length: 777 }, () => rnd() ** 3)
    const s = robustStats(values)
    const sorted = [...values].sort((a, b) => a - b)
    const med = sorted[388]!
    const dev = values.map(v => Math.abs(v - med)).sort((a, b) => a - b)
    expect(s.median).toBe(med)
    expect(s.mad).toBe(dev[388])
  })

  it('1.4826·MAD estimates σ of normal data, unmoved by 10 % outliers', () => {
    const values = Array.from({ length: 200000 }, () => 3 + 0.2 * normal())
    for (let i = 0; i < 20000; i++) values[i] = 1000
    const s = robustStats(values)
    expect(1 / 0.6744897501960817).toBeCloseTo(1.4826, 4)
    // Outliers shift median and MAD slightly (a 10 % contamination); σ stays within 15 %.
    expect(s.median).toBeCloseTo(3, 1)
    expect(Math.abs(s.sigma / 0.2 - 1)).toBeLessThan(0.15)
    const clean = robustStats(values.slice(20000))
    expect(Math.abs(clean.sigma / 0.2 - 1)).toBeLessThan(0.01)
  })
})
