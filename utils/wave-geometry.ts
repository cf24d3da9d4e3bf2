// What the wave models take from the blueprint: the shapes to choose from, the chosen shape's
// sites in the scan frame, the circle through a ring and the axis of a chain.
import { fitChain, fitCircle, type ChainFit, type CircleFit } from '#shared/waves/geometry'
import type { BlueprintRow, PlacedSite } from '~/stores/blueprint'
import type { Pt, WaveModel } from '~/stores/waves'

export interface WaveShapeOption { index: number | null, label: string, type: string, count: number }

export interface WaveGeometry {
  options: WaveShapeOption[]
  /** sites of the chosen shape (all sites when none is chosen), scan frame, nm */
  sites: Pt[]
  /** every blueprint site: the scatterers of the multiple-scattering model */
  all: Pt[]
  circle: CircleFit | null
  circleError: string
  chain: ChainFit | null
  chainError: string
}

const SHAPE_NAMES: Record<string, string> = { ring: 'ring', ellipse: 'ellipse', chain: 'chain', polygon: 'outline', patch: 'lattice patch', sites: 'single sites' }

function shapeType(shapes: unknown[] | undefined, k: number): string {
  const s = shapes?.[k] as { type?: unknown } | undefined
  return typeof s?.type === 'string' ? s.type : 'shape'
}

export function waveShapeOptions(current: BlueprintRow | null, sites: readonly PlacedSite[]): WaveShapeOption[] {
  const counts = new Map<number, number>()
  for (const s of sites) counts.set(s.shape, (counts.get(s.shape) ?? 0) + 1)
  const out: WaveShapeOption[] = [...counts].sort((a, b) => a[0] - b[0]).map(([k, count]) => {
    const type = shapeType(current?.shapes, k)
    return { index: k, type, count, label: `Shape ${k + 1}: ${SHAPE_NAMES[type] ?? type}, ${count} sites` }
  })
  if (out.length !== 1) out.push({ index: null, type: 'all', count: sites.length, label: `All ${sites.length} sites` })
  return out
}

/** The model a shape suggests: hard wall for rings, the box for chains, scattering otherwise. */
export function suggestedWaveModel(type: string): WaveModel {
  return type === 'ring' ? 'corral' : type === 'chain' ? 'chain' : 'scattering'
}

function attempt<T>(fn: () => T): [T | null, string] {
  try {
    return [fn(), '']
  }
  catch (e) {
    return [null, e instanceof Error ? e.message : String(e)]
  }
}

export function waveGeometry(current: BlueprintRow | null, sites: readonly PlacedSite[], shape: number | null): WaveGeometry {
  const all = sites.map(s => [s.x_nm, s.y_nm] as Pt)
  const chosen = shape === null ? all : sites.filter(s => s.shape === shape).map(s => [s.x_nm, s.y_nm] as Pt)
  const [circle, circleError] = chosen.length ? attempt(() => fitCircle(chosen)) : [null, 'no sites']
  const [chain, chainError] = chosen.length ? attempt(() => fitChain(chosen)) : [null, 'no sites']
  return { options: waveShapeOptions(current, sites), sites: chosen, all, circle, circleError, chain, chainError }
}

/** The default probe point of a model: the ring's or chain's centre, else the sites' centroid. */
export function defaultProbe(model: WaveModel, g: WaveGeometry): Pt | null {
  if (model === 'corral' && g.circle) return g.circle.center
  if (model === 'chain' && g.chain) return g.chain.center
  const pts = model === 'scattering' ? g.all : g.sites
  if (!pts.length) return null
  let x = 0
  let y = 0
  for (const p of pts) {
    x += p[0] / pts.length
    y += p[1] / pts.length
  }
  return [x, y]
}

/** The chain's box as a strip in the scan frame: from the left wall along the axis, L long. */
export function chainStrip(chain: ChainFit, L_nm: number) {
  const u = chain.direction
  return {
    start: [chain.center[0] - (L_nm / 2) * u[0], chain.center[1] - (L_nm / 2) * u[1]] as Pt,
    angle_rad: Math.atan2(u[1], u[0]),
    length_nm: L_nm,
    width_nm: Math.max(0.5, chain.spacing_nm ?? 0.5),
  }
}
