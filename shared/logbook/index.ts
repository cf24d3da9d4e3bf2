// The night's record: logbook outcomes, run state derived from append-only entries, re-plan
// input, the instrument frame, and move success rates.
export * from './types'
export { deriveRunState, replanFromState, routeChain } from './state'
export { toInstrument, fromInstrument, type ScanWindow } from './instrument'
export * from './rates'
export * from './schema'
