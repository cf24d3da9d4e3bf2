// One error type for bad input anywhere in the computational core. The server turns it into a
// 400 whose message names the offending field; the client shows it next to that field.
export class InputError extends Error {
  readonly field: string
  constructor(field: string, message: string) {
    super(message)
    this.name = 'InputError'
    this.field = field
  }
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof Error && e.name === 'InputError' && typeof (e as InputError).field === 'string'
}
