// Scan frame → instrument frame. The scan frame has its origin at the top-left corner of the
// image, x to the right and y down the rows (pixel (c, r) centred at ((c + ½)·px, (r + ½)·py)).
// The instrument frame used here puts the scan's centre at its offset, turns y upwards and rotates
// the scan window by rotation_deg counter-clockwise:
//   (u, v) = (x − W/2, H/2 − y),  X = ox + u·cosθ − v·sinθ,  Y = oy + u·sinθ + v·cosθ.
// This is a stated convention, not the instrument's own: check it against the instrument's frame
// before any scripted move.
import type { Point } from './types'

export interface ScanWindow {
  size_x_nm: number
  size_y_nm: number
  offset_x_nm: number
  offset_y_nm: number
  rotation_deg: number
}

export function toInstrument(p: Point, w: ScanWindow): Point {
  const t = (w.rotation_deg * Math.PI) / 180
  const u = p[0] - w.size_x_nm / 2, v = w.size_y_nm / 2 - p[1]
  const c = Math.cos(t), s = Math.sin(t)
  return [w.offset_x_nm + u * c - v * s, w.offset_y_nm + u * s + v * c]
}

export function fromInstrument(q: Point, w: ScanWindow): Point {
  const t = (w.rotation_deg * Math.PI) / 180
  const dx = q[0] - w.offset_x_nm, dy = q[1] - w.offset_y_nm
  const c = Math.cos(t), s = Math.sin(t)
  const u = dx * c + dy * s, v = -dx * s + dy * c
  return [u + w.size_x_nm / 2, w.size_y_nm / 2 - v]
}
