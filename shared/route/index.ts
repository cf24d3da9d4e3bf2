// Public API of the route solver (atom-to-site assignment and clearance-keeping move order).
export { solveRoute, ON_SITE_NM, DEFAULT_CLEARANCE_NM } from './solve'
export { replan, normalisePlaced, type ReplanInput } from './replan'
export { estimateTime, DEFAULT_TIME } from './time'
export { RouteInput, TimeSettingsInput, validateRouteInput, MAX_ROUTE_POINTS } from './schema'
export { RouteDeadlineError } from './clock'
export { makeMetric, latticeSteps, reduceBasis, pathLength, type Metric } from './metric'
export { solveAssignment, DENSE_MAX_ENTRIES, type AssignInput, type AssignOutput } from './assign'
export { checkMoves } from './check'
export type {
  Point, LatticeFrame, CostKind, TimeSettings, RouteOptions, MoveKind, Move, RouteWarning,
  TimeEstimate, RouteOutput, AssignmentMode,
} from './types'
