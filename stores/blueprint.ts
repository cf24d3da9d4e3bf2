// The blueprint of the build being edited: its shapes in the ideal lattice frame and the sites
// they snap to, mapped onto the current scan through the lattice fit.
// Filled by the blueprint step; read by the route and wave steps.
// The draft is a list of immutable shapes with undo/redo; saving makes a new version.
import { defineStore } from 'pinia'
import { defaultMinSpacing } from '#shared/blueprint/context'
import { createDraftCache, expandDraft, type DraftExpansion } from '#shared/blueprint/draft'
import { scanRectInIdeal } from '#shared/blueprint/frame-map'
import type { Shape } from '#shared/blueprint/schema'
import type { Vec2 } from '#shared/lattice/vec'

export interface BlueprintRow {
  id: number
  lineage: number
  version: number
  name: string
  surface: string
  site: string
  min_spacing_nm: number | null
  shapes: unknown[]
  site_count: number
  created_at: string
}

export interface PlacedSite { i: number, j: number, b: number, shape: number, x_nm: number, y_nm: number }
export interface DraftShape { id: number, shape: Shape }
export interface BlueprintVersion { id: number, version: number, name: string, site_count: number, created_at: string, author: string }

const HISTORY = 200

export const useBlueprintStore = defineStore('blueprint', () => {
  const lattice = useLatticeStore()
  const scan = useScanStore()
  /** The saved version being shown (null for a blueprint not saved yet). */
  const current = shallowRef<BlueprintRow | null>(null)
  /** The newest version of the lineage (saving must start from it). */
  const latest = shallowRef<BlueprintRow | null>(null)
  const versions = shallowRef<BlueprintVersion[]>([])
  const draft = shallowRef<DraftShape[]>([])
  const name = ref('Blueprint')
  /** Minimum spacing in nm; null = the default of two nearest-neighbour distances. */
  const minSpacing = ref<number | null>(null)
  const selected = ref(new Set<number>())
  const history = snapshotHistory(draft, HISTORY)
  const dirty = ref(false)
  let nextId = 1
  const cache = createDraftCache()

  /** The sites of the shapes on the canvas, in the scan frame (nm). */
  const sites = shallowRef<PlacedSite[]>([])
  const sitesNm = computed<[number, number][]>(() => sites.value.map(s => [s.x_nm, s.y_nm]))

  const surface = computed(() => lattice.surface)
  /** The site type the shapes snap to: the saved blueprint's, else the lattice fit's. */
  const site = computed(() => current.value?.site ?? lattice.fit?.site ?? surface.value?.defaultSite ?? '')
  const minSpacingNm = computed(() => minSpacing.value ?? (surface.value ? defaultMinSpacing(surface.value) : 0))
  const viewingOld = computed(() => !!current.value && !!latest.value && current.value.version < latest.value.version)
  /** The scan rectangle in the ideal frame (chains must stay inside, sites outside are flagged). */
  const bounds = computed<Vec2[] | undefined>(() => lattice.map && scan.meta ? scanRectInIdeal(lattice.map, scan.meta.size_x_nm, scan.meta.size_y_nm) : undefined)
  const expansion = computed<DraftExpansion | null>(() => {
    if (!surface.value || !site.value) return null
    return expandDraft(draft.value.map(d => d.shape), surface.value, site.value, { minSpacing_nm: minSpacingNm.value, bounds: bounds.value }, cache)
  })
  const problems = computed(() => (expansion.value?.perShape ?? []).flatMap((r, k) => r.error ? [{ shape: k, ...r.error }] : []))

  watch([expansion, () => lattice.map], ([e, map]) => {
    if (!e || !map) {
      sites.value = []
      return
    }
    sites.value = e.sites.map((s) => {
      const [x, y] = map.toScan([s.x_nm, s.y_nm])
      return { i: s.i, j: s.j, b: s.b, shape: s.shape, x_nm: x, y_nm: y }
    })
  }, { immediate: true })

  // Closing the tab with unsaved shapes asks first (the draft lives only in this page until saved).
  if (import.meta.client) {
    window.addEventListener('beforeunload', (e) => {
      if (dirty.value && draft.value.length) e.preventDefault()
    })
  }

  function commit(next: DraftShape[]) {
    history.commit(next)
    dirty.value = true
  }
  function add(shapes: Shape[]) {
    const made = shapes.map(shape => ({ id: nextId++, shape }))
    commit([...draft.value, ...made])
    selected.value = new Set(made.map(d => d.id))
    return made
  }
  function replace(id: number, shape: Shape, live = false) {
    const next = draft.value.map(d => d.id === id ? { id, shape } : d)
    if (live) draft.value = next
    else commit(next)
  }
  /** Replaces several shapes at once (one history entry unless live). */
  function replaceMany(updates: Map<number, Shape>, live = false) {
    const next = draft.value.map(d => updates.has(d.id) ? { id: d.id, shape: updates.get(d.id)! } : d)
    if (live) draft.value = next
    else commit(next)
  }
  /** Ends a live drag: one history entry from where it started. */
  function endDrag(before: DraftShape[]) {
    if (before === draft.value) return
    history.record(before)
    dirty.value = true
  }
  function remove(ids: Iterable<number>) {
    const drop = new Set(ids)
    if (!drop.size) return
    commit(draft.value.filter(d => !drop.has(d.id)))
    selected.value = new Set([...selected.value].filter(id => !drop.has(id)))
  }
  function undo() {
    if (history.undo()) dirty.value = true
  }
  function redo() {
    if (history.redo()) dirty.value = true
  }
  function select(ids: Iterable<number>, additive = false) {
    selected.value = new Set(additive ? [...selected.value, ...ids] : ids)
  }
  function setMinSpacing(nm: number | null) {
    minSpacing.value = nm
    dirty.value = true
  }

  /** Shows a saved version; `asDraftOf` keeps the lineage's latest as the base (restore). */
  function show(row: BlueprintRow, newest: BlueprintRow) {
    current.value = row
    latest.value = newest
    name.value = row.name
    minSpacing.value = row.min_spacing_nm
    nextId = 1
    draft.value = (row.shapes as Shape[]).map(shape => ({ id: nextId++, shape }))
    selected.value = new Set()
    history.clear()
    dirty.value = false
  }
  /** Takes an earlier version's shapes as the draft of a new version on top of the latest. */
  function restore() {
    if (!current.value || !latest.value) return
    const shapes = draft.value
    current.value = latest.value
    commit(shapes)
  }
  function clear() {
    current.value = null
    latest.value = null
    versions.value = []
    draft.value = []
    name.value = 'Blueprint'
    minSpacing.value = null
    selected.value = new Set()
    history.clear()
    dirty.value = false
  }

  async function open(id: number) {
    const res = await api<{ blueprint: BlueprintRow, versions: BlueprintVersion[] }>(`/api/blueprints/${id}`)
    versions.value = res.versions
    const newestId = res.versions[0]?.id
    const newest = newestId === res.blueprint.id || newestId === undefined ? res.blueprint : (await api<{ blueprint: BlueprintRow }>(`/api/blueprints/${newestId}`)).blueprint
    show(res.blueprint, newest)
  }
  async function loadLatest(labId: number, buildId: number) {
    const rows = await api<BlueprintRow[]>(`/api/labs/${labId}/builds/${buildId}/blueprints`)
    if (rows[0]) await open(rows[0].id)
    else clear()
  }
  async function save(labId: number, buildId: number) {
    if (!surface.value) return
    const row = await api<BlueprintRow>(`/api/labs/${labId}/builds/${buildId}/blueprints`, {
      method: 'POST',
      body: {
        name: name.value.trim() || 'Blueprint', surface: surface.value.id, site: site.value,
        shapes: draft.value.map(d => d.shape), ...(minSpacing.value !== null && { min_spacing_nm: minSpacing.value }),
        ...(latest.value && { lineage: latest.value.lineage, base_version: latest.value.version }),
        ...(scan.meta && lattice.fit && { scan_id: scan.meta.id }),
      },
    })
    current.value = row
    latest.value = row
    dirty.value = false
    versions.value = (await api<{ versions: BlueprintVersion[] }>(`/api/blueprints/${row.id}`)).versions
    return row
  }

  return {
    current, latest, versions, draft, name, minSpacing, selected, dirty, sites, sitesNm,
    surface, site, minSpacingNm, viewingOld, bounds, expansion, problems,
    canUndo: history.canUndo, canRedo: history.canRedo,
    add, replace, replaceMany, endDrag, remove, undo, redo, select, setMinSpacing, show, restore, clear, open, loadLatest, save,
  }
})
