// Shape checks and pixel-size handling shared by the grid functions. Pixel (c, r) has its centre
// at ((c + 0.5)·px, (r + 0.5)·py) nm, row 0 at the top.
import { InputError } from '../errors'
import type { GridLike, PixelSize } from './types'

export const MAX_SIDE = 8192
/** Decoded sample bytes accepted at most: one 8192² grid of 32-bit values (268 MB). */
export const MAX_DECODED_BYTES = 4 * MAX_SIDE * MAX_SIDE

export function checkGrid(grid: GridLike, field = 'data'): void {
  const { width, height, data } = grid
  if (!Number.isInteger(width) || width < 1) throw new InputError('width', 'width must be a whole number ≥ 1')
  if (!Number.isInteger(height) || height < 1) throw new InputError('height', 'height must be a whole number ≥ 1')
  if (data.length !== width * height) {
    throw new InputError(field, `${field} holds ${data.length} values but width × height = ${width} × ${height} = ${width * height}`)
  }
}

/** Index of the first NaN or ±Infinity in data, or −1. */
export function findNonFinite(data: ArrayLike<number>): number {
  for (let i = 0; i < data.length; i++) if (!Number.isFinite(data[i]!)) return i
  return -1
}

/** Returns [px, py] in nm, checking that both are finite and positive. */
export function pixelPair(pixel_nm: PixelSize, field = 'pixel_nm'): [number, number] {
  const pair: [number, number] = typeof pixel_nm === 'number' ? [pixel_nm, pixel_nm] : [pixel_nm[0], pixel_nm[1]]
  for (let i = 0; i < 2; i++) {
    const v = pair[i]!
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
      throw new InputError(typeof pixel_nm === 'number' ? field : `${field}[${i}]`, 'pixel size must be a finite number of nm greater than 0')
    }
  }
  return pair
}

/**
 * Rejects before decoding an image whose samples would exceed MAX_DECODED_BYTES (e.g. 16-bit RGBA
 * at 8192²), so a small compressed file cannot make the server allocate gigabytes.
 */
export function checkDecodedBytes(name: string, width: number, height: number, bytesPerPixel: number): void {
  if (width * height * bytesPerPixel > MAX_DECODED_BYTES) {
    throw new InputError('file', `${name} is too large to decode: ${width} × ${height} pixels of ${bytesPerPixel} bytes exceed ${MAX_DECODED_BYTES / 2 ** 20} MiB; save it as one grey channel`)
  }
}

/** Rejects an image header of zero size or with a side over maxSide, before any pixel is allocated. */
export function checkImageSize(name: string, width: number, height: number, maxSide: number): void {
  if (width === 0 || height === 0) throw new InputError('file', `${name} has zero size (${width} × ${height} pixels)`)
  if (width > maxSide || height > maxSide) {
    throw new InputError('file', `${name} is ${width} × ${height} pixels; the largest accepted is ${maxSide} × ${maxSide}`)
  }
}
