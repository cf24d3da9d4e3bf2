// The night and the morning after of the build being looked at: its runs and as-built checks
// (summaries, for the step rail and the panels), and the check drawn on the canvas.
// Reloads by itself when another build is opened.
import { defineStore } from 'pinia'
import type { CheckListRow, CheckResult, RunListRow } from '#shared/types/night'
import type { StepState } from '#shared/types/workspace'

export const useNightStore = defineStore('night', () => {
  const ws = useWorkspaceStore()
  const runs = shallowRef<RunListRow[]>([])
  const checks = shallowRef<CheckListRow[]>([])
  /** The check drawn on the canvas, with the scan whose frame its points are in. */
  const shown = shallowRef<{ id: number, scanId: number, result: CheckResult } | null>(null)

  async function load() {
    const info = ws.info
    if (!info) {
      runs.value = []
      checks.value = []
      return
    }
    const { lab_id, id } = info.build
    const [r, c] = await Promise.all([
      api<RunListRow[]>(`/api/labs/${lab_id}/runs`, { query: { build: id } }),
      api<CheckListRow[]>(`/api/labs/${lab_id}/checks`, { query: { build: id } }),
    ]).catch(() => [[], []] as [RunListRow[], CheckListRow[]])
    if (ws.info?.build.id !== id) return
    runs.value = r
    checks.value = c
  }
  watch(() => ws.info?.build.id, () => {
    shown.value = null
    void load()
  }, { immediate: true })
  // The two steps' entries in the workspace rail.
  const logbookStep = computed<StepState>(() => {
    const open = runs.value.find(r => r.state === 'open')
    if (open) return { id: 'logbook', label: 'Night', status: 'attention', detail: `run ${open.id} open · ${open.entries} entries` }
    const last = runs.value[0]
    if (last) return { id: 'logbook', label: 'Night', status: 'done', detail: `${runs.value.length} run${runs.value.length === 1 ? '' : 's'} · last: ${last.placed} placed` }
    return { id: 'logbook', label: 'Night', status: 'empty', detail: 'no run yet: start one from a route' }
  })
  const checkStep = computed<StepState>(() => {
    const last = checks.value[0]
    if (!last) return { id: 'check', label: 'As-built check', status: 'empty', detail: 'needs an after-scan' }
    const pct = `fidelity ${(last.fidelity * 100).toFixed(0)} %`
    const short = Math.round(last.site_count * (1 - last.fidelity))
    return short === 0
      ? { id: 'check', label: 'As-built check', status: 'done', detail: pct }
      : { id: 'check', label: 'As-built check', status: 'attention', detail: `${pct} · ${short} site${short === 1 ? '' : 's'} not placed` }
  })
  return { runs, checks, shown, load, logbookStep, checkStep }
})
