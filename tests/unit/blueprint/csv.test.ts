import { describe, expect, it } from 'vitest'
import { expandShape, parseSiteCsv, sitesToCsv } from '../../../shared/blueprint'
import { expectInputError } from '../lattice/helpers'

describe('site-list CSV', () => {
  const ring = expandShape({ type: 'ring', center: [0.4, -0.2], radius_nm: 4, n: 24 }, 'Cu(111)', 'fcc')
  const bridges = expandShape({ type: 'sites', sites: [[0, 0, 0], [1, 2, 1], [-3, 4, 2]] }, 'Cu(111)', 'bridge')

  it('round trip with indices: the same sites come back, exactly', () => {
    for (const [sites, site] of [[ring, 'fcc'], [bridges, 'bridge']] as const) {
      const text = sitesToCsv(sites)
      expect(text.split('\n')[0]).toBe('i,j,b,x_nm,y_nm')
      const back = parseSiteCsv(text, 'Cu(111)', site)
      expect(back.map(s => [s.i, s.j, s.b])).toEqual(sites.map(s => [s.i, s.j, s.b]))
      back.forEach((s, k) => expect(s.x_nm).toBeCloseTo(sites[k]!.x_nm, 12))
    }
  })

  it('round trip with positions only: snapping returns the same sites (6 decimals ≪ site spacing)', () => {
    const text = sitesToCsv(ring, { columns: 'positions' })
    expect(text.split('\n')[0]).toBe('x_nm,y_nm')
    const back = parseSiteCsv(text, 'Cu(111)', 'fcc')
    expect(back.map(s => [s.i, s.j, s.b])).toEqual(ring.map(s => [s.i, s.j, s.b]))
    for (const s of back) expect(s.deviation_nm).toBeLessThan(1e-6)
  })

  it('accepts quotes, comments, blank lines, CRLF, a byte-order mark and extra columns', () => {
    const text = '\uFEFF# exported site list\r\n"x_nm","y_nm",label\r\n\r\n1.0e-1, 0.2 ,first\r\n# note\r\n-0.3,0.05,"a, b"\r\n'
    const sites = parseSiteCsv(text, 'Ag(100)', 'hollow')
    expect(sites.map(s => s.ideal)).toEqual([[0.1, 0.2], [-0.3, 0.05]])
  })

  it('names line and column of a bad cell', () => {
    const msg = expectInputError(() => parseSiteCsv('x_nm,y_nm\n0.1,0.2\n0.3,abc\n', 'Cu(111)'), 'csv[line 3].y_nm')
    expect(msg).toContain('line 3')
    expect(msg).toContain('"y_nm"')
    expect(msg).toContain('abc')
    expectInputError(() => parseSiteCsv('i,j\n1,2\n3\n', 'Cu(111)'), 'csv[line 3].j')
    expectInputError(() => parseSiteCsv('i,j,b\n1,2.5,0\n', 'Cu(111)'), 'csv[line 2].j')
    expectInputError(() => parseSiteCsv('i,j,b\n1,2,1\n', 'Cu(111)', 'fcc'), 'csv[line 2].b')
    expectInputError(() => parseSiteCsv('x_nm,y_nm\n0x10,1\n', 'Cu(111)'), 'csv[line 2].x_nm')
    expectInputError(() => parseSiteCsv('x_nm,y_nm\n1e999,1\n', 'Cu(111)'), 'csv[line 2].x_nm')
  })

  it('refuses a missing header and an empty file', () => {
    expectInputError(() => parseSiteCsv('a,b\n1,2\n', 'Cu(111)'), 'csv')
    expectInputError(() => parseSiteCsv('\n# nothing\n', 'Cu(111)'), 'csv')
    expectInputError(() => parseSiteCsv('x_nm,y_nm\n1,2\n', 'Cu(119)'), 'surface')
  })
})
