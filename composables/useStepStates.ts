// The job's steps as the workspace rail shows them: each step says whether it is empty, done or
// needs a look, with a short reason. Each step's own entry reads its own store.
import type { StepState } from '#shared/types/workspace'

export function useStepStates() {
  const scan = useScanStore()
  const marks = useMarksStore()
  const blueprint = useBlueprintStore()
  const waves = useWavesStore()
  const route = useRouteStepState()
  return computed<StepState[]>(() => [
    scan.meta
      ? { id: 'scan', label: 'Scan', status: 'done', detail: `${scan.meta.size_x_nm} × ${scan.meta.size_y_nm} nm · ${scan.meta.filename}` }
      : { id: 'scan', label: 'Scan', status: 'empty', detail: 'no scan loaded' },
    !scan.meta
      ? { id: 'marks', label: 'Marks', status: 'empty', detail: 'needs a scan' }
      : marks.marks.length
        ? { id: 'marks', label: 'Marks', status: 'done', detail: `${marks.marks.length} marks` }
        : { id: 'marks', label: 'Marks', status: 'attention', detail: 'no marks yet: detect or add' },
    { id: 'lattice', label: 'Lattice fit', status: 'empty', detail: marks.marks.length ? 'not fitted yet' : 'needs marks' },
    { id: 'blueprint', label: 'Blueprint', status: 'empty', detail: 'no shapes yet' },
    route.value,
    wavesState(blueprint.sites.length, waves),
    { id: 'logbook', label: 'Night', status: 'empty', detail: 'needs a route' },
    { id: 'check', label: 'As-built check', status: 'empty', detail: 'needs an after-scan' },
  ])
}

const MODEL_NAMES = { corral: 'hard wall', chain: '1-D box', scattering: 'scattering' } as const

function wavesState(sites: number, waves: ReturnType<typeof useWavesStore>): StepState {
  const base = { id: 'waves', label: 'Wave preview' } as const
  if (!sites) return { ...base, status: 'empty', detail: 'needs a blueprint' }
  if (Object.values(waves.problems).some(Boolean)) return { ...base, status: 'attention', detail: 'a model parameter was refused' }
  if (Object.values(waves.warnings).some(w => w.length)) return { ...base, status: 'attention', detail: `${MODEL_NAMES[waves.model]}: outside the model's range` }
  const first = waves.ladder[0]
  if (!first) return { ...base, status: 'empty', detail: `${sites} sites, not previewed yet` }
  return { ...base, status: 'done', detail: `${MODEL_NAMES[waves.model]} · ${waves.model === 'scattering' ? 'first maximum' : 'lowest level'} ${first.E_eV.toFixed(3)} eV` }
}
