// As-built check: blueprint sites against found adatoms, by optimal one-to-one matching.
export { checkAsBuilt, DEFAULT_TOLERANCE_nm, DEFAULT_NEAR_nm, MAX_COMPONENT_CELLS, MAX_CANDIDATES } from './check'
export type { CheckOutput, OffSite, SiteStatus } from './check'
export { matchWithin, DISTANCE_SLACK_nm } from './matching'
export type { MatchOptions, MatchResult } from './matching'
export { CheckInput, CHECK_LIMITS } from './schema'
export { scanDrift, alignByLatticeVector, type Drift } from './register'
