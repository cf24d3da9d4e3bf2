// The blueprint editor's canvas state: the active drawing tool, the defaults new shapes get, the
// shape being drawn right now, the clipboard, and a comparison of two saved versions.
import { defineStore } from 'pinia'
import type { PatchKind, Shape } from '#shared/blueprint/schema'
import type { Vec2 } from '#shared/lattice/vec'

export type BlueprintToolId = 'select' | 'ring' | 'ellipse' | 'chain' | 'polygon' | 'patch' | 'sites'

export const BLUEPRINT_TOOLS: { id: BlueprintToolId, label: string, key: string, hint: string }[] = [
  { id: 'select', label: 'Pick', key: 'V', hint: 'click a shape, Shift adds, drag moves by lattice vectors, drag on empty canvas box-selects' },
  { id: 'ring', label: 'Ring', key: 'O', hint: 'press at the centre (snaps to a site, Alt: free), drag out the radius' },
  { id: 'ellipse', label: 'Ellipse', key: 'E', hint: 'press at the centre, drag out the long semi-axis and its angle' },
  { id: 'chain', label: 'Chain', key: 'C', hint: 'press on the first site, drag along a drag direction' },
  { id: 'polygon', label: 'Outline', key: 'P', hint: 'click the corners; click the first corner or press Enter to close' },
  { id: 'patch', label: 'Patch', key: 'T', hint: 'drag a rectangle; the artificial lattice fills it' },
  { id: 'sites', label: 'Sites', key: 'S', hint: 'click a site to add it, click again to remove it' },
]

export interface VersionDiff { a: number, b: number, added: Vec2[], removed: Vec2[], kept: number }

export const useBlueprintToolStore = defineStore('blueprintTool', () => {
  const tool = ref<BlueprintToolId>('select')
  const defaults = reactive({ ring_n: 12, ellipse_n: 16, ellipse_ratio: 0.6, chain_step: 2, polygon_spacing: 2, patch_kind: 'triangular' as PatchKind, patch_spacing: 2 })
  /** The shape being drawn (ideal frame), shown dashed until the gesture ends. */
  const preview = shallowRef<Shape | null>(null)
  /** Corners of an outline being clicked (ideal frame) and where the pointer is. */
  const pending = shallowRef<Vec2[]>([])
  const cursor = shallowRef<Vec2 | null>(null)
  const clipboard = shallowRef<Shape[]>([])
  const compare = shallowRef<VersionDiff | null>(null)
  /** The last thing a gesture or key could not do, shown in the panel. */
  const message = ref('')
  function reset() {
    preview.value = null
    pending.value = []
    compare.value = null
    message.value = ''
  }
  return { tool, defaults, preview, pending, cursor, clipboard, compare, message, reset }
})
