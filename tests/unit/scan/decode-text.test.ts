// Numeric text grids and format sniffing. Expected values are the decimal numbers written in the
// test, rounded to Float32 by Math.fround (IEEE 754 round-to-nearest).
import { describe, expect, it } from 'vitest'
import { decodeScan } from '../../../shared/scan/decode'
import { sniffFormat } from '../../../shared/scan/sniff'
import { decodeTextGrid } from '../../../shared/scan/text'
import { expectInputError } from './expect-file-error'

const enc = (s: string) => new TextEncoder().encode(s)

describe('text grids', () => {
  it('reads CSV with # header lines, CRLF, blank lines and a trailing comma', () => {
    const csv = '# exported heights\r\n# unit: nm\r\n0.125, -1.5, 2e-3,\r\n\r\n3, 4.25, -0.0625,\r\n'
    const raw = decodeScan(enc(csv), { filename: 'grid.csv' })
    expect(raw).toMatchObject({ width: 3, height: 2, format: 'text', sampleType: 'float', valueUnit: 'nm', bitDepth: 32 })
    expect(Array.from(raw.data)).toEqual([0.125, -1.5, 2e-3, 3, 4.25, -0.0625].map(Math.fround))
  })

  it('reads whitespace (tabs and runs of spaces) and semicolon grids', () => {
    const ws = decodeScan(enc('\uFEFF  1\t2   3\n# comment in between\n4 5 6\n7 8\t\t9'), { filename: 'grid.txt' })
    expect([ws.width, ws.height]).toEqual([3, 3])
    expect(Array.from(ws.data)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9])
    const semi = decodeScan(enc('1.5;2.5\n-3;+4E1\n'))
    expect(Array.from(semi.data)).toEqual([1.5, 2.5, -3, 40])
  })

  it('names the row (and file line) of a ragged row', () => {
    expectInputError(() => decodeScan(enc('# h\n1,2,3\n4,5,6\n7,8\n'), { filename: 'r.csv' }), /^r\.csv: row 3 \(line 4\) has 2 values, but row 1 has 3$/)
  })

  it('names row and column of NaN, non-numeric and empty cells', () => {
    expectInputError(() => decodeScan(enc('1 2 3\n4 NaN 6\n'), { filename: 'n.txt' }), /^n\.txt: row 2 \(line 2\), column 2 is "NaN", not a finite number$/)
    expectInputError(() => decodeScan(enc('1,2\n3,abc\n')), /row 2 \(line 2\), column 2 "abc" is not a number/)
    expectInputError(() => decodeScan(enc('1,,3\n4,5,6\n')), /row 1 \(line 1\), column 2 is empty/)
    expectInputError(() => decodeScan(enc('x y z\n1 2 3\n')), /column 1 "x" is not a number \(header lines must start with #\)/)
    expectInputError(() => decodeScan(enc('1 0x10\n')), /"0x10" is not a number/)
    expectInputError(() => decodeScan(enc('1 Infinity\n')), /is "Infinity", not a finite number/)
    expectInputError(() => decodeScan(enc('1 1e39\n')), /row 1 \(line 1\), column 2 \(1e39\) lies outside the stored range/)
  })

  it('rejects grids with only comments, too many columns or too many rows', () => {
    expectInputError(() => decodeScan(enc('# nothing\n\n# here\n'), { filename: 'c.csv' }), /c\.csv holds no numbers/)
    expectInputError(() => decodeTextGrid(enc(`${Array(9).fill('1').join(' ')}\n`), { maxSide: 8 }), /has 9 columns; the largest accepted grid is 8 × 8/)
    expectInputError(() => decodeTextGrid(enc('1\n'.repeat(9)), { maxSide: 8 }), /more than 8 rows/)
    expectInputError(() => decodeScan(enc(`${'0 '.repeat(8193)}\n`)), /has 8193 columns; the largest accepted grid is 8192 × 8192/)
  })

  it('rejects a .csv that holds binary bytes, and invalid UTF-8', () => {
    expectInputError(() => decodeScan(Uint8Array.of(0xFF, 0xD8, 0xFF, 0xE0, 0, 16), { filename: 'data.csv' }), /^data\.csv is not a numeric text grid: its content is a JPEG image$/)
    expectInputError(() => decodeTextGrid(Uint8Array.of(0x31, 0x20, 0xC3, 0x28)), /not valid UTF-8/)
  })
})

describe('sniffFormat', () => {
  it('recognises the magic bytes of PNG, TIFF (both byte orders), JPEG and text', () => {
    expect(sniffFormat(Uint8Array.of(0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A))).toBe('png')
    expect(sniffFormat(Uint8Array.of(0x49, 0x49, 0x2A, 0x00, 8, 0, 0, 0))).toBe('tiff')
    expect(sniffFormat(Uint8Array.of(0x4D, 0x4D, 0x00, 0x2A, 0, 0, 0, 8))).toBe('tiff')
    expect(sniffFormat(Uint8Array.of(0xFF, 0xD8, 0xFF, 0xDB))).toBe('jpeg')
    expect(sniffFormat(enc('# höhe in nm — ok\n1.0 2.0\n'))).toBe('text')
    expect(sniffFormat(enc('no digits here'))).toBeNull()
    expect(sniffFormat(Uint8Array.of(0x31, 0x00, 0x32))).toBeNull()
    expect(sniffFormat(Uint8Array.of(0x89, 0x50, 0x4E))).toBeNull()
  })
})
