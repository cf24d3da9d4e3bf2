// The affine map of a lattice fit between the blueprint's ideal frame and the scan, for any point
// (not only sites): scan = origin + A·(p − s₀), A = [a1′ a2′]·[a1 a2]⁻¹, s₀ the ideal position of
// site (0, 0, 0) of the fit's site type. Used to draw outlines and handles and to read the pointer.
import { InputError } from '../errors'
import type { Vec2 } from '../lattice/vec'
import type { FitFrame } from './frame'
import { siteContext } from './context'
import type { Surface } from '../lattice/surfaces'

export interface FrameMap {
  /** Row-major 2 × 2 matrix A (ideal → scan vectors). */
  A: [number, number, number, number]
  toScan: (p: Vec2) => Vec2
  toIdeal: (q: Vec2) => Vec2
  /** Scan-frame vector of an ideal-frame vector (no translation). */
  vecToScan: (v: Vec2) => Vec2
}

export function frameMap(fit: FitFrame, surface: string | Surface, fitSite?: string): FrameMap {
  const ctx = siteContext(surface, fitSite)
  const { a1, a2 } = ctx.surface
  const s0 = ctx.site.offsets_nm[0]!
  const det = a1[0] * a2[1] - a1[1] * a2[0]
  const i11 = a2[1] / det, i12 = -a2[0] / det, i21 = -a1[1] / det, i22 = a1[0] / det
  const A: [number, number, number, number] = [
    fit.a1[0] * i11 + fit.a2[0] * i21, fit.a1[0] * i12 + fit.a2[0] * i22,
    fit.a1[1] * i11 + fit.a2[1] * i21, fit.a1[1] * i12 + fit.a2[1] * i22,
  ]
  const detA = A[0] * A[3] - A[1] * A[2]
  if (!(Math.abs(detA) > 1e-12)) throw new InputError('fit', 'the fit cell vectors are parallel or zero')
  const [ox, oy] = fit.origin
  const vecToScan = (v: Vec2): Vec2 => [A[0] * v[0] + A[1] * v[1], A[2] * v[0] + A[3] * v[1]]
  return {
    A,
    vecToScan,
    toScan: (p: Vec2): Vec2 => {
      const dx = p[0] - s0[0], dy = p[1] - s0[1]
      return [ox + A[0] * dx + A[1] * dy, oy + A[2] * dx + A[3] * dy]
    },
    toIdeal: (q: Vec2): Vec2 => {
      const dx = q[0] - ox, dy = q[1] - oy
      return [s0[0] + (A[3] * dx - A[1] * dy) / detA, s0[1] + (-A[2] * dx + A[0] * dy) / detA]
    },
  }
}

export interface CellMetrics {
  /** Angle of a1′ from +x, degrees. */
  rotation_deg: number
  /** |a1′|/|a1|, |a2′|/|a2|. */
  scale: [number, number]
  /** Angle between a1′ and a2′ minus the ideal angle, degrees. */
  shear_deg: number
}

/** Rotation, scale and shear of a fitted (or placed) cell against the handbook cell. */
export function cellMetrics(fitA1: Vec2, fitA2: Vec2, idealA1: Vec2, idealA2: Vec2): CellMetrics {
  const ang = (p: Vec2, q: Vec2) => Math.acos(Math.max(-1, Math.min(1, (p[0] * q[0] + p[1] * q[1]) / (Math.hypot(...p) * Math.hypot(...q))))) * 180 / Math.PI
  return {
    rotation_deg: Math.atan2(fitA1[1], fitA1[0]) * 180 / Math.PI,
    scale: [Math.hypot(...fitA1) / Math.hypot(...idealA1), Math.hypot(...fitA2) / Math.hypot(...idealA2)],
    shear_deg: ang(fitA1, fitA2) - ang(idealA1, idealA2),
  }
}

/** The scan rectangle [0, w] × [0, h] (nm) as a polygon in the ideal frame. */
export function scanRectInIdeal(map: FrameMap, width_nm: number, height_nm: number): Vec2[] {
  return ([[0, 0], [width_nm, 0], [width_nm, height_nm], [0, height_nm]] as Vec2[]).map(map.toIdeal)
}

/**
 * The site lattice of any site type through the map (origin = that type's site (0, 0, 0) in the
 * scan, cell and basis carried by A): lets the grid show another site type before refitting.
 */
export function siteLatticeThrough(map: FrameMap, surface: string | Surface, site?: string): { a1: Vec2, a2: Vec2, origin: Vec2, basis?: Vec2[] } {
  const ctx = siteContext(surface, site)
  const offs = ctx.site.offsets_nm
  const o0 = offs[0]!
  const lat: { a1: Vec2, a2: Vec2, origin: Vec2, basis?: Vec2[] } = { a1: map.vecToScan(ctx.surface.a1), a2: map.vecToScan(ctx.surface.a2), origin: map.toScan(o0) }
  if (offs.length > 1) lat.basis = offs.map(o => map.vecToScan([o[0] - o0[0], o[1] - o0[1]]))
  return lat
}
