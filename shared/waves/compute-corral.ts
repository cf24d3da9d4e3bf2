// POST /api/compute/corral (API contract in the README): hard-wall circular corral levels, point spectrum and
// LDOS map, E_{m,n} = E0 + (ħ²/2m*)(j_{m,n}/R_eff)², LDOS = Σ|ψ|²·Lorentzian (see corral.ts).
import { InputError } from '../errors'
import { cleanDos2D_per_eVnm2 } from './constants'
import { corralLevels, corralMap, corralModes, corralSpectrum, type CorralLevel } from './corral'
import { sensibleBiasRange } from './presets'
import { CorralInput } from './schema'
import { parseOrThrow } from './validate'

/** Broadening a map uses when the caller gave none (HWHM, eV). */
export const DEFAULT_MAP_BROADENING_eV = 0.02
/** More levels than this in one LDOS sum is refused (work grows as levels × radial nodes). */
export const MAX_SUMMED_LEVELS = 5000

export interface CorralOutput {
  levels: CorralLevel[]
  spectrum?: { E_eV: number[], ldos: number[] }
  map?: { px: number, extent_nm: [number, number, number, number], ldos: number[] }
  radius_eff_nm: number
  /** ρ∞ = m* / (2πħ²), the clean-surface DOS per spin, 1/(eV·nm²): ldos × this = absolute LDOS */
  rho0_per_eV_nm2: number
  ldos_unit: string
  broadening_eV?: number
  /** number of levels in the LDOS sums */
  summed_levels: number
  warnings: string[]
}

/**
 * Levels entering the Lorentzian sums: every level up to W above the highest energy asked for,
 * W = max(20Γ, min(100Γ, 1 eV)). The omitted tail adds at most about Γ/(πW) of ρ∞ (≤ 1.6 %, a
 * smooth background) at the energies shown.
 */
export function tailMargin_eV(hwhm_eV: number): number {
  return Math.max(20 * hwhm_eV, Math.min(100 * hwhm_eV, 1))
}

export function linspace(from: number, to: number, n: number): number[] {
  const out: number[] = []
  for (let i = 0; i < n; i++) out.push(from + ((to - from) * i) / (n - 1))
  return out
}

export function computeCorral(raw: unknown): CorralOutput {
  const input = parseOrThrow(CorralInput, raw)
  const warnings: string[] = []
  const inset = input.inset_nm ?? 0
  if (inset >= input.radius_nm) throw new InputError('inset_nm', `must be smaller than radius_nm (${input.radius_nm} nm)`)
  const R = input.radius_nm - inset
  const { E0_eV, m_eff } = input
  const levels = corralLevels({ radius_nm: R, E0_eV, m_eff, count: input.levels ?? 20 })
  const rho0 = cleanDos2D_per_eVnm2(m_eff)
  const out: CorralOutput = {
    levels,
    radius_eff_nm: R,
    rho0_per_eV_nm2: rho0,
    ldos_unit: 'clean-surface DOS m* / (2πħ²) per spin',
    summed_levels: 0,
    warnings,
  }

  const wantsSpectrum = input.broadening_eV !== undefined
  const wantsMap = input.bias_V !== undefined && input.map_px !== undefined
  if (input.map_px !== undefined && input.bias_V === undefined) warnings.push('map_px given without bias_V: no map computed')
  if (input.bias_V !== undefined && input.map_px === undefined) warnings.push('bias_V given without map_px: no map computed')
  if (!wantsSpectrum && !wantsMap) return out

  let gamma = input.broadening_eV
  if (gamma === undefined) {
    gamma = DEFAULT_MAP_BROADENING_eV
    warnings.push(`no broadening_eV given: the map uses ${DEFAULT_MAP_BROADENING_eV} eV (HWHM)`)
  }
  out.broadening_eV = gamma

  const [lo, hi] = input.spectrum_range_eV ?? [E0_eV - 0.1, E0_eV + 0.6]
  let top = Number.NEGATIVE_INFINITY
  if (wantsSpectrum) top = hi
  if (wantsMap) top = Math.max(top, input.bias_V!)
  const summed = corralLevels({ radius_nm: R, E0_eV, m_eff, maxE_eV: top + tailMargin_eV(gamma) })
  if (summed.length > MAX_SUMMED_LEVELS) {
    const field = wantsMap && input.bias_V! >= hi ? 'bias_V' : wantsSpectrum ? 'spectrum_range_eV' : 'radius_nm'
    throw new InputError(field, `the LDOS sum would need ${summed.length} levels (limit ${MAX_SUMMED_LEVELS}): use a smaller radius, a lower energy or a smaller broadening`)
  }
  const modes = corralModes(summed, R)
  out.summed_levels = modes.length

  if (wantsSpectrum) {
    const [px, py] = input.point ?? [0, 0]
    const r = Math.hypot(px, py)
    if (r >= R) warnings.push(`point is ${r.toFixed(3)} nm from the centre, outside the effective wall (${R.toFixed(3)} nm): the LDOS there is 0`)
    const E = linspace(lo, hi, input.spectrum_points ?? 301)
    const ldos = corralSpectrum(modes, R, r, E, gamma)
    out.spectrum = { E_eV: E, ldos: Array.from(ldos, v => v / rho0) }
  }

  if (wantsMap) {
    const bias = input.bias_V!
    const [bLo, bHi] = sensibleBiasRange(E0_eV, input.preset)
    if (bias < bLo || bias > bHi) {
      warnings.push(`bias ${bias} V is outside ${bLo} … ${bHi} V, where the parabolic surface-state model is meant to hold`
        + (bias < E0_eV ? ' (below the band bottom the surface state holds no states)' : ''))
    }
    const px = input.map_px!
    const map = corralMap(modes, R, bias, gamma, px, input.radius_nm)
    out.map = {
      px,
      extent_nm: [-input.radius_nm, input.radius_nm, -input.radius_nm, input.radius_nm],
      ldos: Array.from(map, v => v / rho0),
    }
  }
  return out
}
