// Scan upload decoding: the format is taken from the file's magic bytes (sniff.ts) and must agree
// with what its extension claims; image sizes are checked from the header before any pixel
// buffer exists. Server-side: the PNG, TIFF and JPEG readers use node:zlib / pngjs / jpeg-js.
import { InputError } from '../errors'
import { MAX_SIDE } from './grid'
import { decodeJpeg } from './jpeg'
import { decodePng } from './png'
import { FORMAT_NAMES, formatFromFilename, isPrintableText, sniffFormat } from './sniff'
import { decodeTextGrid } from './text'
import { decodeTiff } from './tiff'
import type { RawScan, ScanFormat } from './types'

export { sniffFormat } from './sniff'

export interface DecodeOptions {
  /** The uploaded file's name; its extension must match the content when it names a format. */
  filename?: string
  /** Largest accepted width or height (default 8192). */
  maxSide?: number
}

const CLAIMS: Record<ScanFormat, string> = { png: 'a PNG', tiff: 'a TIFF', jpeg: 'a JPEG', text: 'a numeric text grid' }

export function decodeScan(bytes: Uint8Array, opts: DecodeOptions = {}): RawScan {
  const name = opts.filename ?? 'the upload'
  const maxSide = opts.maxSide ?? MAX_SIDE
  if (!Number.isInteger(maxSide) || maxSide < 1) throw new InputError('maxSide', 'maxSide must be a whole number ≥ 1')
  if (!(bytes instanceof Uint8Array)) throw new InputError('file', 'the upload must be given as bytes')
  if (bytes.length === 0) throw new InputError('file', `${name} is empty (0 bytes)`)
  const claimed = formatFromFilename(opts.filename)
  // Text without any digit is still a text grid to report on ("holds no numbers").
  const found = sniffFormat(bytes) ?? (claimed === 'text' && isPrintableText(bytes) ? 'text' : null)
  if (claimed && found !== claimed) {
    const actually = found ? `its content is ${FORMAT_NAMES[found] === FORMAT_NAMES.text ? 'text' : `a ${FORMAT_NAMES[found]}`}` : 'its content matches no format Tessera reads'
    throw new InputError('file', `${name} is not ${CLAIMS[claimed]}: ${actually}`)
  }
  switch (found) {
    case 'png': return decodePng(bytes, name, maxSide)
    case 'tiff': return decodeTiff(bytes, name, maxSide)
    case 'jpeg': return decodeJpeg(bytes, name, maxSide)
    case 'text': return decodeTextGrid(bytes, { filename: name, maxSide })
    default: throw new InputError('file', `${name} is not a PNG, TIFF, JPEG or numeric text grid (its first bytes match none of them)`)
  }
}
