// Scan frame → instrument frame: a rigid motion, the scan window's rotation θ about its anchor
// followed by the window's offset, p_inst = offset + R(θ)·(u, v) with R(θ) = [cos −sin; sin cos].
//
// Scan frame (Tessera's canvas): nm from the image's top-left corner, x to the right, y down the
// image (row 0 at the top). (u, v) is the point relative to the anchor — the window's centre or
// its top-left corner — with v pointing up (right-handed instrument axes) or down.
// The convention differs between instruments; it is written into every export, which says to
// check it against the instrument's own frame before any scripted move.

export interface ScanWindow {
  size_x_nm: number
  size_y_nm: number
  offset_x_nm: number
  offset_y_nm: number
  rotation_deg: number
}

export interface FrameConvention {
  /** What the scan's offset names: the window's centre, or its top-left corner (first pixel of the first row). */
  anchor: 'centre' | 'corner'
  /** Direction of the instrument's y axis relative to the image: up (right-handed, default) or down the image. */
  y_axis: 'up' | 'down'
}

export const DEFAULT_CONVENTION: FrameConvention = { anchor: 'centre', y_axis: 'up' }

export type XY = [number, number]

function rigid(w: ScanWindow, c: FrameConvention) {
  const t = (w.rotation_deg * Math.PI) / 180
  const cos = Math.cos(t), sin = Math.sin(t)
  const ax = c.anchor === 'centre' ? w.size_x_nm / 2 : 0
  const ay = c.anchor === 'centre' ? w.size_y_nm / 2 : 0
  const flip = c.y_axis === 'up' ? -1 : 1
  return { cos, sin, ax, ay, flip }
}

/** Scan-frame points (nm) in the instrument frame (nm). */
export function toInstrumentFrame(points: readonly XY[], w: ScanWindow, c: FrameConvention = DEFAULT_CONVENTION): XY[] {
  const { cos, sin, ax, ay, flip } = rigid(w, c)
  return points.map(([x, y]) => {
    const u = x - ax, v = flip * (y - ay)
    return [w.offset_x_nm + u * cos - v * sin, w.offset_y_nm + u * sin + v * cos]
  })
}

/** The inverse: instrument-frame points (nm) back in the scan frame (nm). */
export function fromInstrumentFrame(points: readonly XY[], w: ScanWindow, c: FrameConvention = DEFAULT_CONVENTION): XY[] {
  const { cos, sin, ax, ay, flip } = rigid(w, c)
  return points.map(([X, Y]) => {
    const dx = X - w.offset_x_nm, dy = Y - w.offset_y_nm
    const u = dx * cos + dy * sin, v = -dx * sin + dy * cos
    return [u + ax, flip * v + ay]
  })
}

/** The convention in words, for the header of an export file. */
export function describeConvention(w: ScanWindow, c: FrameConvention): string {
  const anchor = c.anchor === 'centre' ? 'the scan window\'s centre' : 'the scan window\'s top-left corner'
  const v = c.y_axis === 'up' ? 'v up the image' : 'v down the image'
  return `x = offset_x + u·cos θ − v·sin θ, y = offset_y + u·sin θ + v·cos θ, with (u, v) the scan-frame point relative to ${anchor} (${v}); `
    + `offset (${w.offset_x_nm}, ${w.offset_y_nm}) nm, θ = ${w.rotation_deg}°, window ${w.size_x_nm} × ${w.size_y_nm} nm`
}
