// Shared assertions for the lattice and blueprint tests.
import { expect } from 'vitest'
import { isInputError } from '../../../shared/errors'

/** Runs fn and checks it throws InputError naming `field`; returns the message for further checks. */
export function expectInputError(fn: () => unknown, field: string): string {
  let caught: unknown
  try {
    fn()
  }
  catch (e) {
    caught = e
  }
  expect(isInputError(caught), `expected InputError(${field}), got ${String(caught)}`).toBe(true)
  expect((caught as { field: string }).field).toBe(field)
  return (caught as Error).message
}

/** Independent point-in-polygon by winding number (the library uses crossing numbers). */
export function windingInside(x: number, y: number, poly: readonly (readonly number[])[]): boolean {
  let w = 0
  for (let k = 0; k < poly.length; k++) {
    const p = poly[k]!, q = poly[(k + 1) % poly.length]!
    const isLeft = (q[0]! - p[0]!) * (y - p[1]!) - (x - p[0]!) * (q[1]! - p[1]!)
    if (p[1]! <= y) {
      if (q[1]! > y && isLeft > 0) w++
    }
    else if (q[1]! <= y && isLeft < 0) w--
  }
  return w !== 0
}
