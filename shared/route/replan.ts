// Re-plan after a partial build run: atoms already on their sites are locked there and fill them;
// the rest is solved afresh from the atoms' current positions (same solver, same guarantee).
import { InputError } from '../errors'
import { solveRoute } from './solve'
import type { RouteInput } from './schema'
import type { RouteOptions, RouteOutput } from './types'

export interface ReplanInput extends Omit<RouteInput, 'placed'> {
  /** siteIndex → atomIndex already satisfied, as pairs or as an object keyed by site index. */
  placed: Array<[number, number]> | Record<string, number>
}

export function normalisePlaced(placed: ReplanInput['placed']): Array<[number, number]> {
  if (Array.isArray(placed)) return placed.map(([s, a]) => [s, a] as [number, number])
  if (placed === null || typeof placed !== 'object') throw new InputError('placed', 'placed must map site indices to atom indices')
  return Object.entries(placed).map(([s, a], k) => {
    const si = Number(s)
    if (!Number.isInteger(si)) throw new InputError(`placed.${s}`, 'keys must be site indices')
    if (typeof a !== 'number') throw new InputError(`placed.${s}`, 'values must be atom indices')
    void k
    return [si, a] as [number, number]
  })
}

export function replan(input: ReplanInput, options: RouteOptions = {}): RouteOutput {
  const placed = normalisePlaced(input.placed)
  const { placed: _ignored, ...rest } = input
  void _ignored
  return solveRoute({ ...rest, placed }, {
    ...options,
    placed,
    locked: [...(options.locked ?? input.locked ?? []), ...placed.map(([, a]) => a)],
  })
}
