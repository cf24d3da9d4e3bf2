// The parameters of each shape type as the side panel edits them: label, unit, how to read the
// value from a shape and how to write it back (a new shape object; shapes are immutable).
import type { Shape } from '../shared/blueprint/schema'
import type { Surface } from '../shared/lattice/surfaces'

export interface ShapeField {
  key: string
  label: string
  unit?: string
  kind: 'num' | 'int' | 'direction' | 'patch-kind'
  get: (s: Shape) => number | string
  set: (s: Shape, v: number | string) => Shape
}

type Of<T extends Shape['type']> = Extract<Shape, { type: T }>
const f = <T extends Shape['type']>(key: string, label: string, kind: ShapeField['kind'], get: (s: Of<T>) => number | string, set: (s: Of<T>, v: number | string) => Of<T>, unit?: string): ShapeField =>
  ({ key, label, unit, kind, get: s => get(s as Of<T>), set: (s, v) => set(s as Of<T>, v) })

export function shapeFields(shape: Shape, surface: Surface, basisCount: number): ShapeField[] {
  switch (shape.type) {
    case 'ring': return [
      f<'ring'>('center.0', 'centre x', 'num', s => s.center[0], (s, v) => ({ ...s, center: [Number(v), s.center[1]] }), 'nm'),
      f<'ring'>('center.1', 'centre y', 'num', s => s.center[1], (s, v) => ({ ...s, center: [s.center[0], Number(v)] }), 'nm'),
      f<'ring'>('radius_nm', 'radius', 'num', s => s.radius_nm, (s, v) => ({ ...s, radius_nm: Number(v) }), 'nm'),
      f<'ring'>('n', 'atoms N', 'int', s => s.n, (s, v) => ({ ...s, n: Number(v) })),
      f<'ring'>('phase_deg', 'first atom at', 'num', s => s.phase_deg ?? 0, (s, v) => ({ ...s, phase_deg: Number(v) }), '°'),
    ]
    case 'ellipse': return [
      f<'ellipse'>('center.0', 'centre x', 'num', s => s.center[0], (s, v) => ({ ...s, center: [Number(v), s.center[1]] }), 'nm'),
      f<'ellipse'>('center.1', 'centre y', 'num', s => s.center[1], (s, v) => ({ ...s, center: [s.center[0], Number(v)] }), 'nm'),
      f<'ellipse'>('semi_a_nm', 'semi-axis a', 'num', s => s.semi_a_nm, (s, v) => ({ ...s, semi_a_nm: Number(v) }), 'nm'),
      f<'ellipse'>('semi_b_nm', 'semi-axis b', 'num', s => s.semi_b_nm, (s, v) => ({ ...s, semi_b_nm: Number(v) }), 'nm'),
      f<'ellipse'>('angle_deg', 'angle of a', 'num', s => s.angle_deg ?? 0, (s, v) => ({ ...s, angle_deg: Number(v) }), '°'),
      f<'ellipse'>('n', 'atoms N', 'int', s => s.n, (s, v) => ({ ...s, n: Number(v) })),
    ]
    case 'chain': return [
      f<'chain'>('start.0', 'start i', 'int', s => s.start[0], (s, v) => ({ ...s, start: [Number(v), s.start[1], s.start[2] ?? 0] })),
      f<'chain'>('start.1', 'start j', 'int', s => s.start[1], (s, v) => ({ ...s, start: [s.start[0], Number(v), s.start[2] ?? 0] })),
      ...(basisCount > 1 ? [f<'chain'>('start.2', 'start b', 'int', s => s.start[2] ?? 0, (s, v) => ({ ...s, start: [s.start[0], s.start[1], Number(v)] }))] : []),
      f<'chain'>('direction', 'direction', 'direction', s => s.direction, (s, v) => ({ ...s, direction: Number(v) })),
      f<'chain'>('count', 'atoms', 'int', s => s.count, (s, v) => ({ ...s, count: Number(v) })),
      f<'chain'>('step', 'spacing', 'int', s => s.step ?? 1, (s, v) => ({ ...s, step: Number(v) }), `× ${surface.nn_nm.toFixed(3)} nm`),
    ]
    case 'polygon': return [
      f<'polygon'>('spacing_steps', 'spacing', 'num', s => s.spacing_steps, (s, v) => ({ ...s, spacing_steps: Number(v) }), '× nn'),
    ]
    case 'patch': return [
      f<'patch'>('kind', 'lattice', 'patch-kind', s => s.kind, (s, v) => ({ ...s, kind: v as Of<'patch'>['kind'] })),
      f<'patch'>('spacing', 'spacing', 'num', s => s.spacing, (s, v) => ({ ...s, spacing: Number(v) }), '× nn'),
      f<'patch'>('angle_deg', 'angle', 'num', s => s.angle_deg ?? 0, (s, v) => ({ ...s, angle_deg: Number(v) }), '°'),
    ]
    case 'sites': return []
  }
}

/** A short description of a shape for the shape list. */
export function shapeLabel(shape: Shape, surface: Surface): string {
  switch (shape.type) {
    case 'ring': return `Ring · N ${shape.n} · R ${shape.radius_nm.toFixed(3)} nm`
    case 'ellipse': return `Ellipse · N ${shape.n} · ${shape.semi_a_nm.toFixed(2)} × ${shape.semi_b_nm.toFixed(2)} nm`
    case 'chain': return `Chain · ${shape.count} atoms · ${surface.directions[shape.direction]?.name ?? '?'} · every ${shape.step ?? 1}`
    case 'polygon': return `Outline · ${shape.vertices.length} corners`
    case 'patch': return `Patch · ${shape.kind} · ${shape.spacing} × nn`
    case 'sites': return `Sites · ${shape.sites.length}`
  }
}
