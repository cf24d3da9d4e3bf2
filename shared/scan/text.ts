// Plain numeric grids: one scan line per text line (row 0 first = top), cells separated by
// commas, semicolons, tabs or spaces, decimal point '.', heights in nm; lines starting with '#'
// and blank lines are skipped. Values are stored as Float32 (about 7 significant digits).
// Browser-safe.
import { InputError } from '../errors'
import { MAX_SIDE } from './grid'
import type { RawScan } from './types'

type Sep = 'comma' | 'semicolon' | 'space'

export function decodeTextGrid(bytes: Uint8Array, opts: { filename?: string, maxSide?: number } = {}): RawScan {
  const name = opts.filename ?? 'the grid'
  const maxSide = opts.maxSide ?? MAX_SIDE
  let text: string
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes)
  }
  catch {
    throw new InputError('file', `${name} is not valid UTF-8 text`)
  }
  const n = text.length
  // First pass: find the data lines (bounds only), so the size is checked before allocating.
  const starts: number[] = []
  const ends: number[] = []
  const lineNo: number[] = []
  let line = 0
  for (let p = text.charCodeAt(0) === 0xFEFF ? 1 : 0; p <= n;) {
    let e = text.indexOf('\n', p)
    if (e < 0) e = n
    line++
    let a = p, b = e
    while (a < b && isSpace(text.charCodeAt(a))) a++
    while (b > a && isSpace(text.charCodeAt(b - 1))) b--
    if (a < b && text.charCodeAt(a) !== 0x23 /* # */) {
      starts.push(a)
      ends.push(b)
      lineNo.push(line)
      if (starts.length > maxSide) throw new InputError('file', `${name} has more than ${maxSide} rows; the largest accepted grid is ${maxSide} × ${maxSide}`)
    }
    p = e + 1
  }
  const height = starts.length
  if (height === 0) throw new InputError('file', `${name} holds no numbers (only comments or blank lines)`)
  const first = text.slice(starts[0], ends[0])
  const sep: Sep = first.includes(',') ? 'comma' : first.includes(';') ? 'semicolon' : 'space'
  const width = splitCells(first, sep).length
  if (width > maxSide) throw new InputError('file', `${name} has ${width} columns; the largest accepted grid is ${maxSide} × ${maxSide}`)
  const data = new Float32Array(width * height)
  for (let r = 0; r < height; r++) {
    const cells = splitCells(text.slice(starts[r], ends[r]), sep)
    const where = `row ${r + 1} (line ${lineNo[r]})`
    if (cells.length !== width) {
      throw new InputError('file', `${name}: ${where} has ${cells.length} values, but row 1 has ${width}`)
    }
    for (let c = 0; c < width; c++) {
      const cell = cells[c]!
      const v = parseCell(cell)
      if (v === 'range') throw new InputError('file', `${name}: ${where}, column ${c + 1} (${cell}) lies outside the stored range of ±3.4e38`)
      if (v === null) {
        const shown = cell.length > 24 ? `${cell.slice(0, 24)}…` : cell
        const why = cell === '' ? 'is empty' : /^[+-]?(nan|inf(inity)?)$/i.test(cell) ? `is "${shown}", not a finite number` : `"${shown}" is not a number`
        throw new InputError('file', `${name}: ${where}, column ${c + 1} ${why}${r === 0 && cell !== '' ? ' (header lines must start with #)' : ''}`)
      }
      data[r * width + c] = v
    }
  }
  return { width, height, data, format: 'text', bitDepth: 32, sampleType: 'float', valueUnit: 'nm', reduction: 'none' }
}

function isSpace(ch: number): boolean {
  return ch === 0x20 || ch === 0x09 || ch === 0x0D || ch === 0x0B || ch === 0x0C
}

function splitCells(line: string, sep: Sep): string[] {
  if (sep === 'space') return line.split(/[ \t\v\f\r]+/)
  const parts = line.split(sep === 'comma' ? ',' : ';').map(s => s.trim())
  // Many writers end each line with a delimiter; that trailing empty cell is not data.
  if (parts.length > 1 && parts[parts.length - 1] === '') parts.pop()
  return parts
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/

// Strict decimal grammar (no hex, no "Infinity", no empty string, unlike Number()); 'range' for
// numbers too large for Float32.
function parseCell(cell: string): number | null | 'range' {
  if (!NUMBER.test(cell)) return null
  const v = Number(cell)
  return Math.abs(v) <= 3.4028234663852886e38 ? v : 'range'
}
