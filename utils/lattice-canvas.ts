// Lattice step on the canvas: the snap-error colours (Tessera's own, shared by the layer and the
// legend) and the hand-placement handles (the rotation knob sits a fixed screen distance from the
// lattice origin along a1, so it is as easy to grab at any zoom).
import type { Lattice } from '../shared/lattice/lattice'

export const SNAP_COLOURS = { good: '#5ec48c', fair: '#e8be50', off: '#ec6862' } as const

export const KNOB_PX = 70

export function handKnob(lat: Pick<Lattice, 'a1' | 'origin'>, scale_px_per_nm: number): [number, number] {
  const l = Math.hypot(lat.a1[0], lat.a1[1])
  const r = KNOB_PX / scale_px_per_nm
  return [lat.origin[0] + lat.a1[0] / l * r, lat.origin[1] + lat.a1[1] / l * r]
}

/** The turn (degrees) that brings a1 from where it points to the direction origin → p. */
export function knobTurn(lat: Pick<Lattice, 'a1' | 'origin'>, p: [number, number]): number {
  const now = Math.atan2(lat.a1[1], lat.a1[0])
  const want = Math.atan2(p[1] - lat.origin[1], p[0] - lat.origin[0])
  let d = (want - now) * 180 / Math.PI
  d -= 360 * Math.round(d / 360)
  return d
}
