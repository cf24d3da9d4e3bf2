// Request bodies of the three wave models (POST /api/compute/corral, /chain, /scattering) from the
// panel's parameters and the blueprint geometry, and the frames that map results back onto the
// scan: the corral's results are relative to the fitted centre, the chain's along its axis.
import { boxLength } from '#shared/waves/box'
import type { Convention, Pt, WaveModel } from '~/stores/waves'
import type { WaveGeometry } from './wave-geometry'

/** A typed field as a number: blank or unreadable becomes NaN, which the server names. */
export function waveNum(s: string): number {
  return s.trim() === '' ? Number.NaN : Number(s.replace(',', '.'))
}

export interface WaveParams {
  radius_nm: string
  inset_nm: string
  convention: Convention
  L_nm: string
  delta0: 'black' | 'custom'
  delta0_re: string
  delta0_im: string
  broadening_eV: string
  map_px: string
  range_from: string
  range_to: string
}

export interface WaveInputs {
  model: WaveModel
  E0_eV: number
  m_eff: number
  preset?: string
  params: WaveParams
  bias_V: number
  probe: Pt
  geometry: WaveGeometry
}

export interface WaveRequest { url: string, body: Record<string, unknown> }

/** Levels asked for the diagram; the diagram shows the lowest few, the count below E_F uses all. */
export const LADDER_LEVELS = 200
export const CHAIN_LINE_PX = 256

function surface(i: WaveInputs) {
  return { E0_eV: i.E0_eV, m_eff: i.m_eff, ...(i.preset ? { preset: i.preset } : {}) }
}
function range(i: WaveInputs) {
  if (!i.params.range_from.trim() && !i.params.range_to.trim()) return {}
  return { spectrum_range_eV: [waveNum(i.params.range_from), waveNum(i.params.range_to)] }
}
export function waveRadius(i: Pick<WaveInputs, 'params' | 'geometry'>): number {
  return i.params.radius_nm.trim() === '' ? (i.geometry.circle?.radius_nm ?? Number.NaN) : waveNum(i.params.radius_nm)
}

function corralBase(i: WaveInputs) {
  return { shape: 'circle', radius_nm: waveRadius(i), inset_nm: waveNum(i.params.inset_nm), ...surface(i) }
}

/** The chain's box: length convention, atoms and spacing from the axis fit, or a typed length. */
export function chainBox(i: Pick<WaveInputs, 'params' | 'geometry'>) {
  const c = i.geometry.chain
  const conv = i.params.convention
  const box = conv === 'custom'
    ? { convention: conv, L_nm: waveNum(i.params.L_nm) }
    : { convention: conv, atoms: c?.atoms, spacing_nm: c?.spacing_nm ?? undefined }
  const L = boxLength({ convention: conv, atoms: c?.atoms, spacing_nm: c?.spacing_nm ?? undefined, L_nm: waveNum(i.params.L_nm) })
  return { box, L }
}

/** Position along the chain axis from the left wall, nm (projection of a scan point). */
export function chainCoordinate(i: Pick<WaveInputs, 'params' | 'geometry'>, p: Pt): number {
  const c = i.geometry.chain!
  const { L } = chainBox(i)
  return (p[0] - c.center[0]) * c.direction[0] + (p[1] - c.center[1]) * c.direction[1] + L / 2
}

function scatteringBase(i: WaveInputs) {
  const delta0 = i.params.delta0 === 'custom' ? { delta0: [waveNum(i.params.delta0_re), waveNum(i.params.delta0_im)] } : {}
  return { scatterers: i.geometry.all, ...surface(i), ...delta0 }
}

export function levelsRequest(i: WaveInputs): WaveRequest | null {
  if (i.model === 'corral') return { url: '/api/compute/corral', body: { ...corralBase(i), levels: LADDER_LEVELS } }
  if (i.model === 'chain') return { url: '/api/compute/chain', body: { ...chainBox(i).box, ...surface(i), levels: LADDER_LEVELS } }
  return null
}

export function mapRequest(i: WaveInputs): WaveRequest {
  const common = { broadening_eV: waveNum(i.params.broadening_eV), bias_V: i.bias_V }
  if (i.model === 'corral') return { url: '/api/compute/corral', body: { ...corralBase(i), levels: 1, ...common, map_px: waveNum(i.params.map_px), spectrum_points: 2 } }
  if (i.model === 'chain') return { url: '/api/compute/chain', body: { ...chainBox(i).box, ...surface(i), levels: 1, ...common, line_px: CHAIN_LINE_PX, spectrum_points: 2 } }
  return { url: '/api/compute/scattering', body: { ...scatteringBase(i), ...common, map_px: waveNum(i.params.map_px) } }
}

export function spectrumRequest(i: WaveInputs): WaveRequest {
  const common = { broadening_eV: waveNum(i.params.broadening_eV), ...range(i) }
  if (i.model === 'corral') {
    const c = i.geometry.circle?.center ?? [0, 0]
    return { url: '/api/compute/corral', body: { ...corralBase(i), levels: 1, ...common, point: [i.probe[0] - c[0], i.probe[1] - c[1]], spectrum_points: 401 } }
  }
  if (i.model === 'chain') return { url: '/api/compute/chain', body: { ...chainBox(i).box, ...surface(i), levels: 1, ...common, point_nm: chainCoordinate(i, i.probe), spectrum_points: 401 } }
  return { url: '/api/compute/scattering', body: { ...scatteringBase(i), ...common, point: i.probe, spectrum_points: 201 } }
}
