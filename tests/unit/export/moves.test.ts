// The move-list files: the caution travels in the file, and the rows carry instrument-frame
// coordinates computed by hand for a 90° window turn.
import { describe, expect, it } from 'vitest'
import { CSV_COLUMNS, EXPORT_CAUTION, movesToCsv, movesToJson, type ExportRoute } from '../../../shared/export/moves'

// Window 10 × 10 nm, centre at (100, 50) nm, turned by 90°: scan (x, y) → (100 − (5 − y)·1 …);
// by hand, with u = x − 5, v = 5 − y: X = 100 − v, Y = 50 + u.
const route: ExportRoute = {
  id: 7,
  created_at: '2026-01-02T03:04:05.000Z',
  blueprint: { id: 3, name: 'Ring, 12\nsites', version: 2 },
  scan: { id: 5, filename: 'topo.csv', size_x_nm: 10, size_y_nm: 10, offset_x_nm: 100, offset_y_nm: 50, rotation_deg: 90 },
  moves: [
    // (1, 2) → (1, 5) → (4, 5): X = 100 − (5 − y), Y = 50 + (x − 5) → (97, 46), (100, 46), (100, 49).
    { atom: 4, site: 0, kind: 'direct', path: [[1, 2], [1, 5], [4, 5]], length_nm: 6, segments: 2, estimate_s: 23 },
    { atom: 1, site: 1, kind: 'parking', path: [[9, 9], [8, 9]], length_nm: 1, segments: 1, estimate_s: 20.5 },
  ],
  total_length_nm: 7,
  lower_bound_nm: 6.5,
  total_s: 43.5,
}

describe('movesToCsv', () => {
  const csv = movesToCsv(route, { anchor: 'centre', y_axis: 'up' })
  const lines = csv.trimEnd().split('\n')

  it('opens with the caution as a # comment line and keeps every comment on one line', () => {
    expect(lines[0]).toBe(`# CAUTION: ${EXPORT_CAUTION}`)
    expect(lines[0]).toMatch(/instrument's own frame before any scripted move/)
    const comments = lines.filter(l => l.startsWith('#'))
    expect(comments).toHaveLength(4)
    expect(comments[1]).toContain('"Ring, 12 sites" v2')
    expect(lines[4]).toBe(CSV_COLUMNS.join(','))
  })

  it('writes the moves in order with hand-computed instrument coordinates', () => {
    expect(lines[5]).toBe('1,4,0,direct,97.0000,46.0000,100.0000,49.0000,6.0000,2,23.0,97.0000 46.0000;100.0000 46.0000;100.0000 49.0000')
    // (9, 9) → X = 100 − (5 − 9) = 104, Y = 50 + 4 = 54; (8, 9) → (104, 53).
    expect(lines[6]).toBe('2,1,1,parking,104.0000,54.0000,104.0000,53.0000,1.0000,1,20.5,104.0000 54.0000;104.0000 53.0000')
    expect(lines).toHaveLength(7)
  })
})

describe('movesToJson', () => {
  it('carries the caution, the frame and the transformed paths', () => {
    const json = movesToJson(route, { anchor: 'centre', y_axis: 'up' })
    expect(json.caution).toBe(EXPORT_CAUTION)
    expect(json.frame).toMatchObject({ kind: 'instrument', units: 'nm', offset_nm: [100, 50], rotation_deg: 90, anchor: 'centre', y_axis: 'up' })
    expect(json.moves[0]!.path.map(p => p.map(v => +v.toFixed(9)))).toEqual([[97, 46], [100, 46], [100, 49]])
    expect(json.moves.map(m => m.order)).toEqual([1, 2])
    expect(json.totals).toEqual({ moves: 2, total_length_nm: 7, lower_bound_nm: 6.5, estimate_s: 43.5 })
    // It survives a round trip through JSON text unchanged.
    expect(JSON.parse(JSON.stringify(json))).toEqual(json)
  })
})
