// A route's move list as CSV and JSON in the instrument frame (frame.ts). Every file carries the
// caution in the file itself: `#` comment lines at the top of the CSV, a `caution` field in JSON.
import { describeConvention, toInstrumentFrame, type FrameConvention, type ScanWindow, type XY } from './frame'

export const EXPORT_CAUTION = 'Tessera plans; the instrument moves. Check these coordinates against the instrument\'s own frame before any scripted move, '
  + 'and follow the facility\'s own safety rules for cryogen, high-voltage and vacuum work.'

export interface ExportMove { atom: number, site: number, kind: string, path: XY[], length_nm: number, segments: number, estimate_s: number }

export interface ExportRoute {
  id: number
  created_at: string
  blueprint: { id: number, name: string, version: number }
  scan: ScanWindow & { id: number, filename: string }
  moves: ExportMove[]
  total_length_nm: number
  lower_bound_nm: number
  total_s: number
}

const NM = 4 // decimals of nm in the files: 0.1 pm, below any instrument's resolution
const f = (v: number, d = NM) => (Object.is(v, -0) ? 0 : v).toFixed(d).replace(/^-(0\.0+)$/, '$1')
const oneLine = (s: string) => s.replace(/[\r\n]+/g, ' ')

function framed(route: ExportRoute, c: FrameConvention) {
  return route.moves.map((m, k) => ({ order: k + 1, ...m, path: toInstrumentFrame(m.path, route.scan, c) }))
}

export const CSV_COLUMNS = ['order', 'atom', 'site', 'kind', 'start_x_nm', 'start_y_nm', 'end_x_nm', 'end_y_nm', 'length_nm', 'segments', 'estimate_s', 'path_nm'] as const

/**
 * One row per move in execution order; `path_nm` lists every corner of the path as `x y`
 * pairs separated by `;` (instrument frame). Atom and site numbers count from 0, as in the API.
 */
export function movesToCsv(route: ExportRoute, c: FrameConvention): string {
  const lines = [
    `# CAUTION: ${EXPORT_CAUTION}`,
    `# Tessera route ${route.id}: blueprint "${oneLine(route.blueprint.name)}" v${route.blueprint.version}, scan ${route.scan.id} "${oneLine(route.scan.filename)}", solved ${route.created_at}`,
    `# instrument frame, nm: ${describeConvention(route.scan, c)}`,
    `# ${route.moves.length} moves, total ${f(route.total_length_nm, 3)} nm (lower bound ${f(route.lower_bound_nm, 3)} nm), estimated ${f(route.total_s, 0)} s`,
    CSV_COLUMNS.join(','),
  ]
  for (const m of framed(route, c)) {
    const first = m.path[0]!, last = m.path[m.path.length - 1]!
    lines.push([
      m.order, m.atom, m.site, m.kind, f(first[0]), f(first[1]), f(last[0]), f(last[1]),
      f(m.length_nm), m.segments, f(m.estimate_s, 1), m.path.map(p => `${f(p[0])} ${f(p[1])}`).join(';'),
    ].join(','))
  }
  return `${lines.join('\n')}\n`
}

export function movesToJson(route: ExportRoute, c: FrameConvention) {
  return {
    format: 'tessera-route-moves',
    format_version: 1,
    caution: EXPORT_CAUTION,
    route: { id: route.id, created_at: route.created_at, blueprint: route.blueprint, scan: { id: route.scan.id, filename: route.scan.filename } },
    frame: {
      kind: 'instrument', units: 'nm', anchor: c.anchor, y_axis: c.y_axis,
      offset_nm: [route.scan.offset_x_nm, route.scan.offset_y_nm], rotation_deg: route.scan.rotation_deg,
      scan_size_nm: [route.scan.size_x_nm, route.scan.size_y_nm], formula: describeConvention(route.scan, c),
    },
    totals: { moves: route.moves.length, total_length_nm: route.total_length_nm, lower_bound_nm: route.lower_bound_nm, estimate_s: route.total_s },
    moves: framed(route, c).map(m => ({ order: m.order, atom: m.atom, site: m.site, kind: m.kind, length_nm: m.length_nm, segments: m.segments, estimate_s: m.estimate_s, path: m.path })),
  }
}
