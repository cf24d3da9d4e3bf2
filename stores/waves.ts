// The wave preview: which model, its parameters (as typed, so that the server's message about a
// bad value can stand next to it), the probe point on the canvas (with undo), the measured
// spectrum, and the latest results. Client state only; the sample's surface state is saved on
// the server through the sample.
import { defineStore } from 'pinia'
import type { MeasuredSpectrum } from '#shared/waves/spectrum-csv'
import type { ColormapName } from '#shared/scan/colormap'

export type WaveModel = 'corral' | 'chain' | 'scattering'
export type Convention = 'N·a' | '(N+1)·a' | 'custom'
export type Pt = [number, number]

/** One rung of the level diagram: column (m for the corral, 0 otherwise) and label. */
export interface LadderLevel { key: string, label: string, column: number, E_eV: number, degeneracy: number }

/** Where the map image sits in the scan frame (nm): a rectangle, or a strip along a chain. */
export interface RectPlacement { kind: 'rect', extent: [number, number, number, number] }
export interface StripPlacement { kind: 'strip', start: Pt, angle_rad: number, length_nm: number, width_nm: number }
export type MapPlacement = RectPlacement | StripPlacement

export interface WaveMap {
  placement: MapPlacement
  /** the values as computed (row-major w × h), kept to recolour without asking again */
  raw: { values: number[], w: number, h: number, clearZero: boolean }
  image: HTMLCanvasElement
  lo: number
  hi: number
  unit: string
  bias_V: number
}
/** What the wave layer outlines: the hard wall, the box, the probe point (scan frame, nm). */
export interface WaveGuides {
  wall?: { center: Pt, radius_nm: number }
  box?: { start: Pt, angle_rad: number, length_nm: number, width_nm: number }
  probe?: Pt
}
export interface WaveSpectrum { E_eV: number[], ldos: number[], unit: string, at: Pt }
export interface Problem { message: string, fields: Record<string, string> }

export const useWavesStore = defineStore('waves', () => {
  const model = ref<WaveModel>('corral')
  /** the blueprint (and shapes) the model and shape were picked for */
  const pickedFor = ref('')
  /** Blueprint shape the hard-wall and box models use (null: all sites). */
  const shape = ref<number | null>(null)
  /** the sample whose surface state `surface` was started from */
  const surfaceSample = ref<number | null>(null)
  const surface = reactive({ preset: 'Cu(111)-tunnelling' as string, E0_eV: '-0.44', m_eff: '0.38', source: '' })
  const params = reactive({
    radius_nm: '', // '' = the fitted radius
    inset_nm: '0',
    convention: 'N·a' as Convention,
    L_nm: '',
    delta0: 'black' as 'black' | 'custom',
    delta0_re: '1.5708',
    delta0_im: '0',
    broadening_eV: '0.01',
    map_px: '128',
    levels_shown: '15',
    range_from: '',
    range_to: '',
  })
  const bias_V = ref(0)
  const colormap = ref<ColormapName>('kiln')
  /** the wave layer is switched on once, when the first map arrives */
  const layerShown = ref(false)

  // Probe point in the scan frame, with undo/redo (a canvas action like any other).
  const probe = ref<Pt | null>(null)
  const probeHistory = snapshotHistory(probe)
  const setProbe = (p: Pt | null) => probeHistory.commit(p)
  const { undo: undoProbe, redo: redoProbe, canUndo, canRedo } = probeHistory
  function resetProbe() {
    probeHistory.clear()
    probe.value = null
  }

  const guides = shallowRef<WaveGuides>({})
  const ladder = shallowRef<LadderLevel[]>([])
  /** levels (and orbitals, spin not counted) at or below E_F; `all`: every level asked for is */
  const belowFermi = ref<{ levels: number, orbitals: number, all: boolean } | null>(null)
  const map = shallowRef<WaveMap | null>(null)
  const spectrum = shallowRef<WaveSpectrum | null>(null)
  const warnings = reactive<Record<'levels' | 'map' | 'spectrum', string[]>>({ levels: [], map: [], spectrum: [] })
  const problems = reactive<Record<'levels' | 'map' | 'spectrum', Problem | null>>({ levels: null, map: null, spectrum: null })
  const busy = reactive({ levels: false, map: false, spectrum: false })
  const fields = computed<Record<string, string>>(() => ({ ...problems.levels?.fields, ...problems.map?.fields, ...problems.spectrum?.fields }))

  const measured = shallowRef<(MeasuredSpectrum & { name: string }) | null>(null)
  const peakOptions = reactive({ prominence_pct: '5', smooth: '1' })

  return {
    model, pickedFor, shape, surfaceSample, surface, params, bias_V, colormap, layerShown,
    probe, setProbe, undoProbe, redoProbe, canUndo, canRedo, resetProbe,
    guides, ladder, belowFermi, map, spectrum, warnings, problems, busy, fields,
    measured, peakOptions,
  }
})
