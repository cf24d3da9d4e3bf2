// Whether a saved route still matches what the workspace shows: the same scan, blueprint version,
// marks and lattice fit it was solved from. Returns what changed, or null when it is current.
export interface RouteOrigin { scan_id: number | null, blueprint_id: number, marks_version: number | null, lattice_fit_version: number | null }
export interface WorkspaceNow { scanId?: number, blueprintId?: number, marksVersion?: number, marksDirty?: boolean, fitVersion?: number }

export function routeStaleReason(route: RouteOrigin, now: WorkspaceNow): string | null {
  if (now.scanId !== undefined && route.scan_id !== null && route.scan_id !== now.scanId) return now.scanId > route.scan_id ? 'newer scan' : 'another scan'
  if (now.blueprintId !== undefined && route.blueprint_id !== now.blueprintId) return now.blueprintId > route.blueprint_id ? 'newer blueprint' : 'another blueprint version'
  if (route.marks_version !== null && ((now.marksVersion ?? 0) > route.marks_version || now.marksDirty)) return 'newer marks'
  if (route.lattice_fit_version !== null && now.fitVersion !== undefined && now.fitVersion > route.lattice_fit_version) return 'newer lattice fit'
  return null
}
