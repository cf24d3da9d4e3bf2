// File-type detection from magic bytes: PNG signature (ISO/IEC 15948 §5.2), TIFF byte-order
// header "II*\0" / "MM\0*" (TIFF 6.0 §2), JPEG start-of-image FF D8 FF (ITU-T T.81 annex B),
// else printable UTF-8 text containing digits (a numeric grid). Browser-safe.
import type { ScanFormat } from './types'

const PNG_SIG = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]

export const FORMAT_NAMES: Readonly<Record<ScanFormat, string>> = {
  png: 'PNG image',
  tiff: 'TIFF image',
  jpeg: 'JPEG image',
  text: 'numeric text grid',
}

export function sniffFormat(bytes: Uint8Array): ScanFormat | null {
  if (bytes.length >= 8 && PNG_SIG.every((b, i) => bytes[i] === b)) return 'png'
  if (bytes.length >= 4) {
    const [a, b, c, d] = [bytes[0], bytes[1], bytes[2], bytes[3]]
    // Classic TIFF (42) and BigTIFF (43); the decoder explains that BigTIFF is not read.
    if (a === 0x49 && b === 0x49 && (c === 0x2A || c === 0x2B) && d === 0x00) return 'tiff'
    if (a === 0x4D && b === 0x4D && c === 0x00 && (d === 0x2A || d === 0x2B)) return 'tiff'
  }
  if (bytes.length >= 3 && bytes[0] === 0xFF && bytes[1] === 0xD8 && bytes[2] === 0xFF) return 'jpeg'
  const t = scanText(bytes)
  return t.printable && t.digits ? 'text' : null
}

/** True for printable UTF-8 text (digits or not), so a .csv without numbers gets a text-grid message. */
export function isPrintableText(bytes: Uint8Array): boolean {
  return scanText(bytes).printable
}

/** The format a file name's extension claims, or null when the extension says nothing. */
export function formatFromFilename(filename: string | undefined): ScanFormat | null {
  const m = /\.([A-Za-z0-9]+)$/.exec(filename ?? '')
  switch (m?.[1]?.toLowerCase()) {
    case 'png': return 'png'
    case 'tif': case 'tiff': return 'tiff'
    case 'jpg': case 'jpeg': case 'jpe': case 'jfif': return 'jpeg'
    case 'csv': case 'tsv': case 'txt': case 'dat': case 'asc': return 'text'
    default: return null
  }
}

// Printable text: no control bytes except tab, LF, VT, FF, CR; well-formed UTF-8 (a sequence cut
// by the 64 KiB look-ahead is allowed). Also reports whether a digit was seen.
function scanText(bytes: Uint8Array): { printable: boolean, digits: boolean } {
  const n = Math.min(bytes.length, 65536)
  let digits = false
  for (let i = 0; i < n; i++) {
    const b = bytes[i]!
    if (b < 0x80) {
      if (b >= 0x30 && b <= 0x39) digits = true
      else if (b === 0x7F || (b < 0x20 && b !== 0x09 && b !== 0x0A && b !== 0x0B && b !== 0x0C && b !== 0x0D)) return { printable: false, digits }
      continue
    }
    // Lead byte → number of continuation bytes; 0x80–0xC1 and 0xF5–0xFF never start a character.
    const extra = b >= 0xC2 && b <= 0xDF ? 1 : b >= 0xE0 && b <= 0xEF ? 2 : b >= 0xF0 && b <= 0xF4 ? 3 : -1
    if (extra < 0) return { printable: false, digits }
    for (let k = 1; k <= extra; k++) {
      if (i + k >= n) return { printable: n < bytes.length, digits }
      const cb = bytes[i + k]!
      if ((cb & 0xC0) !== 0x80) return { printable: false, digits }
    }
    i += extra
  }
  return { printable: true, digits }
}
