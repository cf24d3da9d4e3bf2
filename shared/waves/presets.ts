// Shockley surface-state presets (band bottom E0 relative to E_F, effective mass m*/m_e) with their
// published sources. E0 shifts with temperature and between techniques; users may edit presets.

export interface SurfaceStatePreset {
  id: string
  surface: 'Cu(111)' | 'Ag(111)' | 'Au(111)'
  method: 'tunnelling' | 'photoemission'
  E0_eV: number
  m_eff: number
  source: string
  /** true where the digits were recalled rather than read from the paper */
  fromMemory: boolean
  /**
   * Bias range (V) in which the parabolic band is a fair model: from 0.1 V below the band
   * bottom (to show the onset) to 1 V above it. The app's own choice (common practice: the
   * free-electron-like dispersion of these states is used within roughly 1 eV of E0).
   */
  bias_range_V: [number, number]
  note?: string
}

function range(E0_eV: number): [number, number] {
  return [Math.round((E0_eV - 0.1) * 1e4) / 1e4, Math.round((E0_eV + 1.0) * 1e4) / 1e4]
}

export const SURFACE_STATE_PRESETS: readonly SurfaceStatePreset[] = [
  {
    id: 'Cu(111)-tunnelling',
    surface: 'Cu(111)',
    method: 'tunnelling',
    E0_eV: -0.44,
    m_eff: 0.38,
    source: 'Crommie, Lutz, Eigler, Nature 363, 524 (1993)',
    fromMemory: true,
    bias_range_V: range(-0.44),
    note: 'The values used for the 48-atom, 7.13 nm Fe corral (Crommie, Lutz, Eigler, Science 262, 218 (1993)).',
  },
  {
    id: 'Cu(111)-photoemission',
    surface: 'Cu(111)',
    method: 'photoemission',
    E0_eV: -0.435,
    m_eff: 0.412,
    source: 'Reinert et al., Phys. Rev. B 63, 115415 (2001), Table I',
    fromMemory: true,
    bias_range_V: range(-0.435),
  },
  {
    id: 'Ag(111)-tunnelling',
    surface: 'Ag(111)',
    method: 'tunnelling',
    E0_eV: -0.065,
    m_eff: 0.40,
    source: 'Li et al., Phys. Rev. Lett. (1998); reported range −65 to −67 meV, m* 0.40–0.42',
    fromMemory: true,
    bias_range_V: range(-0.065),
  },
  {
    id: 'Ag(111)-photoemission',
    surface: 'Ag(111)',
    method: 'photoemission',
    E0_eV: -0.063,
    m_eff: 0.397,
    source: 'Reinert et al., Phys. Rev. B 63, 115415 (2001), Table I',
    fromMemory: true,
    bias_range_V: range(-0.063),
  },
  {
    id: 'Au(111)-photoemission',
    surface: 'Au(111)',
    method: 'photoemission',
    E0_eV: -0.487,
    m_eff: 0.255,
    source: 'Reinert et al., Phys. Rev. B 63, 115415 (2001), Table I',
    fromMemory: true,
    bias_range_V: range(-0.487),
    note: 'The Au(111) state is spin–orbit (Rashba) split into two parabolas shifted in k; '
      + 'a single spin-degenerate parabola with these values is an average that ignores the splitting.',
  },
]

export const PRESET_IDS = SURFACE_STATE_PRESETS.map(p => p.id)

export function findPreset(id: string): SurfaceStatePreset | undefined {
  return SURFACE_STATE_PRESETS.find(p => p.id === id)
}

/** The range used for bias warnings: the preset's, else the same rule around the given E0. */
export function sensibleBiasRange(E0_eV: number, presetId?: string): [number, number] {
  const p = presetId === undefined ? undefined : findPreset(presetId)
  return p ? p.bias_range_V : range(E0_eV)
}
