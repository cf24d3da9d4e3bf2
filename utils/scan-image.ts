// Client-side, non-destructive processing of a stored height grid: leveling, then contrast and
// colour map into an offscreen canvas the scan layer draws. The stored grid is never changed.
import { histogram, percentileRange, type Histogram } from '#shared/scan/contrast'
import { levelLinesMedianDiff, levelLinesPolynomial, subtractPlane } from '#shared/scan/level'
import { renderRGBA } from '#shared/scan/render'
import type { Grid } from '#shared/scan/types'
import type { ScanProcessing } from '#shared/schemas/scan'

export function levelGrid(grid: Grid, p: Pick<ScanProcessing, 'plane' | 'lines'>): Grid {
  let g = grid
  if (p.plane) g = subtractPlane(g).grid
  if (p.lines === 'median-diff') g = levelLinesMedianDiff(g).grid
  else if (p.lines.startsWith('poly')) g = levelLinesPolynomial(g, Number(p.lines.slice(4)))
  return g
}

export interface RenderedScan { canvas: HTMLCanvasElement, lo: number, hi: number, histogram: Histogram }

export function renderScan(leveled: Grid, p: ScanProcessing): RenderedScan {
  const range = percentileRange(leveled.data, p.low_pct, p.high_pct)
  const lo = range.lo
  const hi = range.hi > lo ? range.hi : lo + 1e-6
  const rgba = renderRGBA(leveled, { lo, hi, colormap: p.colormap, invert: p.invert })
  const canvas = document.createElement('canvas')
  canvas.width = leveled.width
  canvas.height = leveled.height
  canvas.getContext('2d')!.putImageData(new ImageData(rgba as Uint8ClampedArray<ArrayBuffer>, leveled.width, leveled.height), 0, 0)
  return { canvas, lo, hi, histogram: histogram(leveled.data, 96) }
}
