import { describe, expect, it } from 'vitest'
import { findSpectrumPeaks, matchPeaksToLevels, movingAverage } from '../../../shared/waves/peaks'
import { corralLevels, lorentzian } from '../../../shared/waves/corral'

function grid(from: number, to: number, n: number): number[] {
  return Array.from({ length: n }, (_, i) => from + ((to - from) * i) / (n - 1))
}
function rng(seed: number) {
  let s = seed
  return () => (s = (s * 16807) % 2147483647) / 2147483647
}

describe('peak finder on Lorentzian sums', () => {
  it('finds the centre of one sampled Lorentzian exactly (1/L is a parabola: closed form)', () => {
    // Centre between samples on purpose: 0.01237 V on a 5 mV grid.
    const x = grid(-0.2, 0.2, 81)
    const y = x.map(v => lorentzian(v - 0.01237, 0.008))
    const [p, ...rest] = findSpectrumPeaks(x, y)
    expect(rest).toEqual([])
    expect(p!.x).toBeCloseTo(0.01237, 12)
    // Peak height of a unit-area Lorentzian: 1/(πΓ) (closed form); the base falls to L(0.2 V).
    expect(p!.y).toBeCloseTo(1 / (Math.PI * 0.008), 8)
    const edge = Math.max(y[0]!, y[80]!)
    expect(p!.prominence).toBeCloseTo(y[p!.index]! - edge, 12)
  })

  it('places the two maxima of two equal Lorentzians at x² = 2d√(d² + Γ²) − (d² + Γ²) (closed form)', () => {
    // f = L(x − d) + L(x + d); f′ = 0 reduces to (x² + d² + Γ²)² − 4d²(x² + d² + Γ²) + 4d²x² = 0.
    const d = 0.02
    const G = 0.01
    const c = d * d + G * G
    const xp = Math.sqrt(2 * d * Math.sqrt(c) - c)
    const x = grid(-0.1, 0.1, 401)
    const y = x.map(v => lorentzian(v - d, G) + lorentzian(v + d, G))
    const peaks = findSpectrumPeaks(x, y)
    expect(peaks).toHaveLength(2)
    // The reciprocal parabola is exact only for one Lorentzian; with the neighbour's tail the
    // residual is below 1 % of the 0.5 mV sampling step here (measured 2e-7 V).
    expect(Math.abs(peaks[0]!.x + xp)).toBeLessThan(5e-6)
    expect(Math.abs(peaks[1]!.x - xp)).toBeLessThan(5e-6)
    // Closer than Γ/√3 the two merge into one maximum (closed form: x² > 0 ⇔ 3d² > Γ²).
    const merged = x.map(v => lorentzian(v - 0.005, G) + lorentzian(v + 0.005, G))
    expect(findSpectrumPeaks(x, merged).map(p => +p.x.toFixed(9))).toEqual([0])
  })

  it('separates the hard-wall levels of the 7.13 nm Cu(111) ring when the broadening allows', () => {
    // Levels: E0 = −0.44 eV, m* = 0.38, R = 7.13 nm (worked check, derived); the m = 0
    // levels, each a unit-area Lorentzian.
    const lv = corralLevels({ radius_nm: 7.13, E0_eV: -0.44, m_eff: 0.38, count: 30 }).filter(l => l.m === 0).slice(0, 3)
    const x = grid(-0.45, -0.25, 2001)
    const y = x.map(v => lv.reduce((s, l) => s + lorentzian(v - l.E_eV, 0.003), 0))
    const peaks = findSpectrumPeaks(x, y)
    expect(peaks).toHaveLength(3)
    // A neighbour ΔE away shifts a maximum by ≈ Γ⁴/ΔE³ (first order: L′ of the neighbour over the
    // curvature L″(0) = −2/(πΓ³) of the peak), ≈ 7e-7 eV for Γ = 3 meV, ΔE ≥ 49 meV.
    peaks.forEach((p, i) => expect(Math.abs(p.x - lv[i]!.E_eV)).toBeLessThan(3e-6))
  })

  it('ignores noise below the prominence threshold and keeps the peaks (fixed seed)', () => {
    const r = rng(5)
    const x = grid(-0.3, 0.3, 601)
    const y = x.map(v => lorentzian(v + 0.1, 0.01) + 0.6 * lorentzian(v - 0.08, 0.015) + 3 * (r() - 0.5))
    const found = findSpectrumPeaks(x, y, { smooth: 5, minProminenceFraction: 0.2 })
    expect(found.map(p => Math.round(p.x * 100) / 100)).toEqual([-0.1, 0.08])
    expect(findSpectrumPeaks(x, y, { minProminence: 0 }).length).toBeGreaterThan(50)
  })

  it('reports a flat top once, no edge maxima, and refuses unsorted x', () => {
    expect(findSpectrumPeaks([0, 1, 2, 3, 4], [0, 2, 2, 2, 0]).map(p => p.x)).toEqual([2])
    expect(findSpectrumPeaks([0, 1, 2, 3], [5, 4, 3, 2])).toEqual([])
    expect(() => findSpectrumPeaks([0, 2, 1], [0, 1, 0])).toThrow(/ascending/)
  })

  it('smooths with a centred moving average (hand computation)', () => {
    expect(Array.from(movingAverage([0, 3, 6, 3, 0], 3))).toEqual([1.5, 3, 4, 3, 1.5])
  })
})

describe('matching peaks to model levels', () => {
  it('pairs each peak with the nearest level and gives the difference in meV (hand computation)', () => {
    const levels = [{ E_eV: -0.4286, label: '0,1' }, { E_eV: -0.4110, label: '1,1' }, { E_eV: -0.3880, label: '2,1' }]
    const m = matchPeaksToLevels([-0.425, -0.39], levels)
    expect(m.map(x => x.level?.label)).toEqual(['0,1', '2,1'])
    expect(m[0]!.diff_meV).toBeCloseTo(3.6, 9)
    expect(m[1]!.diff_meV).toBeCloseTo(-2.0, 9)
    expect(matchPeaksToLevels([0.1], [])[0]).toEqual({ peak_eV: 0.1, level: null, diff_meV: null })
  })
})
