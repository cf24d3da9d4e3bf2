// Turns an API error into what a form shows: one message and, where the server named fields,
// a message per field.
export interface ApiProblem { message: string, fields: Record<string, string>, status?: number }

interface FetchErrorLike { statusCode?: number, status?: number, data?: { message?: string, data?: { field?: string, issues?: { field: string, message: string }[] } }, message?: string }

export function apiProblem(e: unknown): ApiProblem {
  const err = (e ?? {}) as FetchErrorLike
  const body = err.data
  const fields: Record<string, string> = {}
  for (const issue of body?.data?.issues ?? []) fields[issue.field] ??= issue.message
  if (body?.data?.field && body.message && !fields[body.data.field]) fields[body.data.field] = body.message.replace(/^[\w.[\]]+: /, '')
  const status = err.statusCode ?? err.status
  const message = body?.message ?? (status === undefined ? 'Could not reach the server. Check the connection and try again.' : err.message ?? 'Something went wrong.')
  return { message, fields, status }
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'
export interface ApiOptions { method?: Method, body?: unknown, query?: Record<string, unknown>, headers?: Record<string, string>, signal?: AbortSignal, responseType?: 'json' | 'arrayBuffer' | 'blob' | 'text' }

/**
 * `$fetch` with the result type stated by the caller. Nuxt's route-typed `$fetch` makes the type
 * checker compare every server route against template-literal URLs, which overflows its stack on
 * an app with this many routes; stating the type keeps checks fast and explicit.
 */
export function api<T = unknown>(url: string, opts: ApiOptions = {}): Promise<T> {
  return ($fetch as unknown as (u: string, o: ApiOptions) => Promise<T>)(url, opts)
}
