// Turns a zod validation failure into the core's InputError naming the offending field
// ('radius_nm', 'scatterers[3]'), so the server can answer 400 with that name.
import type { z } from 'zod'
import { InputError } from './errors'

/**
 * `tupleFields` are fields whose value is a small tuple ([x, y], a range): an issue inside them
 * names the field itself rather than one of its components.
 */
export function fieldName(path: readonly PropertyKey[], tupleFields: ReadonlySet<string> = new Set()): string {
  const parts = [...path]
  const last = parts[parts.length - 1]
  const prev = parts[parts.length - 2]
  if (typeof last === 'number' && parts.length >= 2 && (typeof prev === 'number' || tupleFields.has(String(prev)))) parts.pop()
  let s = ''
  for (const p of parts) s += typeof p === 'number' ? `[${p}]` : s === '' ? String(p) : `.${String(p)}`
  return s === '' ? 'input' : s
}

export function parseOrThrow<T extends z.ZodType>(schema: T, input: unknown, tupleFields?: ReadonlySet<string>): z.output<T> {
  const r = schema.safeParse(input)
  if (r.success) return r.data
  const issue = r.error.issues[0]!
  throw new InputError(fieldName(issue.path, tupleFields), issue.message)
}
