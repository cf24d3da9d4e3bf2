// Bad route inputs are rejected with an InputError naming the field (contract: never a 500).
import { describe, expect, it } from 'vitest'
import { isInputError } from '../../../shared/errors'
import { solveRoute, validateRouteInput, MAX_ROUTE_POINTS } from '../../../shared/route/index'

function fieldOf(raw: unknown): string {
  try { validateRouteInput(raw) }
  catch (e) { if (isInputError(e)) return e.field; throw e }
  return 'accepted'
}

const ok = { atoms: [[0, 0], [1, 1]], sites: [[2, 2]] }

describe('validateRouteInput', () => {
  it('accepts a minimal body', () => expect(fieldOf(ok)).toBe('accepted'))
  it('rejects NaN, infinite and non-numeric coordinates by position', () => {
    expect(fieldOf({ ...ok, atoms: [[0, 0], [1, 1], [2, 2], [Number.NaN, 1]] })).toBe('atoms.3.0')
    expect(fieldOf({ ...ok, sites: [[2, Infinity]] })).toBe('sites.0.1')
    expect(fieldOf({ ...ok, atoms: [[0, '1']] })).toBe('atoms.0.1')
    expect(fieldOf({ ...ok, atoms: [[0]] })).toBe('atoms.0')
  })
  it('rejects empty atom or site lists', () => {
    expect(fieldOf({ ...ok, atoms: [] })).toBe('atoms')
    expect(fieldOf({ ...ok, sites: [] })).toBe('sites')
    expect(fieldOf({ sites: [[0, 0]] })).toBe('atoms')
  })
  it('rejects a lattice with parallel or zero vectors', () => {
    expect(fieldOf({ ...ok, lattice: { a1: [0.25, 0], a2: [0.5, 0], origin: [0, 0] } })).toBe('lattice.a2')
    expect(fieldOf({ ...ok, lattice: { a1: [0, 0], a2: [0.5, 0], origin: [0, 0] } })).toBe('lattice.a1')
  })
  it('rejects a negative clearance and an unknown cost', () => {
    expect(fieldOf({ ...ok, clearance_nm: -0.1 })).toBe('clearance_nm')
    expect(fieldOf({ ...ok, cost: 'manhattan' })).toBe('cost')
  })
  it(`rejects more than ${MAX_ROUTE_POINTS} atoms + sites`, () => {
    const atoms = Array.from({ length: MAX_ROUTE_POINTS - 5 }, (_, i) => [i, 0])
    const sites = Array.from({ length: 10 }, (_, i) => [i, 1])
    expect(fieldOf({ atoms, sites })).toBe('atoms')
  })
  it('rejects indices of atoms that do not exist', () => {
    expect(fieldOf({ ...ok, locked: [0, 5] })).toBe('locked.1')
    expect(fieldOf({ ...ok, excluded: [-1] })).toBe('excluded.0')
    expect(fieldOf({ ...ok, placed: [[0, 7]] })).toBe('placed.0.1')
  })
  it('rejects a keep-out polygon with fewer than three corners', () => {
    expect(fieldOf({ ...ok, keep_out: [[[0, 0], [1, 0]]] })).toBe('keep_out.0')
  })
  it('solveRoute validates too, and checks option indices', () => {
    expect(() => solveRoute({ ...ok, atoms: [] })).toThrowError(/at least one atom/)
    try { solveRoute(ok, { locked: [9] }) }
    catch (e) { expect(isInputError(e) && e.field).toBe('locked.0') }
    expect(() => solveRoute(ok, { locked: [9] })).toThrow()
  })
})
