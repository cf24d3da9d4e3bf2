import type { H3Event } from 'h3'
import type { Role } from '#shared/roles'

/** requireLabRole for a row found by its id: a caller outside its lab gets "No such <what>" (404). */
export async function requireRowLab(event: H3Event, labId: number, needed: Role, what: string) {
  try {
    return await requireLabRole(event, labId, needed)
  }
  catch (e) {
    if ((e as { statusCode?: number }).statusCode === 404) throw createError({ statusCode: 404, message: `No such ${what}` })
    throw e
  }
}
