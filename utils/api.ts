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
