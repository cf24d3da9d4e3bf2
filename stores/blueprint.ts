// The blueprint of the build being edited: its shapes in the ideal lattice frame and the sites
// they snap to, mapped onto the current scan through the lattice fit.
// Filled by the blueprint step; read by the route and wave steps.
import { defineStore } from 'pinia'

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

export const useBlueprintStore = defineStore('blueprint', () => {
  /** The saved version being shown (null for a blueprint not saved yet). */
  const current = shallowRef<BlueprintRow | null>(null)
  /** The sites of the shapes on the canvas, in the scan frame (nm). */
  const sites = shallowRef<PlacedSite[]>([])
  const sitesNm = computed<[number, number][]>(() => sites.value.map(s => [s.x_nm, s.y_nm]))
  return { current, sites, sitesNm }
})
