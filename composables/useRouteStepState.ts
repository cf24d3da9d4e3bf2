// The route's entry in the step rail: empty until solved, done while it matches the workspace,
// needs a look when it is stale (newer marks, blueprint, lattice fit or scan) or has warnings.
import type { StepState } from '#shared/types/workspace'

export function useRouteStepState() {
  const route = useRouteStore()
  const ctx = useRouteContext()
  return computed<StepState>(() => {
    const base = { id: 'route' as const, label: 'Route' }
    const r = route.current
    if (!r) return { ...base, status: 'empty', detail: ctx.missing.value ? `needs ${ctx.missing.value}` : 'not solved yet' }
    if (ctx.stale.value) return { ...base, status: 'attention', detail: `route stale: ${ctx.stale.value}` }
    const w = r.result.warnings.length
    if (w) return { ...base, status: 'attention', detail: `${r.move_count} moves · ${w} ${w === 1 ? 'warning' : 'warnings'}` }
    return { ...base, status: 'done', detail: `${r.move_count} moves · ${r.total_length_nm.toFixed(1)} nm · ${formatDuration(r.result.time.total_s)}` }
  })
}
