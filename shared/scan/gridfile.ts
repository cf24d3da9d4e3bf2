// Tessera's own storage layout for parsed grids, for fast reloads: the ASCII magic "TSG1", width
// and height as uint32 little-endian, then width·height float32 little-endian samples, row 0
// first. 12 header bytes keep the samples 4-byte aligned. Browser-safe.
import { InputError } from '../errors'
import { checkGrid, MAX_SIDE } from './grid'
import type { Grid, GridLike } from './types'

const MAGIC = [0x54, 0x53, 0x47, 0x31] // "TSG1"
const HEADER = 12
const LITTLE_ENDIAN = new Uint8Array(Uint32Array.of(1).buffer)[0] === 1

export function encodeFloat32Grid(grid: GridLike): Uint8Array {
  checkGrid(grid)
  const { width, height, data } = grid
  const out = new Uint8Array(HEADER + 4 * data.length)
  out.set(MAGIC, 0)
  const dv = new DataView(out.buffer)
  dv.setUint32(4, width, true)
  dv.setUint32(8, height, true)
  if (LITTLE_ENDIAN) new Float32Array(out.buffer, HEADER, data.length).set(data)
  else for (let i = 0; i < data.length; i++) dv.setFloat32(HEADER + 4 * i, data[i]!, true)
  return out
}

export function decodeFloat32Grid(bytes: Uint8Array): Grid {
  if (bytes.length < HEADER || !MAGIC.every((b, i) => bytes[i] === b)) throw new InputError('file', 'not a stored Tessera grid (missing TSG1 header)')
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const width = dv.getUint32(4, true)
  const height = dv.getUint32(8, true)
  if (width < 1 || height < 1 || width > MAX_SIDE || height > MAX_SIDE) throw new InputError('file', `stored grid has an invalid size ${width} × ${height}`)
  const n = width * height
  if (bytes.length !== HEADER + 4 * n) throw new InputError('file', `stored grid is ${bytes.length} bytes; ${width} × ${height} needs ${HEADER + 4 * n}`)
  const data = new Float32Array(n)
  // A copy, aligned and owned by the caller, whatever buffer the bytes came in.
  if (LITTLE_ENDIAN) new Uint8Array(data.buffer).set(bytes.subarray(HEADER))
  else for (let i = 0; i < n; i++) data[i] = dv.getFloat32(HEADER + 4 * i, true)
  return { width, height, data }
}
