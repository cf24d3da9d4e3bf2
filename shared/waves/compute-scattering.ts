// POST /api/compute/scattering: s-wave multiple-scattering LDOS maps and point spectra
// (Heller, Crommie, Lutz, Eigler, Nature 369, 464 (1994); model and normalisation in scattering.ts).
import { InputError } from '../errors'
import { cleanDos2D_per_eVnm2 } from './constants'
import { linspace } from './compute-corral'
import { sensibleBiasRange } from './presets'
import {
  BLACK_DOT, ScatteringAtEnergy, SingularSystemError, amplitudeFromPhaseShift, scatteringMap,
  scatteringSpectrum, waveNumber, propagates, type Complex,
} from './scattering'
import { ScatteringInput, WAVE_LIMITS } from './schema'
import { parseOrThrow } from './validate'

/** Scatterers closer than this (nm) are taken as a typing error: no two adatoms share a site. */
export const MIN_SCATTERER_SEPARATION_nm = 0.05
/** Margin around the scatterers of the default map window, nm. */
export const DEFAULT_MAP_MARGIN_nm = 2

export interface ScatteringOutput {
  spectrum?: { E_eV: number[], ldos: number[] }
  map?: { px: number, extent_nm: [number, number, number, number], ldos: number[] }
  amplitude: [number, number]
  rho0_per_eV_nm2: number
  ldos_unit: string
  warnings: string[]
}

function checkSeparation(s: readonly (readonly [number, number])[]): void {
  const min2 = MIN_SCATTERER_SEPARATION_nm * MIN_SCATTERER_SEPARATION_nm
  for (let i = 0; i < s.length; i++) {
    for (let j = 0; j < i; j++) {
      const dx = s[i]![0] - s[j]![0]
      const dy = s[i]![1] - s[j]![1]
      if (dx * dx + dy * dy < min2) {
        throw new InputError(`scatterers[${i}]`, `lies ${Math.hypot(dx, dy).toFixed(3)} nm from scatterers[${j}] (closer than ${MIN_SCATTERER_SEPARATION_nm} nm)`)
      }
    }
  }
}

function defaultExtent(s: readonly (readonly [number, number])[]): [number, number, number, number] {
  if (s.length === 0) return [-5, 5, -5, 5]
  let x0 = Infinity
  let x1 = -Infinity
  let y0 = Infinity
  let y1 = -Infinity
  for (const [x, y] of s) {
    x0 = Math.min(x0, x)
    x1 = Math.max(x1, x)
    y0 = Math.min(y0, y)
    y1 = Math.max(y1, y)
  }
  const cx = (x0 + x1) / 2
  const cy = (y0 + y1) / 2
  const half = Math.max(x1 - x0, y1 - y0) / 2 + DEFAULT_MAP_MARGIN_nm
  return [cx - half, cx + half, cy - half, cy + half]
}

export function computeScattering(raw: unknown): ScatteringOutput {
  const input = parseOrThrow(ScatteringInput, raw)
  const warnings: string[] = []
  const s = input.scatterers
  checkSeparation(s)
  const xy = new Float64Array(s.length * 2)
  s.forEach(([x, y], i) => {
    xy[2 * i] = x
    xy[2 * i + 1] = y
  })
  const a: Complex = input.delta0 ? amplitudeFromPhaseShift({ re: input.delta0[0], im: input.delta0[1] }) : BLACK_DOT
  const gamma = input.broadening_eV ?? 0
  const n = s.length
  const wantsMap = input.bias_V !== undefined && input.map_px !== undefined
  const wantsSpectrum = input.point !== undefined
  if (!wantsMap && !wantsSpectrum) throw new InputError('point', 'nothing to compute: give point for a spectrum, or bias_V and map_px for a map')
  if (input.map_px !== undefined && input.bias_V === undefined) warnings.push('map_px given without bias_V: no map computed')
  if (input.bias_V !== undefined && input.map_px === undefined) warnings.push('bias_V given without map_px: no map computed')

  const out: ScatteringOutput = {
    amplitude: [a.re, a.im],
    rho0_per_eV_nm2: cleanDos2D_per_eVnm2(input.m_eff),
    ldos_unit: 'clean-surface DOS m* / (2πħ²) per spin',
    warnings,
  }
  const model = { E0_eV: input.E0_eV, m_eff: input.m_eff, hwhm_eV: gamma, a }
  try {
    if (wantsSpectrum) {
      const points = input.spectrum_points ?? 201
      if (points * n ** 3 > WAVE_LIMITS.scattering_spectrum_work) {
        throw new InputError('spectrum_points', `${points} energies × ${n} scatterers exceeds the work limit (points·n³ ≤ ${WAVE_LIMITS.scattering_spectrum_work.toExponential(1)})`)
      }
      const [lo, hi] = input.spectrum_range_eV ?? [input.E0_eV - 0.1, input.E0_eV + 0.6]
      const E = linspace(lo, hi, points)
      if (gamma === 0 && lo <= input.E0_eV) warnings.push('without broadening the LDOS at and below the band bottom E0 is 0 in this model')
      out.spectrum = { E_eV: E, ldos: Array.from(scatteringSpectrum(xy, input.point!, E, model)) }
    }
    if (wantsMap) {
      const px = input.map_px!
      if (px * px * n * n > WAVE_LIMITS.scattering_map_work) {
        throw new InputError('map_px', `${px}² pixels × ${n}² scatterer pairs exceeds the work limit (px²·n² ≤ ${WAVE_LIMITS.scattering_map_work.toExponential(1)})`)
      }
      const bias = input.bias_V!
      const [bLo, bHi] = sensibleBiasRange(input.E0_eV, input.preset)
      if (bias < bLo || bias > bHi) warnings.push(`bias ${bias} V is outside ${bLo} … ${bHi} V, where the parabolic surface-state model is meant to hold`)
      const k = waveNumber(bias, gamma, input.E0_eV, input.m_eff)
      if (!propagates(k)) warnings.push('without broadening the LDOS at and below the band bottom E0 is 0 in this model')
      const extent = input.extent_nm ?? defaultExtent(s)
      const sys = new ScatteringAtEnergy(xy, k, a)
      out.map = { px, extent_nm: [...extent], ldos: Array.from(scatteringMap(sys, px, extent)) }
    }
  }
  catch (e) {
    if (e instanceof SingularSystemError) throw new InputError('delta0', `${e.message}: change the phase shift or the energy slightly`)
    throw e
  }
  return out
}
