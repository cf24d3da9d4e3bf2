// Line profile p0 → p1 (nm) through a height grid by bilinear interpolation between the four
// surrounding pixel centres; pixel (c, r) has its centre at ((c + 0.5)·px, (r + 0.5)·py).
// Within half a pixel of the frame edge the nearest edge value is held (no extrapolation).
import { InputError } from '../errors'
import { checkGrid, pixelPair } from './grid'
import type { GridLike, PixelSize } from './types'

export interface LineProfile {
  distance_nm: number[]
  height_nm: number[]
}

export function lineProfile(
  grid: GridLike,
  pixel_nm: PixelSize,
  p0_nm: readonly [number, number],
  p1_nm: readonly [number, number],
  opts: { samples?: number } = {},
): LineProfile {
  checkGrid(grid)
  const [px, py] = pixelPair(pixel_nm)
  const { width: w, height: h, data } = grid
  const extent: [number, number] = [w * px, h * py]
  checkPoint('p0', p0_nm, extent)
  checkPoint('p1', p1_nm, extent)
  const dx = p1_nm[0] - p0_nm[0]
  const dy = p1_nm[1] - p0_nm[1]
  const length_nm = Math.hypot(dx, dy)
  // By default one sample per pixel step along the line, so no pixel is skipped.
  const n = opts.samples ?? Math.max(2, Math.ceil(Math.hypot(dx / px, dy / py)) + 1)
  if (!Number.isInteger(n) || n < 2 || n > 100000) throw new InputError('samples', 'samples must be a whole number from 2 to 100000')
  const distance_nm: number[] = new Array(n)
  const height_nm: number[] = new Array(n)
  for (let i = 0; i < n; i++) {
    const t = i / (n - 1)
    distance_nm[i] = t * length_nm
    height_nm[i] = bilinear(data, w, h, (p0_nm[0] + t * dx) / px - 0.5, (p0_nm[1] + t * dy) / py - 0.5)
  }
  return { distance_nm, height_nm }
}

function checkPoint(field: string, p: readonly [number, number], extent: [number, number]) {
  if (!Array.isArray(p) || p.length !== 2 || !p.every(v => typeof v === 'number' && Number.isFinite(v))) {
    throw new InputError(field, `${field} must be [x, y] in nm with finite numbers`)
  }
  const eps = 1e-9 * Math.max(extent[0], extent[1])
  if (p[0] < -eps || p[0] > extent[0] + eps || p[1] < -eps || p[1] > extent[1] + eps) {
    throw new InputError(field, `${field} = [${p[0]}, ${p[1]}] nm lies outside the scan frame [0, ${extent[0]}] × [0, ${extent[1]}] nm`)
  }
}

/** Bilinear value at fractional pixel-centre coordinates (u, v), clamped to the outer centres. */
export function bilinear(data: ArrayLike<number>, w: number, h: number, u: number, v: number): number {
  const uc = Math.min(Math.max(u, 0), w - 1)
  const vc = Math.min(Math.max(v, 0), h - 1)
  const c0 = Math.min(Math.floor(uc), Math.max(w - 2, 0))
  const r0 = Math.min(Math.floor(vc), Math.max(h - 2, 0))
  const fu = uc - c0
  const fv = vc - r0
  const c1 = Math.min(c0 + 1, w - 1)
  const r1 = Math.min(r0 + 1, h - 1)
  const z00 = data[r0 * w + c0]!, z01 = data[r0 * w + c1]!
  const z10 = data[r1 * w + c0]!, z11 = data[r1 * w + c1]!
  return (1 - fv) * ((1 - fu) * z00 + fu * z01) + fv * ((1 - fu) * z10 + fu * z11)
}
