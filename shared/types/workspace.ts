// The job's steps as the workspace shows them, each with its state.
export type StepId = 'scan' | 'marks' | 'lattice' | 'blueprint' | 'route' | 'waves' | 'logbook' | 'check'
export interface StepState { id: StepId, label: string, status: 'empty' | 'done' | 'attention', detail: string }
