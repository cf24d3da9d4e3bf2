// The computations the server runs off the request thread, by name. The same table serves the
// worker threads (production) and inline calls (development, where the code reloads live).
import { isInputError } from '../../shared/errors'
import { checkAsBuilt } from '../../shared/compare'
import { computeBox, computeCorral, computeScattering } from '../../shared/waves'
import { RouteDeadlineError, replan, solveRoute, type ReplanInput } from '../../shared/route'
import { detectAdatoms, parseDetectInput } from '../../shared/scan'
import { fitLattice, parseLatticeFitInput } from '../../shared/lattice'
import type { RouteOptions } from '../../shared/route/types'

export type JobKind = 'route' | 'replan' | 'corral' | 'scattering' | 'chain' | 'check' | 'detect' | 'detect-grid' | 'lattice-fit'
export interface JobRequest { kind: JobKind, input: unknown, options?: Omit<RouteOptions, 'onProgress'> }
export type JobFailure = { field: string, message: string, kind: 'input' } | { message: string, kind: 'deadline' | 'crash' }

export function runJob(req: JobRequest, progress: (fraction: number, stage: string) => void): unknown {
  switch (req.kind) {
    case 'route': return solveRoute(req.input, { ...req.options, onProgress: progress })
    case 'replan': return replan(req.input as ReplanInput, { ...req.options, onProgress: progress })
    case 'corral': return computeCorral(req.input)
    case 'scattering': return computeScattering(req.input)
    case 'chain': return computeBox(req.input)
    case 'check': return checkAsBuilt(req.input)
    // From JSON (the compute route) or from a stored Float32 grid (already checked at upload).
    case 'detect': return detectAdatoms(parseDetectInput(req.input))
    case 'detect-grid': return detectAdatoms(req.input as Parameters<typeof detectAdatoms>[0])
    case 'lattice-fit': return fitLattice(parseLatticeFitInput(req.input))
  }
}

export function describeFailure(e: unknown): JobFailure {
  if (isInputError(e)) return { kind: 'input', field: e.field, message: e.message }
  if (e instanceof RouteDeadlineError) return { kind: 'deadline', message: e.message }
  return { kind: 'crash', message: e instanceof Error ? e.message : String(e) }
}
