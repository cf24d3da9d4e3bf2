// The canvas tool of the route step. Pick (V): click a path to make its move the current one.
// Lock (L) / exclude (X): click marks. Keep-out (K): click corners, click the first corner or
// press Enter to close, Backspace drops the last corner, Esc cancels. ← / → step through the
// moves, P plays, Home / End jump; Ctrl+Z / Ctrl+Shift+Z undo and redo option edits.
import type { RouteMode } from '~/stores/route'

export function useRouteCanvasTool(editable: Ref<boolean>) {
  const route = useRouteStore()
  const marks = useMarksStore()
  const view = useViewStore()
  const hit = () => 8 / view.scale

  watch(() => route.mode, (m) => {
    view.tool = m === 'pick' ? 'select' : 'place'
  }, { immediate: true })
  watch(editable, (can) => {
    if (!can) route.mode = 'pick'
  }, { immediate: true })

  function closePolygon() {
    if (route.drawing.length >= 3) route.addKeepOut(route.drawing)
    route.drawing = []
  }

  useCanvasTool({
    down(p) {
      const mode = route.mode
      if (mode === 'pick') {
        const k = moveNear(route.moves, p.x, p.y, hit())
        if (k >= 0) route.select(k)
        return
      }
      if (!editable.value) return
      if (mode === 'lock' || mode === 'exclude') {
        const m = marks.nearest(p.x, p.y, hit())
        if (m) route.toggle(mode === 'lock' ? 'locked' : 'excluded', m.id)
        return
      }
      const first = route.drawing[0]
      if (first && route.drawing.length >= 3 && Math.hypot(p.x - first[0], p.y - first[1]) <= hit()) closePolygon()
      else route.drawing = [...route.drawing, [p.x, p.y]]
    },
    key(e) {
      const k = e.key.toLowerCase()
      if ((e.ctrlKey || e.metaKey) && k === 'z') {
        if (!editable.value) return false
        if (e.shiftKey) route.redo()
        else route.undo()
        return true
      }
      if (e.ctrlKey || e.metaKey || e.altKey) return false
      if (route.drawing.length) {
        if (k === 'enter') closePolygon()
        else if (k === 'escape') route.drawing = []
        else if (k === 'backspace') route.drawing = route.drawing.slice(0, -1)
        else return false
        return true
      }
      const modes: Record<string, RouteMode> = { v: 'pick', l: 'lock', x: 'exclude', k: 'keep-out' }
      const mode = modes[k]
      if (mode && (mode === 'pick' || editable.value)) route.mode = mode
      else if (k === 'arrowright') route.next()
      else if (k === 'arrowleft') route.prev()
      else if (k === 'p') route.togglePlay()
      else if (k === 'home') route.select(0)
      else if (k === 'end') route.select(route.moves.length)
      else return false
      return true
    },
  })
  onBeforeUnmount(() => {
    route.drawing = []
  })
}
