// A measured point spectrum from a text file: rows of "bias (V), dI/dV (any unit)". Lines before
// the first numeric row are a header; '#' lines are comments anywhere; extra columns are ignored.
// Fields are split on commas, semicolons, tabs or spaces (with ';' or tabs, a decimal comma is
// read as a point). Every bad row is named by its line number.
import { InputError } from '../errors'

export interface MeasuredSpectrum {
  /** ascending bias, V (rows with the same bias are averaged) */
  bias_V: number[]
  didv: number[]
  header: string[]
  /** data rows read (before averaging repeats) */
  rows: number
}

export const SPECTRUM_LIMITS = { rows: 200_000, header_lines: 100, min_rows: 5, max_abs_bias_V: 10 } as const

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/

function fields(line: string): string[] {
  if (line.includes(';')) return line.split(';').map(f => f.trim().replace(',', '.'))
  if (line.includes('\t')) return line.split('\t').map(f => f.trim().replace(',', '.'))
  if (line.includes(',')) return line.split(',').map(f => f.trim())
  return line.trim().split(/\s+/)
}

function parseNumber(f: string | undefined): number | null {
  if (f === undefined) return null
  const s = f.replace(/^"(.*)"$/, '$1').trim()
  return NUMBER.test(s) ? Number(s) : null
}

function listRows(rows: number[]): string {
  const shown = rows.slice(0, 5).join(', ')
  return rows.length > 5 ? `${shown} and ${rows.length - 5} more` : shown
}

/** Parses the text; throws InputError('file', …) naming the bad rows (1-based line numbers). */
export function parseSpectrumCsv(text: string): MeasuredSpectrum {
  if (typeof text !== 'string' || !text.trim()) throw new InputError('file', 'the file is empty')
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/)
  const header: string[] = []
  const points: [number, number][] = []
  const bad = new Map<string, number[]>()
  const note = (why: string, row: number) => bad.set(why, [...(bad.get(why) ?? []), row])
  let started = false
  lines.forEach((raw, k) => {
    const line = raw.trim()
    const row = k + 1
    if (!line || line.startsWith('#')) return
    const f = fields(line)
    const v = parseNumber(f[0])
    const d = parseNumber(f[1])
    if (!started) {
      if (v === null || d === null) {
        if (header.length >= SPECTRUM_LIMITS.header_lines) note('not two numbers (bias in V, dI/dV)', row)
        else header.push(line)
        return
      }
      started = true
    }
    if (f.length < 2) return note('has fewer than two columns', row)
    if (v === null) return note('bias is not a number', row)
    if (d === null) return note('dI/dV is not a number', row)
    if (!Number.isFinite(v) || !Number.isFinite(d)) return note('holds a value too large to read', row)
    if (Math.abs(v) > SPECTRUM_LIMITS.max_abs_bias_V) return note(`bias beyond ±${SPECTRUM_LIMITS.max_abs_bias_V} V (is the column in mV?)`, row)
    points.push([v, d])
  })
  if (bad.size) {
    const parts = [...bad].map(([why, rows]) => `${rows.length === 1 ? 'row' : 'rows'} ${listRows(rows)}: ${why}`)
    throw new InputError('file', parts.join('; '))
  }
  if (points.length < SPECTRUM_LIMITS.min_rows) {
    throw new InputError('file', `found ${points.length} data rows; a spectrum needs at least ${SPECTRUM_LIMITS.min_rows} rows of "bias (V), dI/dV"`)
  }
  if (points.length > SPECTRUM_LIMITS.rows) throw new InputError('file', `has ${points.length} data rows (at most ${SPECTRUM_LIMITS.rows})`)
  points.sort((a, b) => a[0] - b[0])
  const bias_V: number[] = []
  const didv: number[] = []
  for (let i = 0; i < points.length;) {
    let j = i
    let s = 0
    while (j < points.length && points[j]![0] === points[i]![0]) s += points[j++]![1]
    bias_V.push(points[i]![0])
    didv.push(s / (j - i))
    i = j
  }
  if (bias_V.length < 3) throw new InputError('file', 'the rows hold fewer than 3 different biases')
  return { bias_V, didv, header, rows: points.length }
}
