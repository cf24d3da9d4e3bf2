// When the workspace says "route stale": each changed input named, in the order a user would fix it.
import { describe, expect, it } from 'vitest'
import { routeStaleReason } from '../../../utils/routeStale'
import { formatDuration } from '../../../utils/duration'

const route = { scan_id: 4, blueprint_id: 10, marks_version: 3, lattice_fit_version: 2 }
const now = { scanId: 4, blueprintId: 10, marksVersion: 3, marksDirty: false, fitVersion: 2 }

describe('routeStaleReason', () => {
  it('is null while everything matches', () => {
    expect(routeStaleReason(route, now)).toBeNull()
  })
  it('names newer marks, saved or still being edited', () => {
    expect(routeStaleReason(route, { ...now, marksVersion: 4 })).toBe('newer marks')
    expect(routeStaleReason(route, { ...now, marksDirty: true })).toBe('newer marks')
  })
  it('names a newer blueprint, lattice fit or scan', () => {
    expect(routeStaleReason(route, { ...now, blueprintId: 11 })).toBe('newer blueprint')
    expect(routeStaleReason(route, { ...now, fitVersion: 3 })).toBe('newer lattice fit')
    expect(routeStaleReason(route, { ...now, scanId: 5, marksVersion: 1 })).toBe('newer scan')
  })
  it('does not compare marks for a re-plan from given positions', () => {
    expect(routeStaleReason({ ...route, marks_version: null }, { ...now, marksVersion: 9 })).toBeNull()
  })
})

describe('formatDuration', () => {
  it('writes seconds, minutes and hours (hand-computed: 3725 s = 1 h 02 min 05 s)', () => {
    expect(formatDuration(45.4)).toBe('45 s')
    expect(formatDuration(725)).toBe('12 min 05 s')
    expect(formatDuration(3725)).toBe('1 h 02 min')
    expect(formatDuration(Number.NaN)).toBe('—')
  })
})
