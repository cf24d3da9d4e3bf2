import { expect } from 'vitest'
import { InputError } from '../../../shared/errors'

/** Runs `fn` and expects an InputError on the uploaded file whose message matches. */
export function expectInputError(fn: () => unknown, message: RegExp) {
  try {
    fn()
  }
  catch (e) {
    expect(e).toBeInstanceOf(InputError)
    expect((e as InputError).field).toBe('file')
    expect((e as InputError).message).toMatch(message)
    return
  }
  throw new Error('expected an InputError')
}
