// Version comparison, against a count made by hand on two small site lists.
import { describe, expect, it } from 'vitest'
import { diffSites } from '../../../shared/blueprint/diff'
import { expandShape } from '../../../shared/blueprint'

const site = (i: number, j: number, b = 0) => ({ i, j, b, x_nm: i, y_nm: j })

describe('diffSites', () => {
  it('lists added and removed sites by index (hand count)', () => {
    const prev = [site(0, 0), site(1, 0), site(2, 0), site(0, 0, 1)]
    const next = [site(1, 0), site(2, 0), site(3, 0), site(4, 0)]
    const d = diffSites(prev, next)
    expect(d.added.map(s => [s.i, s.j, s.b])).toEqual([[3, 0, 0], [4, 0, 0]])
    expect(d.removed.map(s => [s.i, s.j, s.b])).toEqual([[0, 0, 0], [0, 0, 1]])
    expect(d.kept).toBe(2)
  })

  it('finds a chain grown by two atoms: two added, none removed', () => {
    const a = expandShape({ type: 'chain', start: [0, 0], direction: 0, count: 5, step: 2 }, 'Cu(111)')
    const b = expandShape({ type: 'chain', start: [0, 0], direction: 0, count: 7, step: 2 }, 'Cu(111)')
    const d = diffSites(a, b)
    expect(d.added.map(s => s.i)).toEqual([10, 12])
    expect(d.removed).toEqual([])
    expect(d.kept).toBe(5)
  })
})
