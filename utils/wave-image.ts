// An LDOS grid as a colour image through one of our own colour maps. The scale runs from the
// grid's minimum to its 99.5th percentile, so that the logarithmic peak of the point-scatterer
// model right at an adatom does not wash out the standing waves.
import { lutFor, type ColormapName } from '#shared/scan/colormap'

export function waveScale(values: ArrayLike<number>): [number, number] {
  const sorted = Float64Array.from(values).sort()
  const lo = sorted[0] ?? 0
  const hi = sorted[Math.min(sorted.length - 1, Math.floor(0.995 * (sorted.length - 1)))] ?? 1
  return [lo, hi > lo ? hi : lo + 1]
}

/** w × h row-major values → a canvas (row 0 at the top), with the scale used; `clearZero` leaves
 * exact zeros transparent. */
export function waveImage(values: ArrayLike<number>, w: number, h: number, colormap: ColormapName, opts: { clearZero?: boolean } = {}): { image: HTMLCanvasElement, lo: number, hi: number } {
  const [lo, hi] = waveScale(values)
  const lut = lutFor(colormap)
  const canvas = document.createElement('canvas')
  canvas.width = w
  canvas.height = h
  const ctx = canvas.getContext('2d')!
  const img = ctx.createImageData(w, h)
  const k = 255 / (hi - lo)
  for (let i = 0; i < w * h; i++) {
    const t = Math.max(0, Math.min(255, Math.round((values[i]! - lo) * k)))
    img.data[4 * i] = lut[3 * t]!
    img.data[4 * i + 1] = lut[3 * t + 1]!
    img.data[4 * i + 2] = lut[3 * t + 2]!
    // Outside a hard wall the model has no states: left clear so the scan shows there.
    img.data[4 * i + 3] = opts.clearZero && values[i] === 0 ? 0 : 255
  }
  ctx.putImageData(img, 0, 0)
  return { image: canvas, lo, hi }
}

/** CSS gradient of a colour map, low to high (left to right). */
export function waveGradient(colormap: ColormapName, stops = 16): string {
  const lut = lutFor(colormap)
  const parts: string[] = []
  for (let s = 0; s < stops; s++) {
    const t = Math.round((255 * s) / (stops - 1))
    parts.push(`rgb(${lut[3 * t]}, ${lut[3 * t + 1]}, ${lut[3 * t + 2]}) ${((100 * s) / (stops - 1)).toFixed(1)}%`)
  }
  return `linear-gradient(to right, ${parts.join(', ')})`
}
