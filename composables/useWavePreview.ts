// Runs the wave preview while its panel is open: derives the geometry from the blueprint, sends
// the levels, map and spectrum requests (debounced; a newer request cancels the older one) and
// puts the results, the server's warnings and its messages about bad fields into the store.
import { findPreset, SURFACE_STATE_PRESETS } from '#shared/waves/presets'
import { findSpectrumPeaks } from '#shared/waves/peaks'
import type { LadderLevel, MapPlacement, Pt, WaveGuides } from '~/stores/waves'

type Kind = 'levels' | 'map' | 'spectrum'
interface Field1D { x_nm: number[], ldos: number[] }
interface Field2D { px: number, extent_nm: [number, number, number, number], ldos: number[] }
interface WaveResponse {
  levels?: { m?: number, n: number, E_eV: number, degeneracy?: number }[]
  L_nm?: number
  map?: Field2D
  line?: Field1D
  spectrum?: { E_eV: number[], ldos: number[] }
  warnings?: string[]
}

export const LDOS_RATIO_UNIT = 'LDOS / ρ∞'
export const LDOS_CHAIN_UNIT = 'LDOS (1/(eV·nm))'

/** The preset a sample starts from: its saved state, else its surface's tunnelling preset. */
export function surfaceStart(sample: { surface: string, surface_state: { E0_eV: number, m_eff: number, source?: string } | null }) {
  const saved = sample.surface_state
  const same = SURFACE_STATE_PRESETS.filter(p => p.surface === sample.surface)
  if (saved) {
    const match = SURFACE_STATE_PRESETS.find(p => p.E0_eV === saved.E0_eV && p.m_eff === saved.m_eff)
    return { preset: match?.id ?? 'custom', E0_eV: String(saved.E0_eV), m_eff: String(saved.m_eff), source: saved.source ?? match?.source ?? '' }
  }
  const p = same.find(q => q.method === 'tunnelling') ?? same[0] ?? SURFACE_STATE_PRESETS[0]!
  return { preset: p.id, E0_eV: String(p.E0_eV), m_eff: String(p.m_eff), source: p.source }
}

