import { describe, expect, it } from 'vitest'
import { GridIndex } from '../../../shared/lattice'
import { expectInputError } from './helpers'
import { rng } from './synthetic'

function cloud(seed: number, n: number): Float64Array {
  const rand = rng(seed)
  const xy = new Float64Array(2 * n)
  for (let k = 0; k < n; k++) {
    // Half uniform, half in tight clusters, plus exact duplicates: uneven cell occupancy.
    if (k % 2 === 0) {
      xy[2 * k] = rand() * 50
      xy[2 * k + 1] = rand() * 20
    }
    else if (k % 7 === 1 && k > 2) {
      xy[2 * k] = xy[2 * k - 2]!
      xy[2 * k + 1] = xy[2 * k - 1]!
    }
    else {
      const c = Math.floor(rand() * 5)
      xy[2 * k] = 10 * c + rand() * 0.3
      xy[2 * k + 1] = 5 + rand() * 0.3
    }
  }
  return xy
}

const d = (xy: Float64Array, k: number, x: number, y: number) => Math.hypot(xy[2 * k]! - x, xy[2 * k + 1]! - y)

describe('GridIndex against brute force', () => {
  const xy = cloud(1, 3000)
  const index = new GridIndex(xy)
  const rand = rng(2)
  const queries: [number, number][] = Array.from({ length: 300 }, () => [rand() * 80 - 15, rand() * 50 - 15])

  it('nearest: same distance as a scan over all points, inside and outside the bounding box', () => {
    for (const [x, y] of queries) {
      let best = Infinity
      for (let k = 0; k < 3000; k++) best = Math.min(best, d(xy, k, x, y))
      expect(d(xy, index.nearest(x, y), x, y)).toBe(best)
    }
  })

  it('nearest with exclude skips the query point itself', () => {
    for (let q = 0; q < 3000; q += 37) {
      let best = Infinity
      for (let k = 0; k < 3000; k++) if (k !== q) best = Math.min(best, d(xy, k, xy[2 * q]!, xy[2 * q + 1]!))
      const got = index.nearest(xy[2 * q]!, xy[2 * q + 1]!, q)
      expect(got).not.toBe(q)
      expect(d(xy, got, xy[2 * q]!, xy[2 * q + 1]!)).toBe(best)
    }
  })

  it('withinRadius: exactly the points with distance ≤ r', () => {
    for (const [x, y] of queries.slice(0, 100)) {
      for (const r of [0.2, 1.5, 7]) {
        const got = index.withinRadius(x, y, r).sort((p, q) => p - q)
        const brute: number[] = []
        for (let k = 0; k < 3000; k++) if ((xy[2 * k]! - x) ** 2 + (xy[2 * k + 1]! - y) ** 2 <= r * r) brute.push(k)
        expect(got).toEqual(brute)
      }
    }
  })

  it('kNearest: the k smallest distances in order', () => {
    for (const [x, y] of queries.slice(0, 60)) {
      for (const k of [1, 5, 40]) {
        const got = index.kNearest(x, y, k).map(p => d(xy, p, x, y))
        const brute = Array.from({ length: 3000 }, (_, p) => d(xy, p, x, y)).sort((p, q) => p - q).slice(0, k)
        expect(got).toEqual(brute)
      }
    }
  })

  it('forEachPairWithin: every pair closer than r once, as an all-pairs scan finds', () => {
    const small = cloud(5, 600)
    const idx = new GridIndex(small)
    const got: string[] = []
    idx.forEachPairWithin(0.4, (a, b) => got.push(`${a},${b}`))
    const brute: string[] = []
    for (let a = 0; a < 600; a++) for (let b = a + 1; b < 600; b++) if (Math.hypot(small[2 * a]! - small[2 * b]!, small[2 * a + 1]! - small[2 * b + 1]!) <= 0.4) brute.push(`${a},${b}`)
    expect(got.sort()).toEqual(brute.sort())
  })

  it('handles degenerate sets: empty, one point, a line, identical points', () => {
    expect(new GridIndex(new Float64Array(0)).nearest(1, 1)).toBe(-1)
    expect(new GridIndex([3, 4]).nearest(-100, 50)).toBe(0)
    const line = new Float64Array(2 * 500)
    for (let k = 0; k < 500; k++) {
      line[2 * k] = k * 0.1
      line[2 * k + 1] = 2
    }
    const li = new GridIndex(line)
    expect(li.nearest(12.34, 7)).toBe(123)
    const same = new GridIndex(new Float64Array(200).fill(1.5))
    expect(same.withinRadius(1.5, 1.5, 0)).toHaveLength(100)
    expect(same.kNearest(0, 0, 3)).toEqual([0, 1, 2])
  })

  it('rejects non-finite coordinates naming the point', () => {
    expectInputError(() => new GridIndex([0, 0, 1, Number.NaN]), 'points[1]')
  })
})
