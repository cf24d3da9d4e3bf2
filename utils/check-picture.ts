// The exportable as-built picture: the after-scan (levelled and coloured as saved with it) with
// the check overlay, a scale bar and a legend, rendered off-screen at a fixed size, as PNG.
import { decodeFloat32Grid } from '#shared/scan/gridfile'
import { ScanProcessing } from '#shared/schemas/scan'
import type { CheckResult } from '#shared/types/night'
import type { ScanMeta } from '~/stores/scan'

export async function renderCheckPicture(scan: ScanMeta, result: CheckResult, opts: { title?: string, px?: number, image?: HTMLCanvasElement } = {}): Promise<HTMLCanvasElement> {
  let image = opts.image
  if (!image) {
    const grid = decodeFloat32Grid(new Uint8Array(await api<ArrayBuffer>(`/api/scans/${scan.id}/grid`, { responseType: 'arrayBuffer' })))
    const processing = ScanProcessing.parse(scan.processing ?? {})
    image = renderScan(levelGrid(grid, processing), processing).canvas
  }
  // Canvas text does not trigger web-font loading by itself.
  await Promise.all([document.fonts?.load('13px "JetBrains Mono"'), document.fonts?.load('13px "IBM Plex Sans"')])
  const size = opts.px ?? 900
  const scale = size / Math.max(scan.size_x_nm, scan.size_y_nm)
  const w = Math.round(scan.size_x_nm * scale), h = Math.round(scan.size_y_nm * scale)
  const legend = 56
  const canvas = document.createElement('canvas')
  canvas.width = w
  canvas.height = h + legend
  const c = canvas.getContext('2d')!
  c.fillStyle = '#0a0d12'
  c.fillRect(0, 0, canvas.width, canvas.height)
  c.imageSmoothingEnabled = false
  c.drawImage(image, 0, 0, w, h)
  c.save()
  c.scale(scale, scale)
  drawCheckOverlay(c, result, scale)
  c.restore()
  const bar = niceScaleBar(scale, 140)
  c.fillStyle = '#f4f6f8'
  c.fillRect(16, h - 22, bar.px, 4)
  c.font = '13px "JetBrains Mono", monospace'
  c.fillText(bar.label, 16, h - 30)
  const counts = { 'placed': result.placed.length, 'off-site': result.off_site.length, 'missing': result.missing.length - result.off_site.length, 'extra': result.extra.length - result.off_site.length }
  let x = 16
  c.font = '13px "IBM Plex Sans", sans-serif'
  for (const [k, n] of Object.entries(counts) as [keyof typeof counts, number][]) {
    c.strokeStyle = CHECK_COLOURS[k]
    c.lineWidth = 2
    c.beginPath()
    c.arc(x + 6, h + 20, 6, 0, 2 * Math.PI)
    c.stroke()
    c.fillStyle = '#dee4eb'
    const label = `${k} ${n}`
    c.fillText(label, x + 18, h + 25)
    x += 30 + c.measureText(label).width
  }
  c.fillText(`fidelity ${(result.fidelity * 100).toFixed(1)} % · RMS ${result.rms_nm === null ? '—' : `${result.rms_nm.toFixed(3)} nm`} · tolerance ${result.tolerance_nm} nm`, 16, h + 46)
  if (opts.title) {
    c.textAlign = 'right'
    c.fillText(opts.title, w - 16, h + 46)
  }
  return canvas
}

export function downloadCanvas(canvas: HTMLCanvasElement, filename: string) {
  const a = document.createElement('a')
  a.href = canvas.toDataURL('image/png')
  a.download = filename
  a.click()
}
