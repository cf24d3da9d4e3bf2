import { describe, expect, it } from 'vitest'
import { parseSpectrumCsv } from '../../../shared/waves/spectrum-csv'
import { isInputError } from '../../../shared/errors'

function problem(text: string): { field: string, message: string } {
  try {
    parseSpectrumCsv(text)
  }
  catch (e) {
    if (isInputError(e)) return { field: e.field, message: e.message }
    throw e
  }
  throw new Error('expected an InputError')
}

const rows = (n: number, sep = ',') => Array.from({ length: n }, (_, i) => `${(-0.5 + 0.1 * i).toFixed(2)}${sep}${(1 + i).toFixed(1)}`).join('\n')

describe('measured spectrum from CSV', () => {
  it('reads header lines, comments and extra columns, and sorts by bias', () => {
    const text = 'Point spectrum at the corral centre\nbias (V),dI/dV (nS),current (pA)\n# lock-in 5 mV\n0.1,3.0,9\n-0.1,1.0,7\n0.0,2.0,8\n0.2,4.5,1\n\n0.3,4.0,2\n'
    const s = parseSpectrumCsv(text)
    expect(s.header).toEqual(['Point spectrum at the corral centre', 'bias (V),dI/dV (nS),current (pA)'])
    expect(s.bias_V).toEqual([-0.1, 0, 0.1, 0.2, 0.3])
    expect(s.didv).toEqual([1, 2, 3, 4.5, 4])
    expect(s.rows).toBe(5)
  })

  it('accepts tabs, semicolons with decimal commas, spaces, CRLF and a byte-order mark', () => {
    expect(parseSpectrumCsv(rows(6, '\t')).bias_V).toHaveLength(6)
    expect(parseSpectrumCsv('\uFEFFV;dIdV\r\n-0,5;1,5\r\n-0,4;2\r\n-0,3;2,5\r\n-0,2;3\r\n-0,1;3,5\r\n').didv).toEqual([1.5, 2, 2.5, 3, 3.5])
    expect(parseSpectrumCsv(rows(5, '   ')).didv).toEqual([1, 2, 3, 4, 5])
    expect(parseSpectrumCsv('bias,didv\n1e-2,3E1\n2e-2,4\n3e-2,5\n4e-2,6\n5e-2,7\n').bias_V[0]).toBe(0.01)
  })

  it('averages rows that repeat a bias (forward and backward sweeps)', () => {
    const s = parseSpectrumCsv('0.1,1\n0.2,2\n0.3,3\n0.1,3\n0.2,4\n0.3,5\n')
    expect(s.bias_V).toEqual([0.1, 0.2, 0.3])
    expect(s.didv).toEqual([2, 3, 4])
  })

  it('names every bad row by its line number', () => {
    const text = 'bias,didv\n0.1,1\n0.2,oops\n0.3,3\nfoo,4\n0.5\n0.6,6\n0.7,NaN\n'
    const p = problem(text)
    expect(p.field).toBe('file')
    expect(p.message).toContain('rows 3, 8: dI/dV is not a number')
    expect(p.message).toContain('row 5: bias is not a number')
    expect(p.message).toContain('row 6: has fewer than two columns')
  })

  it('lists the first five bad rows and counts the rest', () => {
    const text = `${rows(5)}\n${Array.from({ length: 8 }, () => '0.9,x').join('\n')}`
    expect(problem(text).message).toContain('rows 6, 7, 8, 9, 10 and 3 more: dI/dV is not a number')
  })

  it('refuses empty files, too few rows and biases in mV', () => {
    expect(problem('').message).toMatch(/empty/)
    expect(problem('just a header\nand another').message).toMatch(/found 0 data rows/)
    expect(problem(rows(3)).message).toMatch(/found 3 data rows; a spectrum needs at least 5/)
    expect(problem('-500,1\n-250,2\n0,3\n250,4\n500,5\n').message).toMatch(/rows 1, 2, 4, 5: bias beyond ±10 V \(is the column in mV\?\)/)
  })
})
