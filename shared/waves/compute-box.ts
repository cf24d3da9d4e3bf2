// Chain wave preview: 1-D hard-wall box levels E_n = E0 + ħ²π²n²/(2m*L²), LDOS along the chain and
// a point spectrum (box.ts), with the effective-length convention as an explicit input.
import { InputError } from '../errors'
import { atomPosition_nm, boxLength, boxLdosLine, boxLevels, boxSpectrum, type BoxLevel } from './box'
import { linspace, tailMargin_eV, DEFAULT_MAP_BROADENING_eV } from './compute-corral'
import { sensibleBiasRange } from './presets'
import { BoxInput } from './schema'
import { parseOrThrow } from './validate'

export interface BoxOutput {
  L_nm: number
  convention: string
  levels: BoxLevel[]
  /** x of each chain atom from the left wall, nm (when atoms and spacing are given) */
  atoms_x_nm?: number[]
  spectrum?: { E_eV: number[], ldos: number[] }
  line?: { x_nm: number[], ldos: number[] }
  ldos_unit: string
  broadening_eV?: number
  warnings: string[]
}

export function computeBox(raw: unknown): BoxOutput {
  const input = parseOrThrow(BoxInput, raw)
  const warnings: string[] = []
  if (input.convention === 'custom') {
    if (input.L_nm === undefined) throw new InputError('L_nm', 'needed with convention "custom"')
  }
  else {
    if (input.atoms === undefined) throw new InputError('atoms', `needed with convention "${input.convention}"`)
    if (input.spacing_nm === undefined) throw new InputError('spacing_nm', `needed with convention "${input.convention}"`)
  }
  const geom = { convention: input.convention, atoms: input.atoms, spacing_nm: input.spacing_nm, L_nm: input.L_nm }
  const L = boxLength(geom)
  const { E0_eV, m_eff } = input
  const out: BoxOutput = {
    L_nm: L,
    convention: input.convention,
    levels: boxLevels({ L_nm: L, E0_eV, m_eff, count: input.levels ?? 10 }),
    ldos_unit: '1/(eV·nm) per spin',
    warnings,
  }
  if (input.atoms !== undefined && input.spacing_nm !== undefined) {
    out.atoms_x_nm = Array.from({ length: input.atoms }, (_, i) => atomPosition_nm(geom, i))
  }
  const wantsSpectrum = input.broadening_eV !== undefined
  const wantsLine = input.bias_V !== undefined && input.line_px !== undefined
  if (!wantsSpectrum && !wantsLine) return out
  let gamma = input.broadening_eV
  if (gamma === undefined) {
    gamma = DEFAULT_MAP_BROADENING_eV
    warnings.push(`no broadening_eV given: the line uses ${DEFAULT_MAP_BROADENING_eV} eV (HWHM)`)
  }
  out.broadening_eV = gamma
  const [lo, hi] = input.spectrum_range_eV ?? [E0_eV - 0.1, E0_eV + 0.6]
  const top = Math.max(wantsSpectrum ? hi : -Infinity, wantsLine ? input.bias_V! : -Infinity)
  const summed = boxLevels({ L_nm: L, E0_eV, m_eff, maxE_eV: top + tailMargin_eV(gamma) })
  if (wantsSpectrum) {
    const x = input.point_nm ?? L / 2
    if (x <= 0 || x >= L) warnings.push(`point_nm ${x} lies outside the box (0 … ${L.toFixed(4)} nm): the LDOS there is 0`)
    const E = linspace(lo, hi, input.spectrum_points ?? 301)
    out.spectrum = { E_eV: E, ldos: Array.from(boxSpectrum(summed, L, x, E, gamma)) }
  }
  if (wantsLine) {
    const bias = input.bias_V!
    const [bLo, bHi] = sensibleBiasRange(E0_eV, input.preset)
    if (bias < bLo || bias > bHi) warnings.push(`bias ${bias} V is outside ${bLo} … ${bHi} V, where the parabolic model is meant to hold`)
    const n = input.line_px!
    const x = Array.from({ length: n }, (_, i) => ((i + 0.5) * L) / n)
    out.line = { x_nm: x, ldos: Array.from(boxLdosLine(summed, L, x, bias, gamma)) }
  }
  return out
}
