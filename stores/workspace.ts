// The workspace page's shared state: which build is open, the step being worked on, and the
// canvas pointer handler of that step (each step's panel installs its own with useCanvasTool).
import { defineStore } from 'pinia'
import type { StepId } from '#shared/types/workspace'
import type { Role } from '#shared/roles'

export interface CanvasPointer { x: number, y: number, px: number, py: number, event: PointerEvent }
export interface CanvasTool {
  down?: (p: CanvasPointer) => void
  move?: (p: CanvasPointer) => void
  up?: (p: CanvasPointer) => void
  /** Keys handled while this tool is active; return true when the key was used. */
  key?: (e: KeyboardEvent) => boolean
}

export interface BuildInfo {
  build: { id: number, name: string, notes: string, sample_id: number, lab_id: number }
  sample: { id: number, name: string, surface: string, adsorbate: string, temperature_K: number, surface_state: { E0_eV: number, m_eff: number, source?: string } | null }
  role: Role
}

export const useWorkspaceStore = defineStore('workspace', () => {
  const info = shallowRef<BuildInfo | null>(null)
  const step = ref<StepId>('scan')
  const tool = shallowRef<CanvasTool | null>(null)
  // What the active tool is drawing right now (rubber band, measuring line), in world nm.
  const guide = shallowRef<{ box?: [number, number, number, number] | null, line?: [number, number, number, number] | null }>({})
  const canEdit = computed(() => info.value?.role === 'owner' || info.value?.role === 'member')
  return { info, step, tool, guide, canEdit }
})

/** Installs a canvas tool while the calling component is mounted. */
export function useCanvasTool(tool: CanvasTool) {
  const ws = useWorkspaceStore()
  onMounted(() => {
    ws.tool = tool
  })
  onBeforeUnmount(() => {
    if (ws.tool === tool) ws.tool = null
  })
}
