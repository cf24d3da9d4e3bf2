// The site-grid layer's work per frame over a 100 nm Ag(111) scan at several zooms (a 1200 × 900
// px viewport), and the live blueprint expansion of a 48-atom ring plus a 2000-site patch. The
// drawing calls are counted into a no-op, so these are the CPU costs before the canvas paints.
import { expandDraft } from '../../shared/blueprint/draft'
import { forEachSiteInBox, gridPlan, intersectBox, rowSegments } from '../../shared/lattice/grid-plan'
import { latticeFromSurface } from '../../shared/lattice'
import { bench, section } from './harness'

export async function run(): Promise<void> {
  const lat = latticeFromSurface('Ag(111)', 'fcc', { origin: [50, 50], rotation_deg: 13 })
  const scanBox = { x0: 0, y0: 0, x1: 100, y1: 100 }
  section('site grid: one frame of a 100 nm Ag(111) scan, 1200 × 900 px viewport')
  for (const scale of [9, 30, 80, 400]) {
    const w = 1200 / scale, h = 900 / scale
    const box = intersectBox({ x0: 50 - w / 2, y0: 50 - h / 2, x1: 50 + w / 2, y1: 50 + h / 2 }, scanBox)!
    const plan = gridPlan(lat, scale)
    let drawn = 0
    await bench(`${scale} px/nm: ${plan.mode === 'sites' ? 'sites' : `rows every ${plan.every}`}`, () => {
      drawn = 0
      if (plan.mode === 'sites') drawn = forEachSiteInBox(lat, box, () => {}, 120_000)
      else drawn = rowSegments(lat, box, plan.every).length / 4
    }, { note: () => `${drawn} ${plan.mode === 'sites' ? 'sites' : 'segments'}` })
  }
  section('blueprint: live expansion of a draft (Cu(111) fcc)')
  const ring = { type: 'ring' as const, center: [0, 0] as [number, number], radius_nm: 7.13, n: 48 }
  const patch = { type: 'patch' as const, kind: 'honeycomb' as const, spacing: 2, region: [[10, -12], [40, -12], [40, 12], [10, 12]] as [number, number][] }
  let sites = 0
  await bench('ring 48 + honeycomb patch, no cache', () => {
    sites = expandDraft([ring, patch], 'Cu(111)', 'fcc', { minSpacing_nm: 0.5 }).sites.length
  }, { note: () => `${sites} sites` })
}
