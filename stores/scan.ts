// The scan the workspace is looking at: its metadata, the stored height grid, the leveled grid
// (for read-outs and profiles) and the rendered image. Processing edits save to the scan.
import { defineStore } from 'pinia'
import { decodeFloat32Grid } from '#shared/scan/gridfile'
import type { Grid } from '#shared/scan/types'
import { DEFAULT_PROCESSING, ScanProcessing } from '#shared/schemas/scan'

export interface ScanMeta {
  id: number
  sample_id: number
  build_id: number | null
  purpose: 'plan' | 'after'
  filename: string
  format: string
  width_px: number
  height_px: number
  size_x_nm: number
  size_y_nm: number
  offset_x_nm: number
  offset_y_nm: number
  rotation_deg: number
  bias_V: number | null
  setpoint_A: number | null
  taken_at: string | null
  notes: string
  processing: Partial<ScanProcessing>
  pixel_nm: [number, number]
  created_at: string
}

export const useScanStore = defineStore('scan', () => {
  const meta = shallowRef<ScanMeta | null>(null)
  const grid = shallowRef<Grid | null>(null)
  const leveled = shallowRef<Grid | null>(null)
  const rendered = shallowRef<RenderedScan | null>(null)
  const processing = ref<ScanProcessing>({ ...DEFAULT_PROCESSING })
  const loading = ref(false)
  const error = ref('')

  async function open(scan: ScanMeta) {
    meta.value = scan
    processing.value = ScanProcessing.parse(scan.processing ?? {})
    loading.value = true
    error.value = ''
    try {
      const buf = await api<ArrayBuffer>(`/api/scans/${scan.id}/grid`, { responseType: 'arrayBuffer' })
      grid.value = decodeFloat32Grid(new Uint8Array(buf))
      reprocess()
    }
    catch (e) {
      error.value = apiProblem(e).message
      grid.value = null
    }
    finally {
      loading.value = false
    }
  }
  function reprocess(levelToo = true) {
    if (!grid.value) return
    if (levelToo || !leveled.value) leveled.value = levelGrid(grid.value, processing.value)
    rendered.value = renderScan(leveled.value, processing.value)
  }
  async function setProcessing(patch: Partial<ScanProcessing>) {
    const relevel = patch.plane !== undefined || patch.lines !== undefined
    processing.value = { ...processing.value, ...patch }
    reprocess(relevel)
    if (meta.value) await api(`/api/scans/${meta.value.id}`, { method: 'PATCH', body: { processing: processing.value } })
  }
  /** Leveled height at a world point (nm), nearest pixel; undefined outside the scan. */
  function heightAt(x_nm: number, y_nm: number): number | undefined {
    const g = leveled.value
    const m = meta.value
    if (!g || !m) return undefined
    const c = Math.floor(x_nm / m.pixel_nm[0])
    const r = Math.floor(y_nm / m.pixel_nm[1])
    if (c < 0 || r < 0 || c >= g.width || r >= g.height) return undefined
    return g.data[r * g.width + c]
  }
  function close() {
    meta.value = null
    grid.value = null
    leveled.value = null
    rendered.value = null
  }
  return { meta, grid, leveled, rendered, processing, loading, error, open, reprocess, setProcessing, heightAt, close }
})
