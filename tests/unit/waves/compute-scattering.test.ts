import { describe, expect, it } from 'vitest'
import { computeScattering } from '../../../shared/waves/compute-scattering'
import { BLACK_DOT, ScatteringAtEnergy, waveNumber } from '../../../shared/waves/scattering'
import { isInputError } from '../../../shared/errors'
import { SURFACE_STATE_PRESETS, findPreset } from '../../../shared/waves/presets'

const base = { E0_eV: -0.44, m_eff: 0.38 }

function field(fn: () => unknown): string {
  try {
    fn()
  }
  catch (e) {
    if (isInputError(e)) return e.field
    throw e
  }
  return '(no error)'
}

describe('computeScattering', () => {
  const pair: [number, number][] = [[0, 0], [1.5, 0]]

  it('returns a spectrum at `point` and a map at bias_V, in units of ρ∞', () => {
    const out = computeScattering({ ...base, scatterers: pair, point: [0.7, 0.3], spectrum_points: 11, spectrum_range_eV: [-0.4, 0], bias_V: -0.2, map_px: 8 })
    expect(out.spectrum!.E_eV).toHaveLength(11)
    expect(out.map!.ldos).toHaveLength(64)
    expect(out.amplitude).toEqual([-0.5, 0])
    // default extent: bounding square of the scatterers + 2 nm on each side
    expect(out.map!.extent_nm).toEqual([-2, 3.5, -2.75, 2.75])
    const sys = new ScatteringAtEnergy(Float64Array.from([0, 0, 1.5, 0]), waveNumber(-0.2, 0, -0.44, 0.38), BLACK_DOT)
    expect(out.spectrum!.ldos[5]).toBeCloseTo(sys.ldosRatio(0.7, 0.3), 12)
    expect(out.rho0_per_eV_nm2).toBeCloseTo(0.38 / (2 * Math.PI * 2 * 0.0380998), 5)
  })

  it('uses the phase shift when given: δ0 = π/2 is the hard elastic scatterer (amplitude −1)', () => {
    const out = computeScattering({ ...base, scatterers: pair, point: [0, 1], delta0: [Math.PI / 2, 0] })
    expect(out.amplitude[0]).toBeCloseTo(-1, 14)
  })

  it('warns for a bias outside the preset range and below the band bottom without broadening', () => {
    const out = computeScattering({ ...base, scatterers: pair, bias_V: -0.6, map_px: 4, preset: 'Cu(111)-tunnelling' })
    expect(out.warnings.some(w => w.includes('outside'))).toBe(true)
    expect(out.warnings.some(w => w.includes('band bottom'))).toBe(true)
    expect(out.map!.ldos.every(v => v === 0)).toBe(true)
  })

  it('rejects bad input naming the field', () => {
    expect(field(() => computeScattering({ ...base, scatterers: [[0, 0], [1, 1], [1.03, 1]], point: [0, 0] }))).toBe('scatterers[2]')
    expect(field(() => computeScattering({ ...base, scatterers: pair }))).toBe('point')
    expect(field(() => computeScattering({ ...base, scatterers: [[0, Number.NaN]], point: [0, 0] }))).toBe('scatterers[0]')
    expect(field(() => computeScattering({ ...base, scatterers: pair, point: [0, 0], broadening_eV: 0 }))).toBe('broadening_eV')
    expect(field(() => computeScattering({ ...base, scatterers: pair, point: [0, 0], delta0: [0.5, -0.1] }))).toBe('delta0')
    expect(field(() => computeScattering({ ...base, scatterers: pair, bias_V: 0, map_px: 600 }))).toBe('map_px')
    expect(field(() => computeScattering({ ...base, m_eff: -1, scatterers: pair, point: [0, 0] }))).toBe('m_eff')
    const many = Array.from({ length: 400 }, (_, i) => [i % 20, Math.floor(i / 20)] as [number, number])
    expect(field(() => computeScattering({ ...base, scatterers: many, bias_V: 0, map_px: 512 }))).toBe('map_px')
    expect(field(() => computeScattering({ ...base, scatterers: [...many, [30, 30]], point: [0, 0] }))).toBe('scatterers')
  })
})

describe('surface-state presets (published values with their sources)', () => {
  it('carry the published values with sources', () => {
    // Crommie, Lutz, Eigler 1993 (tunnelling, from memory); Reinert et al. PRB 63, 115415 (2001)
    expect(findPreset('Cu(111)-tunnelling')).toMatchObject({ E0_eV: -0.44, m_eff: 0.38 })
    expect(findPreset('Cu(111)-photoemission')).toMatchObject({ E0_eV: -0.435, m_eff: 0.412 })
    expect(findPreset('Ag(111)-photoemission')).toMatchObject({ E0_eV: -0.063, m_eff: 0.397 })
    expect(findPreset('Ag(111)-tunnelling')).toMatchObject({ E0_eV: -0.065, m_eff: 0.40 })
    expect(findPreset('Au(111)-photoemission')).toMatchObject({ E0_eV: -0.487, m_eff: 0.255 })
    expect(findPreset('Au(111)-photoemission')!.note).toMatch(/spin–orbit/)
    for (const p of SURFACE_STATE_PRESETS) {
      expect(p.source.length).toBeGreaterThan(10)
      expect(p.bias_range_V[0]).toBeLessThan(p.E0_eV)
      expect(p.bias_range_V[1]).toBeGreaterThan(0)
    }
  })
})
