import { describe, expect, it } from 'vitest'
import { Shape, expandBlueprint, parseBlueprintInput } from '../../../shared/blueprint'
import { expectInputError } from '../lattice/helpers'

describe('blueprint schema', () => {
  it('parses every shape type and fills defaults (ellipse angle 0, chain step 1)', () => {
    const input = parseBlueprintInput({
      surface: 'Cu(111)',
      shapes: [
        { type: 'ring', center: [0, 0], radius_nm: 5, n: 12 },
        { type: 'ellipse', center: [0, 0], semi_a_nm: 6, semi_b_nm: 4, n: 16 },
        { type: 'chain', start: [0, 0], direction: 1, count: 4 },
        { type: 'polygon', vertices: [[0, 0], [3, 0], [0, 3]], spacing_steps: 2 },
        { type: 'patch', kind: 'kagome', spacing: 3, region: [[-3, -3], [3, -3], [3, 3]] },
        { type: 'sites', sites: [[1, 2], [3, 4, 0]] },
      ],
    })
    const [, ellipse, chain] = input.shapes
    expect(ellipse?.type === 'ellipse' && ellipse.angle_deg).toBe(0)
    expect(chain?.type === 'chain' && chain.step).toBe(1)
    // What passes the schema expands (sites of all six shapes).
    expect(expandBlueprint(input.shapes, input.surface).perShape).toHaveLength(6)
  })

  it('names the offending field with its path', () => {
    expectInputError(() => parseBlueprintInput({ surface: 'Cu(111)', shapes: [] }), 'shapes')
    expectInputError(() => parseBlueprintInput({ surface: 'Cu(111)', shapes: [{ type: 'ring', center: [0, 0], radius_nm: -1, n: 12 }] }), 'shapes[0].radius_nm')
    expectInputError(() => parseBlueprintInput({ surface: 'Cu(111)', shapes: [{ type: 'chain', start: [0, 0.5], direction: 0, count: 3 }] }), 'shapes[0].start')
    expectInputError(() => parseBlueprintInput({ surface: 'Cu(111)', shapes: [{ type: 'blob' }] }), 'shapes[0].type')
    expectInputError(() => parseBlueprintInput({ surface: 'Cu(111)', shapes: [{ type: 'patch', kind: 'hexagonal', spacing: 3, region: [[0, 0], [1, 0], [0, 1]] }] }), 'shapes[0].kind')
    expect(Shape.safeParse({ type: 'sites', sites: [[0, 0, -1]] }).success).toBe(false)
  })
})
