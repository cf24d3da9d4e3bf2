// The canvas view: zoom and pan (screen px = world nm · scale + offset), which layers show and
// how strongly, the active tool, and the cursor read-out. Client state only.
import { defineStore } from 'pinia'

export type LayerId = 'scan' | 'marks' | 'sites' | 'blueprint' | 'route' | 'waves' | 'check'
export type ToolId = 'pan' | 'select' | 'add' | 'erase' | 'box' | 'profile' | 'place'

export interface LayerState { visible: boolean, opacity: number }

export const LAYER_LABELS: Record<LayerId, string> = {
  scan: 'Scan',
  marks: 'Marks',
  sites: 'Site grid',
  blueprint: 'Blueprint',
  route: 'Route',
  waves: 'Wave map',
  check: 'As-built check',
}

export const useViewStore = defineStore('view', () => {
  const scale = ref(20)
  const offset = ref<[number, number]>([0, 0])
  const size = ref<[number, number]>([800, 600])
  const tool = ref<ToolId>('select')
  const cursor = ref<{ x_nm: number, y_nm: number, height_nm?: number } | null>(null)
  // Bumped to ask every layer to redraw (e.g. after data changed outside Vue's reactivity).
  const revision = ref(0)
  const layers = reactive<Record<LayerId, LayerState>>({
    scan: { visible: true, opacity: 1 },
    marks: { visible: true, opacity: 1 },
    sites: { visible: true, opacity: 0.35 },
    blueprint: { visible: true, opacity: 1 },
    route: { visible: true, opacity: 1 },
    waves: { visible: false, opacity: 0.7 },
    check: { visible: true, opacity: 1 },
  })

  function toWorld(px: number, py: number): [number, number] {
    return [(px - offset.value[0]) / scale.value, (py - offset.value[1]) / scale.value]
  }
  function toScreen(x: number, y: number): [number, number] {
    return [x * scale.value + offset.value[0], y * scale.value + offset.value[1]]
  }
  /** Zoom by a factor keeping the world point under (px, py) fixed on screen. */
  function zoomAt(px: number, py: number, factor: number) {
    const next = Math.min(4000, Math.max(0.05, scale.value * factor))
    const [wx, wy] = toWorld(px, py)
    scale.value = next
    offset.value = [px - wx * next, py - wy * next]
  }
  function panBy(dx: number, dy: number) {
    offset.value = [offset.value[0] + dx, offset.value[1] + dy]
  }
  /** Fit a world rectangle into the viewport with a margin. */
  function fit(width_nm: number, height_nm: number, margin = 24) {
    const [w, h] = size.value
    const s = Math.max(0.05, Math.min((w - 2 * margin) / width_nm, (h - 2 * margin) / height_nm))
    scale.value = s
    offset.value = [(w - width_nm * s) / 2, (h - height_nm * s) / 2]
  }
  function redraw() {
    revision.value++
  }

  return { scale, offset, size, tool, cursor, layers, revision, toWorld, toScreen, zoomAt, panBy, fit, redraw }
})
