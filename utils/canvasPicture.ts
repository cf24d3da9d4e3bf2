// The canvas as a PNG: the konva stage's pixels with a footer band that carries a scale bar,
// what the picture shows and the caution (the picture may travel without the move list).
import Konva from 'konva'

function wrap(c: CanvasRenderingContext2D, text: string, width: number): string[] {
  const lines: string[] = []
  let line = ''
  for (const word of text.split(' ')) {
    const next = line ? `${line} ${word}` : word
    if (line && c.measureText(next).width > width) {
      lines.push(line)
      line = word
    }
    else line = next
  }
  if (line) lines.push(line)
  return lines
}

export function canvasPicture(opts: { title: string, caution: string, scale_px_per_nm: number, pixelRatio?: number }): string | null {
  const stage = Konva.stages.find(s => s.container().isConnected) ?? Konva.stages.at(-1)
  if (!stage) return null
  const k = opts.pixelRatio ?? 2
  const img = stage.toCanvas({ pixelRatio: k })
  const bar = niceScaleBar(opts.scale_px_per_nm)
  const x = Math.max(90, bar.px + 28) * k
  const out = document.createElement('canvas')
  const c = out.getContext('2d')!
  const cautionFont = `${10 * k}px "IBM Plex Sans", sans-serif`
  c.font = cautionFont
  const lines = wrap(c, opts.caution, img.width - x - 12 * k)
  out.width = img.width
  out.height = img.height + (30 + 14 * lines.length) * k
  c.fillStyle = '#0a0d12'
  c.fillRect(0, 0, out.width, out.height)
  c.drawImage(img, 0, 0)
  const y0 = img.height
  c.fillStyle = '#dee4eb'
  c.fillRect(12 * k, y0 + 12 * k, bar.px * k, 3 * k)
  c.font = `${11 * k}px "JetBrains Mono", monospace`
  c.fillText(bar.label, 12 * k, y0 + 32 * k)
  c.font = `600 ${11 * k}px "IBM Plex Sans", sans-serif`
  c.fillText(opts.title, x, y0 + 18 * k)
  c.font = cautionFont
  c.fillStyle = '#e8be50'
  lines.forEach((l, i) => c.fillText(l, x, y0 + (34 + 14 * i) * k))
  return out.toDataURL('image/png')
}
