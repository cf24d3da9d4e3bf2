// Site-list CSV (RFC 4180 subset: comma-separated, optional double quotes, '#' comment lines):
// header `x_nm,y_nm` (positions in the blueprint's ideal frame, snapped to the nearest site) or
// `i,j[,b]` (site indices); a file with both uses the indices.
import { InputError } from '../errors'
import { nearestSite } from '../lattice/lattice'
import type { Surface } from '../lattice/surfaces'
import type { Vec2 } from '../lattice/vec'
import { siteContext } from './context'
import type { BlueprintSite } from './expand'

function splitLine(line: string): string[] {
  const out: string[] = []
  let cur = '', quoted = false
  for (let k = 0; k < line.length; k++) {
    const ch = line[k]!
    if (quoted) {
      if (ch === '"' && line[k + 1] === '"') {
        cur += '"'
        k++
      }
      else if (ch === '"') quoted = false
      else cur += ch
    }
    else if (ch === '"') quoted = true
    else if (ch === ',') {
      out.push(cur.trim())
      cur = ''
    }
    else cur += ch
  }
  out.push(cur.trim())
  return out
}

/** Field name of a cell: 'csv[line 4].x_nm' (1-based line numbers as in a text editor). */
const cellField = (line: number, col: string) => `csv[line ${line}].${col}`

export function parseSiteCsv(text: string, surface: string | Surface, siteType?: string, opts: { maxRows?: number } = {}): BlueprintSite[] {
  if (typeof text !== 'string') throw new InputError('csv', 'the site list must be text')
  const ctx = siteContext(surface, siteType)
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/)
  let headerLine = -1
  for (let k = 0; k < lines.length; k++) {
    const l = lines[k]!.trim()
    if (l !== '' && !l.startsWith('#')) {
      headerLine = k
      break
    }
  }
  if (headerLine < 0) throw new InputError('csv', 'the site list is empty')
  const header = splitLine(lines[headerLine]!).map(h => h.toLowerCase())
  const col = (name: string) => header.indexOf(name)
  const ci = col('i'), cj = col('j'), cb = col('b'), cx = col('x_nm'), cy = col('y_nm')
  const byIndex = ci >= 0 && cj >= 0
  if (!byIndex && !(cx >= 0 && cy >= 0)) throw new InputError('csv', `line ${headerLine + 1}: the header must name the columns x_nm,y_nm or i,j (optionally b); found "${lines[headerLine]!.trim()}"`)
  const nb = ctx.site.offsets_nm.length
  const { a1, a2 } = ctx.surface
  const out: BlueprintSite[] = []
  const maxRows = opts.maxRows ?? 100_000
  for (let k = headerLine + 1; k < lines.length; k++) {
    const raw = lines[k]!.trim()
    if (raw === '' || raw.startsWith('#')) continue
    const line = k + 1
    if (out.length >= maxRows) throw new InputError('csv', `more than ${maxRows} rows`)
    const cells = splitLine(raw)
    const numberAt = (c: number, name: string): number => {
      const v = cells[c]
      if (v === undefined || v === '') throw new InputError(cellField(line, name), `line ${line}, column "${name}": value missing`)
      // Number('') and Number(' ') are 0 and Number('0x1f') is 31; accept plain decimals only.
      if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(v)) throw new InputError(cellField(line, name), `line ${line}, column "${name}": "${v}" is not a number`)
      const n = Number(v)
      if (!Number.isFinite(n)) throw new InputError(cellField(line, name), `line ${line}, column "${name}": "${v}" is out of range`)
      return n
    }
    if (byIndex) {
      const i = numberAt(ci, 'i'), j = numberAt(cj, 'j')
      const b = cb >= 0 ? numberAt(cb, 'b') : 0
      for (const [v, name] of [[i, 'i'], [j, 'j'], [b, 'b']] as const) {
        if (!Number.isInteger(v)) throw new InputError(cellField(line, name), `line ${line}, column "${name}": ${v} is not a whole number`)
      }
      if (b < 0 || b >= nb) throw new InputError(cellField(line, 'b'), `line ${line}, column "b": ${b} is not a ${ctx.site.name} site index (0…${nb - 1})`)
      const off = ctx.site.offsets_nm[b]!
      const x = i * a1[0] + j * a2[0] + off[0]
      const y = i * a1[1] + j * a2[1] + off[1]
      out.push({ i, j, b, x_nm: x, y_nm: y, ideal: [x, y], deviation_nm: 0 })
    }
    else {
      const p: Vec2 = [numberAt(cx, 'x_nm'), numberAt(cy, 'y_nm')]
      const s = nearestSite(ctx.lattice, p)
      out.push({ i: s.i, j: s.j, b: s.b, x_nm: s.x, y_nm: s.y, ideal: p, deviation_nm: s.distance })
    }
  }
  return out
}

/** CSV with header i,j,b,x_nm,y_nm (or one of the two column groups); positions to `decimals` places. */
export function sitesToCsv(sites: readonly Pick<BlueprintSite, 'i' | 'j' | 'b' | 'x_nm' | 'y_nm'>[], opts: { columns?: 'both' | 'indices' | 'positions', decimals?: number } = {}): string {
  const cols = opts.columns ?? 'both'
  const dec = opts.decimals ?? 6
  const head = cols === 'indices' ? 'i,j,b' : cols === 'positions' ? 'x_nm,y_nm' : 'i,j,b,x_nm,y_nm'
  const rows = sites.map((s) => {
    const idx = `${s.i},${s.j},${s.b}`
    const pos = `${s.x_nm.toFixed(dec)},${s.y_nm.toFixed(dec)}`
    return cols === 'indices' ? idx : cols === 'positions' ? pos : `${idx},${pos}`
  })
  return [head, ...rows].join('\n') + '\n'
}
