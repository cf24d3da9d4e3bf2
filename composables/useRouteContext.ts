// What a route is solved from, as the workspace shows it now: the open scan and its marks, the
// blueprint (the blueprint step's, else the build's newest), the lattice fit (the lattice step's,
// else the scan's latest saved), and whether the route on show is stale against them.
export function useRouteContext() {
  const scan = useScanStore()
  const marks = useMarksStore()
  const bp = useBlueprintStore()
  const lattice = useLatticeStore()
  const route = useRouteStore()

  const blueprint = computed(() => bp.current
    ? { id: bp.current.id, name: bp.current.name, version: bp.current.version }
    : route.fallbackBlueprint)
  const fitVersion = computed(() => lattice.fit?.version ?? route.fallbackFitVersion)
  /** What is missing before a route can be solved, in the order of the steps. */
  const missing = computed(() => {
    if (!scan.meta) return 'a scan'
    if (!marks.marks.length) return 'marks on the scan'
    if (fitVersion.value === undefined) return 'a lattice fit of the scan'
    if (!blueprint.value) return 'a blueprint'
    return null
  })
  const stale = computed(() => {
    const r = route.current
    // An after-scan on the canvas (the as-built check) is not something the plan is solved from.
    if (!r || scan.meta?.purpose === 'after') return null
    return routeStaleReason(
      { scan_id: r.scan_id, blueprint_id: r.blueprint_id, marks_version: r.options.marks_version, lattice_fit_version: r.options.lattice_fit_version },
      { scanId: scan.meta?.id, blueprintId: blueprint.value?.id, marksVersion: marks.baseVersion, marksDirty: marks.dirty, fitVersion: fitVersion.value },
    )
  })
  return { blueprint, fitVersion, missing, stale }
}

/**
 * Keeps the route store in step with the workspace: fetches what the other steps have not
 * loaded, lists the blueprint's routes and shows the newest one for the open scan.
 */
export function useRouteLoader() {
  const ws = useWorkspaceStore()
  const scan = useScanStore()
  const bp = useBlueprintStore()
  const lattice = useLatticeStore()
  const route = useRouteStore()
  const ctx = useRouteContext()
  const openRoute = useOpenRoute()

  async function refreshFallbacks() {
    const info = ws.info
    if (!bp.current && info) {
      const rows = await api<{ id: number, name: string, version: number }[]>(`/api/labs/${info.build.lab_id}/builds/${info.build.id}/blueprints`).catch(() => [])
      route.fallbackBlueprint = rows[0] ? { id: rows[0].id, name: rows[0].name, version: rows[0].version } : null
    }
    if (!lattice.fit && scan.meta) {
      const fits = await api<{ version: number }[]>(`/api/scans/${scan.meta.id}/lattice-fits`).catch(() => [])
      route.fallbackFitVersion = fits[0]?.version
    }
    else if (!scan.meta) route.fallbackFitVersion = undefined
  }
  async function refreshRoutes() {
    const id = ctx.blueprint.value?.id
    if (!id) return route.reset()
    await route.loadList(id).catch(() => {
      route.list = []
    })
    const shown = route.current
    if (shown && route.list.some(r => r.id === shown.id)) return
    const best = route.list.find(r => r.scan_id === scan.meta?.id) ?? route.list[0]
    if (best) await openRoute(best.id)
    else route.show(null)
  }
  async function refresh() {
    await refreshFallbacks()
    await refreshRoutes()
  }
  watch(() => [ws.info?.build.id, scan.meta?.id, bp.current?.id, lattice.fit?.id], refresh, { immediate: true })
  // Other steps may have saved a fit or a blueprint without filling their stores.
  watch(() => ws.step, (step) => {
    if (step === 'route') void refresh()
  })
  onBeforeUnmount(() => route.reset())
  return { refresh }
}

/** Shows a saved route and takes its options as the draft for the next solve. */
export function useOpenRoute() {
  const route = useRouteStore()
  const marks = useMarksStore()
  return async (id: number) => {
    try {
      await route.open(id)
    }
    catch {
      return route.show(null)
    }
    const r = route.current
    if (r) route.adopt(r, r.options.marks_version === marks.baseVersion && !marks.dirty ? marks.marks.map(m => m.id) : null)
  }
}
