// The lattice fit of the scan being looked at: the substrate's site lattice registered to the
// scan (site (i, j, b) at origin + i·a1 + j·a2 + basis[b], nm in the scan frame).
// Filled by the lattice step; read by the blueprint, route and wave steps.
import { defineStore } from 'pinia'

export interface LatticeFitRow {
  id: number
  scan_id: number
  version: number
  surface: string
  site: string
  source: 'fit' | 'hand'
  locked: boolean
  residual_nm: number | null
  result: { a1: [number, number], a2: [number, number], origin: [number, number], basis?: [number, number][], rotation_deg: number, residual_nm?: number, outliers?: number[], residuals_nm?: number[], [k: string]: unknown }
  created_at: string
}

export const useLatticeStore = defineStore('lattice', () => {
  const fit = shallowRef<LatticeFitRow | null>(null)
  /** The registered lattice, or null before a fit exists. */
  const lattice = computed(() => fit.value
    ? { a1: fit.value.result.a1, a2: fit.value.result.a2, origin: fit.value.result.origin, ...(fit.value.result.basis && fit.value.result.basis.length > 1 ? { basis: fit.value.result.basis } : {}) }
    : null)
  function set(row: LatticeFitRow | null) {
    fit.value = row
  }
  return { fit, lattice, set }
})
