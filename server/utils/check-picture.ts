import { PNG } from 'pngjs'
import { percentileRange } from '#shared/scan/contrast'
import { levelLinesMedianDiff, subtractPlane } from '#shared/scan/level'
import { renderRGBA } from '#shared/scan/render'
import type { ScanRow } from './scans'

// A server-drawn overlay picture of an as-built check (for the night summary when the client did
// not send its own): the after-scan, plane- and line-levelled, in grey, enlarged to about 640 px,
// with a ring per blueprint site coloured by its status and a dot per found atom.

type Pt = [number, number]
interface CheckResult { sites: Pt[], found: Pt[], site_status: string[], extra: number[], off_site: { site: number, found: number }[] }

const COLOURS: Record<string, [number, number, number]> = { 'placed': [94, 196, 140], 'off-site': [232, 190, 80], 'missing': [236, 104, 98], 'extra': [112, 176, 232] }

function plot(img: PNG, x: number, y: number, c: [number, number, number]) {
  const xi = Math.round(x), yi = Math.round(y)
  if (xi < 0 || yi < 0 || xi >= img.width || yi >= img.height) return
  const k = (yi * img.width + xi) * 4
  img.data[k] = c[0]
  img.data[k + 1] = c[1]
  img.data[k + 2] = c[2]
  img.data[k + 3] = 255
}

function ring(img: PNG, cx: number, cy: number, r: number, c: [number, number, number], fill = false) {
  for (let dy = -Math.ceil(r) - 1; dy <= Math.ceil(r) + 1; dy++) {
    for (let dx = -Math.ceil(r) - 1; dx <= Math.ceil(r) + 1; dx++) {
      const d = Math.hypot(dx, dy)
      if (fill ? d <= r : Math.abs(d - r) <= 0.9) plot(img, cx + dx, cy + dy, c)
    }
  }
}

function line(img: PNG, a: Pt, b: Pt, c: [number, number, number]) {
  const n = Math.ceil(Math.hypot(b[0] - a[0], b[1] - a[1]))
  for (let i = 0; i <= n; i++) plot(img, a[0] + ((b[0] - a[0]) * i) / Math.max(1, n), a[1] + ((b[1] - a[1]) * i) / Math.max(1, n), c)
}

export async function drawCheckPng(scan: ScanRow, check: CheckResult): Promise<Buffer> {
  const grid = levelLinesMedianDiff(subtractPlane(await loadGrid(scan)).grid).grid
  const { lo, hi } = percentileRange(grid.data, 0.5, 99.5)
  const rgba = renderRGBA(grid, { lo, hi: hi > lo ? hi : lo + 1e-6 })
  // Whole-pixel enlargement to about 640 px (small scans), never a reduction.
  const k = Math.max(1, Math.round(640 / Math.max(grid.width, grid.height)))
  const img = new PNG({ width: grid.width * k, height: grid.height * k })
  for (let y = 0; y < img.height; y++) {
    for (let x = 0; x < img.width; x++) {
      const s = ((Math.floor(y / k) * grid.width) + Math.floor(x / k)) * 4, d = (y * img.width + x) * 4
      for (let c = 0; c < 4; c++) img.data[d + c] = rgba[s + c]!
    }
  }
  const px = (p: Pt): Pt => [(p[0] / scan.size_x_nm) * img.width, (p[1] / scan.size_y_nm) * img.height]
  const r = Math.max(3, Math.min(12, (0.25 / scan.size_x_nm) * img.width))
  for (const o of check.off_site) line(img, px(check.sites[o.site]!), px(check.found[o.found]!), COLOURS['off-site']!)
  check.sites.forEach((s, i) => ring(img, ...px(s), r, COLOURS[check.site_status[i] ?? 'missing'] ?? COLOURS.missing!))
  for (const f of check.found) ring(img, ...px(f), Math.max(1.5, r / 4), [255, 255, 255], true)
  for (const j of check.extra) ring(img, ...px(check.found[j]!), r * 0.7, COLOURS.extra!)
  return PNG.sync.write(img)
}