export function useWavePreview() {
  const waves = useWavesStore()
  const blueprint = useBlueprintStore()
  const ws = useWorkspaceStore()
  const view = useViewStore()

  const geometry = computed(() => waveGeometry(blueprint.current, blueprint.sites, waves.shape))
  const E0 = computed(() => waveNum(waves.surface.E0_eV))
  const mEff = computed(() => waveNum(waves.surface.m_eff))
  const preset = computed(() => {
    const p = findPreset(waves.surface.preset)
    return p && p.E0_eV === E0.value && p.m_eff === mEff.value ? p.id : undefined
  })
  const probeAt = computed<Pt | null>(() => waves.probe ?? defaultProbe(waves.model, geometry.value))
  const inputs = computed<WaveInputs | null>(() => {
    if (!probeAt.value || !geometry.value.sites.length) return null
    return { model: waves.model, E0_eV: E0.value, m_eff: mEff.value, preset: preset.value, params: waves.params, bias_V: waves.bias_V, probe: probeAt.value, geometry: geometry.value }
  })

  watch(() => ws.info?.sample.id, () => {
    const s = ws.info?.sample
    if (!s || waves.surfaceSample === s.id) return
    Object.assign(waves.surface, surfaceStart(s))
    waves.surfaceSample = s.id
  }, { immediate: true })

  watchEffect(() => {
    const g = geometry.value
    const guides: WaveGuides = {}
    if (probeAt.value) guides.probe = probeAt.value
    const Reff = waveRadius({ params: waves.params, geometry: g }) - waveNum(waves.params.inset_nm)
    if (waves.model === 'corral' && g.circle && Reff > 0) guides.wall = { center: g.circle.center, radius_nm: Reff }
    const { L } = chainBox({ params: waves.params, geometry: g })
    if (waves.model === 'chain' && g.chain && L > 0) guides.box = chainStrip(g.chain, L)
    waves.guides = guides
  })

  function applyLevels(res: WaveResponse) {
    const lv = res.levels ?? []
    waves.ladder = lv.map((l): LadderLevel => waves.model === 'corral'
      ? { key: `${l.m},${l.n}`, label: `${l.m},${l.n}`, column: l.m ?? 0, E_eV: l.E_eV, degeneracy: l.degeneracy ?? 1 }
      : { key: `${l.n}`, label: `n = ${l.n}`, column: 0, E_eV: l.E_eV, degeneracy: 1 })
    const below = lv.filter(l => l.E_eV <= 0)
    waves.belowFermi = { levels: below.length, orbitals: below.reduce((s, l) => s + (l.degeneracy ?? 1), 0), all: below.length === lv.length }
  }

  function applyMap(res: WaveResponse) {
    const g = geometry.value
    let placement: MapPlacement
    let raw: { values: number[], w: number, h: number, clearZero: boolean }
    if (waves.model === 'chain' && res.line && g.chain) {
      placement = { kind: 'strip', ...chainStrip(g.chain, res.L_nm ?? 0) }
      raw = { values: res.line.ldos, w: res.line.ldos.length, h: 1, clearZero: false }
    }
    else if (res.map) {
      const c = waves.model === 'corral' ? g.circle?.center ?? [0, 0] : [0, 0]
      const e = res.map.extent_nm
      placement = { kind: 'rect', extent: [e[0] + c[0]!, e[1] + c[0]!, e[2] + c[1]!, e[3] + c[1]!] }
      raw = { values: res.map.ldos, w: res.map.px, h: res.map.px, clearZero: waves.model === 'corral' }
    }
    else return void (waves.map = null)
    const img = waveImage(raw.values, raw.w, raw.h, waves.colormap, { clearZero: raw.clearZero })
    waves.map = { placement, raw, ...img, unit: waves.model === 'chain' ? LDOS_CHAIN_UNIT : LDOS_RATIO_UNIT, bias_V: waves.bias_V }
    if (!waves.layerShown) {
      view.layers.waves.visible = true
      waves.layerShown = true
    }
  }

  function applySpectrum(res: WaveResponse, at: Pt) {
    if (!res.spectrum) return void (waves.spectrum = null)
    waves.spectrum = { ...res.spectrum, unit: waves.model === 'chain' ? LDOS_CHAIN_UNIT : LDOS_RATIO_UNIT, at }
    if (waves.model === 'scattering') {
      // No discrete levels in this model: its resonances are the maxima of the spectrum.
      waves.ladder = findSpectrumPeaks(res.spectrum.E_eV, res.spectrum.ldos).map((p, k) => ({ key: `p${k}`, label: `peak ${k + 1}`, column: 0, E_eV: p.x, degeneracy: 1 }))
      waves.belowFermi = null
    }
  }

  function schedule(kind: Kind, build: () => WaveRequest | null, delay: number, apply: (res: WaveResponse) => void) {
    let timer: ReturnType<typeof setTimeout> | undefined
    let ctrl: AbortController | undefined
    const stop = watch(() => {
      const r = build()
      return r ? JSON.stringify(r) : ''
    }, (key) => {
      clearTimeout(timer)
      ctrl?.abort()
      if (!key) {
        waves.busy[kind] = false
        waves.problems[kind] = null
        waves.warnings[kind] = []
        if (kind === 'levels' && waves.model !== 'scattering') waves.ladder = []
        return
      }
      waves.busy[kind] = true
      timer = setTimeout(async () => {
        const req = JSON.parse(key) as WaveRequest
        const mine = (ctrl = new AbortController())
        try {
          const res = await api<WaveResponse>(req.url, { method: 'POST', body: req.body, signal: mine.signal })
          if (mine.signal.aborted) return
          waves.problems[kind] = null
          waves.warnings[kind] = res.warnings ?? []
          apply(res)
        }
        catch (e) {
          if (mine.signal.aborted) return
          waves.problems[kind] = apiProblem(e)
          waves.warnings[kind] = []
          if (kind === 'map') waves.map = null
          if (kind === 'spectrum') waves.spectrum = null
          if (kind === 'levels' || (kind === 'spectrum' && waves.model === 'scattering')) waves.ladder = []
        }
        finally {
          if (ctrl === mine) waves.busy[kind] = false
        }
      }, delay)
    }, { immediate: true })
    onBeforeUnmount(() => {
      stop()
      clearTimeout(timer)
      ctrl?.abort()
    })
  }

  schedule('levels', () => inputs.value && levelsRequest(inputs.value), 150, applyLevels)
  schedule('map', () => inputs.value && mapRequest(inputs.value), 250, applyMap)
  schedule('spectrum', () => inputs.value && spectrumRequest(inputs.value), 200, res => applySpectrum(res, probeAt.value!))

  watch(() => waves.colormap, (cm) => {
    const m = waves.map
    if (m) waves.map = { ...m, ...waveImage(m.raw.values, m.raw.w, m.raw.h, cm, { clearZero: m.raw.clearZero }) }
  })

  return { geometry, probeAt, preset, E0, mEff }
}
