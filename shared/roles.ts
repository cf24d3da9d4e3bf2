// Lab roles, ordered: an owner may do everything a member may, a member everything a viewer may.
export const ROLE_ORDER = ['viewer', 'member', 'owner'] as const
export type Role = typeof ROLE_ORDER[number]

export function roleAllows(actual: Role, needed: Role): boolean {
  return ROLE_ORDER.indexOf(actual) >= ROLE_ORDER.indexOf(needed)
}

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner — members and everything',
  member: 'Member — create, edit, log moves',
  viewer: 'Viewer — read only',
}
