// The as-built overlay, drawn in scan-frame nm onto any 2-D context: a ring per blueprint site
// coloured by its status, a line from an off-site site to the atom found near it, a dot per found
// atom and a ring round each extra atom. `scale` is screen px per nm, so sizes stay constant on
// screen. Used by the workspace canvas layer and by the exported picture.
import type { CheckResult } from '#shared/types/night'

export const CHECK_COLOURS = { 'placed': '#5ec48c', 'off-site': '#e8be50', 'missing': '#ec6862', 'extra': '#70b0e8', 'found': '#f4f6f8' } as const

export function drawCheckOverlay(c: CanvasRenderingContext2D, r: Pick<CheckResult, 'sites' | 'found' | 'site_status' | 'off_site' | 'extra'>, scale: number) {
  const rad = 6 / scale
  c.lineWidth = 2 / scale
  c.strokeStyle = CHECK_COLOURS['off-site']
  c.beginPath()
  for (const o of r.off_site) {
    const s = r.sites[o.site], f = r.found[o.found]
    if (!s || !f) continue
    c.moveTo(s[0], s[1])
    c.lineTo(f[0], f[1])
  }
  c.stroke()
  for (const status of ['placed', 'off-site', 'missing'] as const) {
    c.strokeStyle = CHECK_COLOURS[status]
    c.setLineDash(status === 'missing' ? [3 / scale, 2 / scale] : [])
    c.beginPath()
    r.sites.forEach((s, i) => {
      if (r.site_status[i] !== status) return
      c.moveTo(s[0] + rad, s[1])
      c.arc(s[0], s[1], rad, 0, 2 * Math.PI)
    })
    c.stroke()
  }
  c.setLineDash([])
  const offFound = new Set(r.off_site.map(o => o.found))
  c.strokeStyle = CHECK_COLOURS.extra
  c.beginPath()
  for (const j of r.extra) {
    if (offFound.has(j)) continue
    const f = r.found[j]
    if (!f) continue
    c.moveTo(f[0] + rad * 0.8, f[1])
    c.arc(f[0], f[1], rad * 0.8, 0, 2 * Math.PI)
  }
  c.stroke()
  c.fillStyle = CHECK_COLOURS.found
  c.beginPath()
  for (const f of r.found) {
    c.moveTo(f[0] + 1.8 / scale, f[1])
    c.arc(f[0], f[1], 1.8 / scale, 0, 2 * Math.PI)
  }
  c.fill()
}
