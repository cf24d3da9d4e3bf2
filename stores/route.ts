// The route step: the saved routes of the blueprint, the one being looked at, the draft solver
// options (locks, exclusions and keep-out polygons, with undo), the solve in progress, and the
// step-through (how many moves are done, how far the current one is animated).
import { defineStore } from 'pinia'
import type { Point } from '#shared/route/types'
import type { RouteRow, RouteSummary } from '#shared/types/route'
import type { Progress } from '~/utils/sse'

export type RouteMode = 'pick' | 'lock' | 'exclude' | 'keep-out'
interface Draft { locked: Set<number>, excluded: Set<number>, keepOut: Point[][] }

export const useRouteStore = defineStore('route', () => {
  const list = shallowRef<RouteSummary[]>([])
  const current = shallowRef<RouteRow | null>(null)
  /** The blueprint version routes are listed and solved for, when the blueprint store has none. */
  const fallbackBlueprint = shallowRef<{ id: number, name: string, version: number } | null>(null)
  const fallbackFitVersion = ref<number | undefined>(undefined)

  const clearance = ref('0.5')
  const cost = ref<'distance' | 'squared'>('distance')
  // Locks and exclusions by mark id (stable while marks are edited); indices are taken at solve time.
  const draft = shallowRef<Draft>({ locked: new Set(), excluded: new Set(), keepOut: [] })
  const history = snapshotHistory(draft, 100)
  /** Corners of the keep-out polygon being drawn. */
  const drawing = shallowRef<Point[]>([])
  const mode = ref<RouteMode>('pick')

  const solving = shallowRef<Progress | null>(null)
  const problem = ref('')
  const fields = ref<Record<string, string>>({})

  const colourBy = ref<'order' | 'length'>('order')
  /** Moves done in the step-through (0…n); move `step` is the current one. */
  const step = ref(0)
  /** How far the current move is animated (0…1). */
  const phase = ref(0)
  const playing = ref(false)
  /** The current move is being animated to its end (one step, not playing through). */
  const animating = ref(false)
  const speed = ref(1)

  const moves = computed(() => current.value?.result.moves ?? [])

  function edit(next: Partial<Draft>) {
    history.commit({ ...draft.value, ...next })
  }
  function toggle(kind: 'locked' | 'excluded', markId: number) {
    const set = new Set(draft.value[kind])
    const other = new Set(draft.value[kind === 'locked' ? 'excluded' : 'locked'])
    if (set.has(markId)) set.delete(markId)
    else {
      set.add(markId)
      other.delete(markId)
    }
    edit(kind === 'locked' ? { locked: set, excluded: other } : { excluded: set, locked: other })
  }
  function addKeepOut(poly: Point[]) {
    if (poly.length >= 3) edit({ keepOut: [...draft.value.keepOut, poly] })
  }
  function removeKeepOut(index: number) {
    edit({ keepOut: draft.value.keepOut.filter((_, k) => k !== index) })
  }
  function clearDraft(what: 'locked' | 'excluded' | 'keepOut') {
    edit({ [what]: what === 'keepOut' ? [] : new Set() })
  }
  const { undo, redo } = history

  async function loadList(blueprintId: number) {
    list.value = await api<RouteSummary[]>(`/api/blueprints/${blueprintId}/routes`)
  }
  async function open(routeId: number) {
    show(await api<RouteRow>(`/api/routes/${routeId}`))
  }
  function show(row: RouteRow | null) {
    current.value = row
    step.value = 0
    phase.value = 0
    playing.value = false
    animating.value = false
  }
  async function solve(blueprintId: number, body: Record<string, unknown>) {
    if (solving.value) return
    solving.value = { fraction: 0, stage: 'sending', elapsed_ms: 0 }
    problem.value = ''
    fields.value = {}
    try {
      show(await postWithProgress<RouteRow>(`/api/blueprints/${blueprintId}/routes`, body, (p) => {
        solving.value = p
      }))
      await loadList(blueprintId)
    }
    catch (e) {
      const p = apiProblem(e)
      problem.value = p.message
      fields.value = p.fields
    }
    finally {
      solving.value = null
    }
  }
  /** Makes move `index` the current one: the moves before it done, it about to start. */
  function select(index: number) {
    if (!moves.value.length) return
    step.value = Math.max(0, Math.min(moves.value.length, index))
    phase.value = 0
    animating.value = false
    playing.value = false
  }
  function next() {
    if (step.value < moves.value.length) animating.value = true
  }
  function prev() {
    animating.value = false
    playing.value = false
    if (phase.value > 0) phase.value = 0
    else step.value = Math.max(0, step.value - 1)
  }
  function togglePlay() {
    if (playing.value) {
      playing.value = false
      return
    }
    if (step.value >= moves.value.length) step.value = 0
    playing.value = moves.value.length > 0
  }
  /** Moves the animation on by dt seconds (called every frame by the dock). */
  function advance(dt_s: number) {
    const move = moves.value[step.value]
    if (!move || (!animating.value && !playing.value)) {
      animating.value = false
      playing.value = false
      return
    }
    // Long drags take a little longer on screen, but never more than 2 s at 1×.
    const duration = Math.min(2, 0.35 + move.length_nm / 8) / speed.value
    phase.value += dt_s / duration
    if (phase.value < 1) return
    phase.value = 0
    step.value++
    if (!playing.value || step.value >= moves.value.length) {
      animating.value = false
      playing.value = false
    }
  }
  /** Takes a saved route's options as the draft; its atom indices name marks of `markIds` (its marks version). */
  function adopt(row: RouteRow, markIds: number[] | null) {
    const o = row.options
    clearance.value = String(o.clearance_nm ?? 0.5)
    cost.value = o.cost ?? 'distance'
    const ids = (list?: number[]) => new Set(markIds ? (list ?? []).map(i => markIds[i]).filter((id): id is number => id !== undefined) : [])
    edit({ locked: ids(o.locked), excluded: ids(o.excluded), keepOut: o.keep_out ?? [] })
  }
  function reset() {
    list.value = []
    show(null)
    draft.value = { locked: new Set(), excluded: new Set(), keepOut: [] }
    history.clear()
    drawing.value = []
    problem.value = ''
    fields.value = {}
  }

  return {
    list, current, fallbackBlueprint, fallbackFitVersion, clearance, cost, draft, drawing, mode, solving, problem, fields,
    colourBy, step, phase, playing, animating, speed, moves,
    canUndo: history.canUndo, canRedo: history.canRedo,
    toggle, adopt, addKeepOut, removeKeepOut, clearDraft, undo, redo, loadList, open, show, solve, select, next, prev, togglePlay, advance, reset,
  }
})
