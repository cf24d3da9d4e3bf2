// The job's steps as the workspace rail shows them: each step says whether it is empty, done or
// needs a look, with a short reason. Each step's own entry reads its own store.
import type { StepState } from '#shared/types/workspace'

export function useStepStates() {
  const scan = useScanStore()
  const marks = useMarksStore()
  const lattice = useLatticeStore()
  const blueprint = useBlueprintStore()
  const waves = useWavesStore()
  const route = useRouteStepState()
  const night = useNightStore()
  return computed<StepState[]>(() => [
    scan.meta
      ? { id: 'scan', label: 'Scan', status: 'done', detail: `${scan.meta.size_x_nm} × ${scan.meta.size_y_nm} nm · ${scan.meta.filename}` }
      : { id: 'scan', label: 'Scan', status: 'empty', detail: 'no scan loaded' },
    !scan.meta
      ? { id: 'marks', label: 'Marks', status: 'empty', detail: 'needs a scan' }
      : marks.marks.length
        ? { id: 'marks', label: 'Marks', status: 'done', detail: `${marks.marks.length} marks` }
        : { id: 'marks', label: 'Marks', status: 'attention', detail: 'no marks yet: detect or add' },
    latticeStep(scan.meta !== null, marks.marks.length, lattice),
    blueprintStep(blueprint, lattice.fit !== null),
    route.value,
    wavesState(blueprint.sites.length, waves),
    night.logbookStep,
    night.checkStep,
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

function latticeStep(hasScan: boolean, markCount: number, lattice: ReturnType<typeof useLatticeStore>): StepState {
  const base = { id: 'lattice' as const, label: 'Lattice fit' }
  const fit = lattice.fit
  if (!hasScan) return { ...base, status: 'empty', detail: 'needs a scan' }
  if (!fit) return { ...base, status: 'empty', detail: markCount ? 'not fitted yet' : 'needs marks' }
  const off = lattice.snap?.off.length ?? 0
  const rms = fit.residual_nm
  const sep = lattice.minSeparation_nm
  if (off) return { ...base, status: 'attention', detail: `${off} mark${off === 1 ? '' : 's'} off-lattice` }
  if (rms !== null && sep > 0 && rms > 0.1 * sep) return { ...base, status: 'attention', detail: `residual ${(rms * 1000).toFixed(0)} pm: check the fit` }
  const how = fit.source === 'fit' ? `RMS ${((rms ?? 0) * 1000).toFixed(1)} pm` : 'placed by hand'
  return { ...base, status: 'done', detail: `${fit.surface} ${fit.site} · ${fit.result.rotation_deg.toFixed(1)}° · ${how}${fit.locked ? ' · locked' : ''}` }
}

function blueprintStep(bp: ReturnType<typeof useBlueprintStore>, hasFit: boolean): StepState {
  const base = { id: 'blueprint' as const, label: 'Blueprint' }
  if (!hasFit) return { ...base, status: 'empty', detail: bp.current ? `v${bp.current.version} · needs a lattice fit` : 'needs a lattice fit' }
  if (!bp.draft.length) return { ...base, status: 'empty', detail: 'no shapes yet' }
  const e = bp.expansion
  const close = e?.issues.filter(i => i.kind === 'too-close').length ?? 0
  const outside = e?.issues.filter(i => i.kind === 'outside').length ?? 0
  if (bp.problems.length) return { ...base, status: 'attention', detail: `${bp.problems.length} shape${bp.problems.length === 1 ? '' : 's'} cannot be built` }
  if (close) return { ...base, status: 'attention', detail: `${close} pair${close === 1 ? '' : 's'} too close` }
  if (outside) return { ...base, status: 'attention', detail: `${outside} site${outside === 1 ? '' : 's'} outside the scan` }
  if (bp.dirty) return { ...base, status: 'attention', detail: `${bp.sites.length} sites · unsaved` }
  return { ...base, status: 'done', detail: `${bp.sites.length} sites · v${bp.current?.version ?? 1}` }
}
