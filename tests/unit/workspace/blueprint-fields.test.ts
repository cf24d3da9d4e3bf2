// The side panel's shape parameters: writing back what was read leaves a shape unchanged, and
// writing one field changes that field only (checked against the shape's own values).
import { describe, expect, it } from 'vitest'
import type { Shape } from '../../../shared/blueprint/schema'
import { getSurface } from '../../../shared/lattice'
import { shapeFields, shapeLabel } from '../../../utils/blueprint-fields'

const surface = getSurface('Cu(111)')
const shapes: Shape[] = [
  { type: 'ring', center: [1, 2], radius_nm: 3, n: 24, phase_deg: 15 },
  { type: 'ellipse', center: [0, 0], semi_a_nm: 4, semi_b_nm: 2, angle_deg: 30, n: 20 },
  { type: 'chain', start: [1, 2, 0], direction: 2, count: 7, step: 2 },
  { type: 'polygon', vertices: [[0, 0], [3, 0], [0, 3]], spacing_steps: 2 },
  { type: 'patch', kind: 'kagome', spacing: 3, region: [[0, 0], [4, 0], [4, 4]], angle_deg: 0 },
]

describe('shapeFields', () => {
  it('round-trips every field of every shape type', () => {
    for (const s of shapes) {
      for (const f of shapeFields(s, surface, 1)) expect(f.set(s, f.get(s))).toEqual(s)
    }
  })

  it('changes only the field written', () => {
    const ring = shapes[0]!
    const n = shapeFields(ring, surface, 1).find(f => f.key === 'n')!
    expect(n.set(ring, 30)).toEqual({ ...ring, n: 30 })
    const cy = shapeFields(ring, surface, 1).find(f => f.key === 'center.1')!
    expect(cy.set(ring, -4)).toEqual({ ...ring, center: [1, -4] })
  })

  it('offers the basis index of a chain start only where a cell has several sites', () => {
    const chain = shapes[2]!
    expect(shapeFields(chain, surface, 1).map(f => f.key)).not.toContain('start.2')
    expect(shapeFields(chain, surface, 3).map(f => f.key)).toContain('start.2')
  })

  it('labels a chain with its drag direction by name', () => {
    expect(shapeLabel(shapes[2]!, surface)).toBe(`Chain · 7 atoms · ${surface.directions[2]!.name} · every 2`)
  })
})
