// The blueprint editor's pointer and keyboard handling on the canvas. Pointer positions arrive in
// the scan frame and are taken into the ideal lattice frame through the fit, where shapes live.
// Every finished gesture is one undo step; drags update live and commit once at the end.
import { siteContext } from '#shared/blueprint/context'
import { shapeProblem } from '#shared/blueprint/draft'
import { chainToward, dragHandle, moveByLattice, pivotSite, shapeHandles, type Handle } from '#shared/blueprint/handles'
import type { Shape } from '#shared/blueprint/schema'
import { transformShape } from '#shared/blueprint/transform'
import { isInputError } from '#shared/errors'
import { nearestSite } from '#shared/lattice/lattice'
import type { Vec2 } from '#shared/lattice/vec'
import type { CanvasPointer } from '~/stores/workspace'
import type { DraftShape } from '~/stores/blueprint'
import { BLUEPRINT_TOOLS, type BlueprintToolId } from '~/stores/blueprintTool'

type Gesture
  = | { kind: 'create', from: Vec2, fromPx: [number, number], site: [number, number, number] }
    | { kind: 'handle', id: number, handle: Handle, original: Shape, before: DraftShape[] }
    | { kind: 'move', from: Vec2, originals: Map<number, Shape>, before: DraftShape[] }
    | { kind: 'box', box: [number, number, number, number] }

const HIT_PX = 9

