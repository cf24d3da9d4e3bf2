// The job's steps as the workspace rail shows them: each step says whether it is empty, done or
// needs a look, with a short reason. Each step's own entry reads its own store.
import type { StepState } from '#shared/types/workspace'

export function useStepStates() {
  const scan = useScanStore()
  const marks = useMarksStore()
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
    { id: 'lattice', label: 'Lattice fit', status: 'empty', detail: marks.marks.length ? 'not fitted yet' : 'needs marks' },
    { id: 'blueprint', label: 'Blueprint', status: 'empty', detail: 'no shapes yet' },
    { id: 'route', label: 'Route', status: 'empty', detail: 'needs marks and a blueprint' },
    { id: 'waves', label: 'Wave preview', status: 'empty', detail: 'needs a blueprint' },
    night.logbookStep,
    night.checkStep,
  ])
}
