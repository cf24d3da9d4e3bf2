// Heights → RGBA pixels for a canvas: linear map of [lo, hi] onto the 256 colour-map entries
// (equal-width bins, values outside clamp to the end entries), optional inversion; non-finite
// samples become transparent. Browser-safe.
import { InputError } from '../errors'
import { lutFor, type ColormapName } from './colormap'
import { checkGrid } from './grid'
import type { GridLike } from './types'

export interface RenderOptions {
  lo: number
  hi: number
  colormap?: ColormapName
  /** Swap the ends of the colour map (high values dark). */
  invert?: boolean
}

const LITTLE_ENDIAN = new Uint8Array(Uint32Array.of(1).buffer)[0] === 1

/** Returns width·height·4 bytes (RGBA, row 0 first), ready for `new ImageData(...)`. */
export function renderRGBA(grid: GridLike, opts: RenderOptions): Uint8ClampedArray {
  checkGrid(grid)
  const { lo, hi } = opts
  if (!Number.isFinite(lo)) throw new InputError('lo', 'lo must be a finite number')
  if (!Number.isFinite(hi)) throw new InputError('hi', 'hi must be a finite number')
  if (!(hi > lo)) throw new InputError('hi', 'hi must be greater than lo')
  const lut = lutFor(opts.colormap ?? 'grey')
  // Packed 32-bit entries let the loop write one word per pixel.
  const packed = new Uint32Array(256)
  for (let i = 0; i < 256; i++) {
    const j = opts.invert ? 255 - i : i
    const r = lut[j * 3]!, g = lut[j * 3 + 1]!, b = lut[j * 3 + 2]!
    packed[i] = LITTLE_ENDIAN ? ((255 << 24) | (b << 16) | (g << 8) | r) >>> 0 : ((r << 24) | (g << 16) | (b << 8) | 255) >>> 0
  }
  const { data } = grid
  const n = data.length
  const out = new Uint8ClampedArray(n * 4)
  const words = new Uint32Array(out.buffer)
  const scale = 256 / (hi - lo)
  for (let i = 0; i < n; i++) {
    const v = data[i]!
    // v − v is 0 for every finite v and NaN for NaN and ±Infinity, which stay transparent.
    if (v - v !== 0) continue
    let k = Math.floor((v - lo) * scale)
    if (k < 0) k = 0
    else if (k > 255) k = 255
    words[i] = packed[k]!
  }
  return out
}
