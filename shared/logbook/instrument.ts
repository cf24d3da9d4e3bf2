// Scan frame → instrument frame for the run view: the same stated convention as the exports
// (shared/export/frame.ts, default: the scan's centre at its offset, y up, the window rotated by
// rotation_deg counter-clockwise). Check it against the instrument's own frame before any
// scripted move.
import { DEFAULT_CONVENTION, fromInstrumentFrame, toInstrumentFrame, type ScanWindow } from '../export/frame'
import type { Point } from './types'

export type { ScanWindow }

export function toInstrument(p: Point, w: ScanWindow): Point {
  return toInstrumentFrame([p], w, DEFAULT_CONVENTION)[0]!
}

export function fromInstrument(q: Point, w: ScanWindow): Point {
  return fromInstrumentFrame([q], w, DEFAULT_CONVENTION)[0]!
}
