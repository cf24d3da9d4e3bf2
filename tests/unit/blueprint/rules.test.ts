import { describe, expect, it } from 'vitest'
import { type RuleIssue, checkRules } from '../../../shared/blueprint'
import { getSurface, idealLattice, siteAt } from '../../../shared/lattice'
import { expectInputError } from '../lattice/helpers'
import { rng } from '../lattice/synthetic'

/** Random occupied sites of Cu(111) fcc, with some sites repeated on purpose. */
function randomSites(seed: number, n: number, half: number) {
  const rand = rng(seed)
  const lat = idealLattice('Cu(111)', 'fcc')
  const out: { x_nm: number, y_nm: number }[] = []
  for (let k = 0; k < n; k++) {
    if (k > 0 && k % 97 === 0) {
      out.push({ ...out[Math.floor(rand() * k)]! })
      continue
    }
    const [x, y] = siteAt(lat, Math.floor(rand() * 2 * half) - half, Math.floor(rand() * 2 * half) - half)
    out.push({ x_nm: x, y_nm: y })
  }
  return out
}

/** All-pairs reference. */
function bruteRules(sites: { x_nm: number, y_nm: number }[], minSpacing: number, box?: { x0: number, y0: number, x1: number, y1: number }): RuleIssue[] {
  const out: RuleIssue[] = []
  for (let a = 0; a < sites.length; a++) for (let b = a + 1; b < sites.length; b++) {
    const d = Math.hypot(sites[a]!.x_nm - sites[b]!.x_nm, sites[a]!.y_nm - sites[b]!.y_nm)
    if (d < 1e-6) out.push({ kind: 'duplicate', sites: [a, b], distance_nm: d })
    else if (d < minSpacing - 1e-9) out.push({ kind: 'too-close', sites: [a, b], distance_nm: d })
  }
  if (box) sites.forEach((s, k) => {
    if (s.x_nm < box.x0 || s.x_nm > box.x1 || s.y_nm < box.y0 || s.y_nm > box.y1) out.push({ kind: 'outside', sites: [k] })
  })
  const order = { 'duplicate': 0, 'too-close': 1, 'outside': 2 }
  return out.sort((p, q) => order[p.kind] - order[q.kind] || p.sites[0]! - q.sites[0]! || (p.sites[1] ?? 0) - (q.sites[1] ?? 0))
}

const key = (i: RuleIssue) => `${i.kind}:${i.sites.join(',')}`

describe('checkRules against brute force over all pairs', () => {
  it('too-close, duplicate and outside on 3000 random sites (default spacing 2 × nn, common practice)', () => {
    const sites = randomSites(1, 3000, 60)
    const box = { x0: -10.03, y0: -8.02, x1: 9.97, y1: 8.01 }
    const got = checkRules(sites, { surface: 'Cu(111)', bounds: box })
    const want = bruteRules(sites, 2 * getSurface('Cu(111)').nn_nm, box)
    expect(got.map(key)).toEqual(want.map(key))
    expect(got.some(i => i.kind === 'duplicate')).toBe(true)
    expect(got.some(i => i.kind === 'too-close')).toBe(true)
    expect(got.some(i => i.kind === 'outside')).toBe(true)
    got.forEach((g, k) => {
      if (g.distance_nm !== undefined) expect(g.distance_nm).toBeCloseTo(want[k]!.distance_nm!, 12)
    })
  })

  it('a custom minimum spacing and a polygon boundary', () => {
    const sites = randomSites(2, 1500, 30)
    const tri: [number, number][] = [[-6.01, -5.02], [6.03, -4.99], [0.02, 6.04]]
    const got = checkRules(sites, { minSpacing_nm: 0.9, bounds: tri })
    const pairs = bruteRules(sites, 0.9).map(key)
    expect(got.filter(i => i.kind !== 'outside').map(key)).toEqual(pairs)
    // Outside a triangle: on the wrong side of one of its edges (counter-clockwise vertices).
    const outside = sites.flatMap((s, k) => tri.some((p, e) => {
      const q = tri[(e + 1) % 3]!
      return (q[0] - p[0]) * (s.y_nm - p[1]) - (q[1] - p[1]) * (s.x_nm - p[0]) < 0
    })
      ? [k]
      : [])
    expect(got.filter(i => i.kind === 'outside').map(i => i.sites[0])).toEqual(outside)
  })

  it('atoms exactly at the minimum spacing pass; a nearest-neighbour pair is too close', () => {
    const d = getSurface('Ag(111)').nn_nm
    const sites = [{ x_nm: 0, y_nm: 0 }, { x_nm: 2 * d, y_nm: 0 }, { x_nm: 3 * d, y_nm: 0 }]
    expect(checkRules(sites, { surface: 'Ag(111)' }).map(key)).toEqual(['too-close:1,2'])
  })

  it('input errors name the field', () => {
    expectInputError(() => checkRules([{ x_nm: 0, y_nm: 0 }]), 'minSpacing_nm')
    expectInputError(() => checkRules([{ x_nm: 0, y_nm: Number.NaN }], { minSpacing_nm: 0.5 }), 'sites[0].y_nm')
    expectInputError(() => checkRules([], { minSpacing_nm: -1 }), 'minSpacing_nm')
    expectInputError(() => checkRules([], { minSpacing_nm: 1, bounds: { x0: 0, y0: 0, x1: Number.NaN, y1: 1 } }), 'bounds.x1')
  })
})
