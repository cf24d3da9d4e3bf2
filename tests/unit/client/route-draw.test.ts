// Route-layer geometry against hand-worked cases.
import { describe, expect, it } from 'vitest'
import { colourBins, moveNear, pointAlong, positionsAfter } from '../../../utils/routeDraw'

// An L-shaped path: 3 nm along x, then 4 nm along y (7 nm in all).
const L: [number, number][] = [[0, 0], [3, 0], [3, 4]]

describe('pointAlong', () => {
  it('walks by length: 3/7 of the way is the corner, 5/7 is 2 nm up the second leg', () => {
    expect(pointAlong(L, 3 / 7)).toEqual([3, 0])
    const p = pointAlong(L, 5 / 7)
    expect(p[0]).toBeCloseTo(3, 12)
    expect(p[1]).toBeCloseTo(2, 12)
    expect(pointAlong(L, 0)).toEqual([0, 0])
    expect(pointAlong(L, 1)).toEqual([3, 4])
  })
})

describe('positionsAfter and moveNear', () => {
  const moves = [
    { atom: 2, path: L, length_nm: 7 },
    { atom: 5, path: [[10, 10], [12, 10]] as [number, number][], length_nm: 2 },
    { atom: 2, path: [[3, 4], [3, 6]] as [number, number][], length_nm: 2 },
  ]
  it('puts each moved atom at the end of its last move done', () => {
    expect([...positionsAfter(moves, 1)]).toEqual([[2, [3, 4]]])
    expect([...positionsAfter(moves, 3)]).toEqual([[2, [3, 6]], [5, [12, 10]]])
  })
  it('finds the path a click lands on: (2.8, 1) is 0.2 nm from the second leg of move 0', () => {
    expect(moveNear(moves, 2.8, 1, 0.25)).toBe(0)
    expect(moveNear(moves, 11, 10.1, 0.25)).toBe(1)
    expect(moveNear(moves, 6, 6, 0.25)).toBe(-1)
  })
})

describe('colourBins', () => {
  it('spreads order evenly and length between the shortest and the longest', () => {
    const m = [1, 2, 3, 4, 5].map(length_nm => ({ atom: 0, path: [[0, 0]] as [number, number][], length_nm }))
    // order: k/(n−1) = 0, ¼, ½, ¾, 1 → bins of 4: 0, 1, 2, 3, 3
    expect([...colourBins(m, 'order', 4)]).toEqual([0, 1, 2, 3, 3])
    // length: (L − 1)/4 = the same fractions
    expect([...colourBins([...m].reverse(), 'length', 4)]).toEqual([3, 3, 2, 1, 0])
  })
})
