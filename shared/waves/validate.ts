// Wave inputs name a tuple field as a whole ('point', not 'point[1]').
import type { z } from 'zod'
import { parseOrThrow as parseWith } from '../validate'

const TUPLE_FIELDS = new Set(['point', 'extent_nm', 'spectrum_range_eV', 'delta0'])

export function parseOrThrow<T extends z.ZodType>(schema: T, input: unknown): z.output<T> {
  return parseWith(schema, input, TUPLE_FIELDS)
}
