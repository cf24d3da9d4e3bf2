// The lattice fit of the scan being looked at: the substrate's site lattice registered to the
// scan (site (i, j, b) at origin + i·a1 + j·a2 + basis[b], nm in the scan frame).
// Filled by the lattice step; read by the blueprint, route and wave steps.
import { defineStore } from 'pinia'
import { frameMap, siteLatticeThrough, type FrameMap } from '#shared/blueprint/frame-map'
import { siteSetGeometry } from '#shared/lattice/cell'
import { type Lattice, nearestSites } from '#shared/lattice/lattice'
import { type Surface, getSurface } from '#shared/lattice/surfaces'
import { rotateAbout, type Vec2 } from '#shared/lattice/vec'

export interface LatticeFitRow {
  id: number
  scan_id: number
  version: number
  surface: string
  site: string
  source: 'fit' | 'hand'
  locked: boolean
  residual_nm: number | null
  result: { a1: [number, number], a2: [number, number], origin: [number, number], basis?: [number, number][], rotation_deg: number, residual_nm?: number | null, outliers?: number[], residuals_nm?: number[], [k: string]: unknown }
  created_at: string
  author?: string
}

const HISTORY = 100

export const useLatticeStore = defineStore('lattice', () => {
  const ws = useWorkspaceStore()
  const marks = useMarksStore()
  const fit = shallowRef<LatticeFitRow | null>(null)
  const versions = shallowRef<LatticeFitRow[]>([])
  const scanId = ref<number | null>(null)
  /** Site type for the next fit or placement (the saved fit's type until changed). */
  const siteChoice = ref('')
  /** A lattice being placed by hand (scan frame), or null. */
  const hand = shallowRef<Lattice | null>(null)
  const handHistory = snapshotHistory(hand, HISTORY)

  /** The registered lattice, or null before a fit exists. */
  const lattice = computed(() => fit.value
    ? { a1: fit.value.result.a1, a2: fit.value.result.a2, origin: fit.value.result.origin, ...(fit.value.result.basis && fit.value.result.basis.length > 1 ? { basis: fit.value.result.basis } : {}) }
    : null)
  /** The sample's surface from the library; null for a custom or unknown surface. */
  const surface = computed<Surface | null>(() => {
    const id = ws.info?.sample.surface
    if (!id) return null
    try {
      return getSurface(id)
    }
    catch {
      return null
    }
  })
  const site = computed(() => siteChoice.value || fit.value?.site || surface.value?.defaultSite || '')
  /** Ideal frame ↔ scan through the saved fit. */
  const map = computed<FrameMap | null>(() => {
    if (!fit.value || !surface.value) return null
    try {
      return frameMap(fit.value.result, surface.value, fit.value.site)
    }
    catch {
      return null
    }
  })
  /** What the site grid shows: the hand placement, else the fit carried to the chosen site type. */
  const shown = computed<Lattice | null>(() => {
    if (hand.value) return hand.value
    if (!map.value || !surface.value) return null
    if (site.value === fit.value?.site) return lattice.value
    return siteLatticeThrough(map.value, surface.value, site.value)
  })
  const minSeparation_nm = computed(() => shown.value ? siteSetGeometry(shown.value).minSeparation_nm : 0)
  /** Each mark's distance to its nearest site of the shown lattice, and those beyond the fit's threshold. */
  const snap = computed(() => {
    const lat = shown.value
    const list = marks.marks
    if (!lat || !list.length) return null
    const xy = new Float64Array(list.length * 2)
    list.forEach((m, k) => {
      xy[2 * k] = m.x_nm
      xy[2 * k + 1] = m.y_nm
    })
    const near = nearestSites(lat, xy)
    const saved = fit.value?.result.threshold_nm
    const threshold_nm = typeof saved === 'number' ? saved : 0.3 * minSeparation_nm.value
    const off: number[] = []
    let ss = 0
    near.distance.forEach((d, k) => {
      if (d > threshold_nm) off.push(k)
      else ss += d * d
    })
    const on = list.length - off.length
    return { distance: near.distance, siteX: near.x, siteY: near.y, threshold_nm, off, rms_nm: on ? Math.sqrt(ss / on) : 0 }
  })

  async function load(id: number) {
    scanId.value = id
    cancelHand()
    const rows = await api<LatticeFitRow[]>(`/api/scans/${id}/lattice-fits`)
    if (scanId.value !== id) return
    versions.value = rows
    fit.value = rows[0] ?? null
    siteChoice.value = ''
  }
  function saved(row: LatticeFitRow) {
    fit.value = row
    versions.value = [row, ...versions.value.filter(v => v.id !== row.id)]
    siteChoice.value = ''
  }
  async function save(body: Record<string, unknown>) {
    if (!scanId.value) return
    saved(await api<LatticeFitRow>(`/api/scans/${scanId.value}/lattice-fit`, { method: 'POST', body }))
  }

  function startHand(initial: Lattice) {
    hand.value = initial
    handHistory.clear()
  }
  /** Sets the placement; `live` skips the history (during a drag; end it with endHandDrag). */
  function setHand(next: Lattice, live = false) {
    if (!hand.value) return
    if (!live) handHistory.record()
    hand.value = next
  }
  function endHandDrag(before: Lattice) {
    if (before === hand.value) return
    handHistory.record(before)
  }
  function undoHand() {
    if (hand.value) handHistory.undo()
  }
  function redoHand() {
    if (hand.value) handHistory.redo()
  }
  function cancelHand() {
    hand.value = null
  }
  function reset() {
    scanId.value = null
    fit.value = null
    versions.value = []
    hand.value = null
    siteChoice.value = ''
  }
  function set(row: LatticeFitRow | null) {
    fit.value = row
  }
  return {
    fit, versions, scanId, siteChoice, hand, lattice, surface, site, map, shown, minSeparation_nm, snap,
    canUndoHand: handHistory.canUndo, canRedoHand: handHistory.canRedo,
    load, save, saved, set, reset, startHand, setHand, endHandDrag, undoHand, redoHand, cancelHand,
  }
})

/** A lattice turned by `deg` about its origin (the cell, its basis and any drift correction turn together). */
export function rotateLattice(lat: Lattice, deg: number): Lattice {
  const o = lat.origin
  const turn = (v: Vec2): Vec2 => rotateAbout(v, [0, 0], deg)
  return { a1: turn(lat.a1), a2: turn(lat.a2), origin: [o[0], o[1]], ...(lat.basis ? { basis: lat.basis.map(turn) } : {}) }
}