export function useBlueprintCanvasTool(editable: Ref<boolean>) {
  const bp = useBlueprintStore()
  const t = useBlueprintToolStore()
  const lat = useLatticeStore()
  const view = useViewStore()
  const ws = useWorkspaceStore()
  const ctx = computed(() => bp.surface && bp.site ? siteContext(bp.surface, bp.site) : null)
  let g: Gesture | null = null

  const ideal = (p: CanvasPointer): Vec2 => lat.map!.toIdeal([p.x, p.y])
  const opts = () => ({ minSpacing_nm: bp.minSpacingNm, bounds: bp.bounds })
  const problem = (s: Shape) => shapeProblem(s, bp.surface!, bp.site, opts())
  const px = (a: [number, number], b: [number, number]) => Math.hypot(a[0] - b[0], a[1] - b[1]) * view.scale

  function hitHandle(p: CanvasPointer): { id: number, handle: Handle } | null {
    for (const d of bp.draft) {
      if (!bp.selected.has(d.id)) continue
      for (const h of shapeHandles(d.shape, ctx.value!)) if (px(lat.map!.toScan(h.p), [p.x, p.y]) <= HIT_PX) return { id: d.id, handle: h }
    }
    return null
  }
  function hitShape(p: CanvasPointer): number | null {
    let best: number | null = null, bestD = HIT_PX
    for (const s of bp.sites) {
      const d = px([s.x_nm, s.y_nm], [p.x, p.y])
      if (d <= bestD) {
        bestD = d
        best = bp.draft[s.shape]?.id ?? null
      }
    }
    return best
  }
  function ringRadius(r: number, n: number) {
    // Smallest radius holding n atoms at the minimum spacing: chord 2R·sin(π/n) ≥ s.
    return Math.max(r, bp.minSpacingNm / (2 * Math.sin(Math.PI / n)) * (1 + 1e-9))
  }
  function candidate(from: Vec2, site: [number, number, number], p: Vec2, dragged: boolean): Shape | null {
    const d = t.defaults
    const r = Math.hypot(p[0] - from[0], p[1] - from[1])
    const ang = Math.atan2(p[1] - from[1], p[0] - from[0]) * 180 / Math.PI
    if (t.tool === 'ring') return { type: 'ring', center: from, n: d.ring_n, radius_nm: ringRadius(dragged ? r : 0, d.ring_n), phase_deg: dragged ? ang : 0 }
    if (t.tool === 'ellipse') {
      const a = Math.max(r, 4 * bp.minSpacingNm)
      return { type: 'ellipse', center: from, semi_a_nm: a, semi_b_nm: a * d.ellipse_ratio, angle_deg: dragged ? ang : 0, n: d.ellipse_n }
    }
    if (t.tool === 'chain') {
      const c = chainToward(ctx.value!, site, p, d.chain_step)
      // A chain stops at the edge of the scan rather than leaving it.
      while (c.count > 1 && problem(c)?.field === 'count') c.count--
      return c
    }
    if (t.tool === 'patch' && dragged) {
      const q0 = lat.map!.toScan(from), q1 = lat.map!.toScan(p)
      const region = ([[q0[0], q0[1]], [q1[0], q0[1]], [q1[0], q1[1]], [q0[0], q1[1]]] as Vec2[]).map(lat.map!.toIdeal)
      return { type: 'patch', kind: d.patch_kind, spacing: d.patch_spacing, region }
    }
    return null
  }
  function finishOutline() {
    if (t.pending.length >= 3) create({ type: 'polygon', vertices: t.pending, spacing_steps: t.defaults.polygon_spacing })
    t.pending = []
  }
  function create(s: Shape) {
    const why = problem(s)
    if (why) {
      t.message = `Not drawn: ${why.message}`
      return
    }
    t.message = ''
    bp.add([s])
  }
  function toggleSite(p: Vec2) {
    const s = nearestSite(ctx.value!.lattice, p)
    const key: [number, number, number] = [s.i, s.j, s.b]
    const singles = [...bp.draft].reverse().find(d => d.shape.type === 'sites')
    if (!singles || singles.shape.type !== 'sites') return create({ type: 'sites', sites: [key] })
    const list = singles.shape.sites
    const at = list.findIndex(x => x[0] === s.i && x[1] === s.j && (x[2] ?? 0) === s.b)
    if (at < 0) return bp.replace(singles.id, { type: 'sites', sites: [...list, key] })
    if (list.length === 1) bp.remove([singles.id])
    else bp.replace(singles.id, { type: 'sites', sites: list.filter((_, k) => k !== at) })
  }

  function transformSelection(fn: (s: Shape) => Shape) {
    const updates = new Map<number, Shape>()
    try {
      for (const d of bp.draft) if (bp.selected.has(d.id)) updates.set(d.id, fn(d.shape))
    }
    catch (e) {
      if (!isInputError(e)) throw e
      t.message = e.message
      return
    }
    if (updates.size) bp.replaceMany(updates)
  }
  function rotateSelection(steps: number) {
    const chosen = new Set(bp.draft.flatMap((d, k) => bp.selected.has(d.id) ? [k] : []))
    const pts = (bp.expansion?.sites ?? []).filter(s => chosen.has(s.shape))
    if (!pts.length) return
    const c: Vec2 = [pts.reduce((a, s) => a + s.x_nm, 0) / pts.length, pts.reduce((a, s) => a + s.y_nm, 0) / pts.length]
    const about = pivotSite(ctx.value!, c)
    transformSelection(s => transformShape(s, bp.surface!, bp.site, { rotateBy: steps, about }))
  }
  function paste() {
    if (!t.clipboard.length || !bp.surface) return
    const shifted = t.clipboard.map(s => transformShape(s, bp.surface!, bp.site, { translateBy: [1, 0] }))
    t.clipboard = shifted
    bp.add(shifted)
  }

  useCanvasTool({
    down(p) {
      if (!lat.map || !ctx.value) return
      const q = ideal(p)
      const canEdit = editable.value
      if (t.tool === 'select' || !canEdit) {
        const h = canEdit ? hitHandle(p) : null
        if (h && h.handle.kind !== 'move') {
          g = { kind: 'handle', id: h.id, handle: h.handle, original: bp.draft.find(d => d.id === h.id)!.shape, before: bp.draft }
          return
        }
        const id = h?.id ?? hitShape(p)
        if (id !== null) {
          if (p.event.shiftKey) bp.select([id], true)
          else if (!bp.selected.has(id)) bp.select([id])
          if (canEdit) g = { kind: 'move', from: q, before: bp.draft, originals: new Map(bp.draft.filter(d => bp.selected.has(d.id)).map(d => [d.id, d.shape])) }
          return
        }
        g = { kind: 'box', box: [p.x, p.y, p.x, p.y] }
        ws.guide = { box: g.box }
        return
      }
      if (t.tool === 'sites') return toggleSite(q)
      if (t.tool === 'polygon') {
        const first = t.pending[0]
        if (first && t.pending.length >= 3 && px(lat.map.toScan(first), [p.x, p.y]) <= HIT_PX) return finishOutline()
        t.pending = [...t.pending, q]
        return
      }
      const s = nearestSite(ctx.value.lattice, q)
      const snapped: Vec2 = p.event.altKey || t.tool === 'patch' ? q : [s.x, s.y]
      g = { kind: 'create', from: snapped, fromPx: [p.px, p.py], site: [s.i, s.j, s.b] }
      t.preview = candidate(snapped, g.site, snapped, false)
    },
    move(p) {
      if (!lat.map) return
      const q = ideal(p)
      t.cursor = t.tool === 'polygon' && t.pending.length ? q : null
      if (!g) return
      if (g.kind === 'create') {
        const dragged = Math.hypot(p.px - g.fromPx[0], p.py - g.fromPx[1]) > 4
        t.preview = candidate(g.from, g.site, q, dragged)
      }
      else if (g.kind === 'handle') {
        let next = dragHandle(g.original, g.handle, q, ctx.value!)
        // A ring's radius stops at the smallest that holds its atoms, rather than refusing the drag.
        if (next.type === 'ring') next = { ...next, radius_nm: ringRadius(next.radius_nm, next.n) }
        if (!problem(next)) bp.replace(g.id, next, true)
      }
      else if (g.kind === 'move') {
        const delta: Vec2 = [q[0] - g.from[0], q[1] - g.from[1]]
        const updates = new Map<number, Shape>()
        for (const [id, s] of g.originals) updates.set(id, moveByLattice(s, delta, ctx.value!))
        bp.replaceMany(updates, true)
      }
      else {
        g.box = [g.box[0], g.box[1], p.x, p.y]
        ws.guide = { box: g.box }
      }
    },
    up(p) {
      const done = g
      g = null
      if (!done) return
      if (done.kind === 'create') {
        const shape = t.preview
        t.preview = null
        if (shape) create(shape)
      }
      else if (done.kind === 'handle' || done.kind === 'move') bp.endDrag(done.before)
      else {
        ws.guide = {}
        const [x0, y0, x1, y1] = done.box
        if (Math.hypot(x1 - x0, y1 - y0) * view.scale < HIT_PX) return bp.select([], p.event.shiftKey)
        const inside = new Set<number>()
        for (const s of bp.sites) {
          if (s.x_nm >= Math.min(x0, x1) && s.x_nm <= Math.max(x0, x1) && s.y_nm >= Math.min(y0, y1) && s.y_nm <= Math.max(y0, y1)) {
            const id = bp.draft[s.shape]?.id
            if (id !== undefined) inside.add(id)
          }
        }
        bp.select(inside, p.event.shiftKey)
      }
    },
    key(e) {
      const k = e.key.toLowerCase()
      const mod = e.ctrlKey || e.metaKey
      const canEdit = editable.value
      if (mod && k === 'z' && canEdit) {
        if (e.shiftKey) bp.redo()
        else bp.undo()
        return true
      }
      if (mod && k === 'y' && canEdit) return bp.redo(), true
      if (mod && k === 'c') {
        t.clipboard = bp.draft.filter(d => bp.selected.has(d.id)).map(d => d.shape)
        return t.clipboard.length > 0
      }
      if (mod && k === 'v' && canEdit) return paste(), true
      if (mod && k === 'a') return bp.select(bp.draft.map(d => d.id)), true
      if (mod || e.altKey) return false
      if (k === 'escape') {
        t.pending = []
        t.preview = null
        g = null
        bp.select([])
        return true
      }
      if (k === 'enter' && t.pending.length) return finishOutline(), true
      if (!canEdit) return false
      if (k === 'r' && bp.selected.size) return rotateSelection(e.shiftKey ? -1 : 1), true
      if ((k === 'delete' || k === 'backspace') && bp.selected.size) return bp.remove(bp.selected), true
      const tool = BLUEPRINT_TOOLS.find(b => b.key.toLowerCase() === k)
      if (tool) return setTool(tool.id), true
      return false
    },
  })

  function setTool(id: BlueprintToolId) {
    t.tool = id
    t.pending = []
    t.preview = null
    view.tool = id === 'select' ? 'select' : 'place'
  }
  onMounted(() => setTool(t.tool))
  onBeforeUnmount(() => {
    t.pending = []
    t.preview = null
    ws.guide = {}
  })
  function copy() {
    t.clipboard = bp.draft.filter(d => bp.selected.has(d.id)).map(d => d.shape)
  }
  return { setTool, rotateSelection, paste, copy }
}
