import type { H3Event } from 'h3'
import type { z } from 'zod'
import { isInputError } from '#shared/errors'

function fieldOf(path: PropertyKey[]): string {
  return path.length ? path.map(String).join('.') : 'body'
}

function badRequest(issues: z.core.$ZodIssue[]) {
  const first = issues[0]
  const field = first ? fieldOf(first.path) : 'body'
  return createError({
    statusCode: 400,
    message: first ? `${field}: ${first.message}` : 'Invalid request',
    data: { field, issues: issues.map(i => ({ field: fieldOf(i.path), message: i.message })) },
  })
}

/** Reads and validates a JSON body; a 400 names the first bad field, `data.issues` lists them all. */
export async function readBody400<T extends z.ZodType>(event: H3Event, schema: T): Promise<z.infer<T>> {
  let raw: unknown
  try {
    raw = await readBody(event)
  }
  catch {
    throw createError({ statusCode: 400, message: 'body: not valid JSON', data: { field: 'body' } })
  }
  const parsed = schema.safeParse(raw ?? {})
  if (!parsed.success) throw badRequest(parsed.error.issues)
  return parsed.data
}

export function parseQuery400<T extends z.ZodType>(event: H3Event, schema: T): z.infer<T> {
  const parsed = schema.safeParse(getQuery(event))
  if (!parsed.success) throw badRequest(parsed.error.issues)
  return parsed.data
}

/** Route params are numeric ids everywhere; anything else is a 404 (nothing to see there). */
export function idParam(event: H3Event, name: string): number {
  const raw = getRouterParam(event, name)
  const n = Number(raw)
  if (!raw || !Number.isSafeInteger(n) || n <= 0) throw createError({ statusCode: 404, message: `No such ${name.replace(/Id$/, '')}` })
  return n
}

/** Runs core code, turning its InputError into a 400 that names the field. */
export async function compute400<T>(fn: () => T | Promise<T>): Promise<T> {
  try {
    return await fn()
  }
  catch (e) {
    if (isInputError(e)) throw createError({ statusCode: 400, message: `${e.field}: ${e.message}`, data: { field: e.field } })
    throw e
  }
}

/** The raw JSON body for core code that validates it itself; 400 when it is not JSON at all. */
export async function readJson(event: H3Event): Promise<unknown> {
  try {
    return (await readBody(event)) ?? {}
  }
  catch {
    throw createError({ statusCode: 400, message: 'body: not valid JSON', data: { field: 'body' } })
  }
}
