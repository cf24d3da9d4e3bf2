import { describe, expect, it } from 'vitest'
import { fitChain, fitCircle } from '../../../shared/waves/geometry'
import { isInputError } from '../../../shared/errors'

function inputError(fn: () => unknown): { field: string, message: string } {
  try {
    fn()
  }
  catch (e) {
    if (isInputError(e)) return { field: e.field, message: e.message }
    throw e
  }
  throw new Error('expected an InputError')
}

function rng(seed: number) {
  let s = seed
  return () => (s = (s * 16807) % 2147483647) / 2147483647
}

/** Circumcentre of a triangle (closed form: the perpendicular bisectors' intersection). */
function circumcircle(a: [number, number], b: [number, number], c: [number, number]) {
  const d = 2 * (a[0] * (b[1] - c[1]) + b[0] * (c[1] - a[1]) + c[0] * (a[1] - b[1]))
  const a2 = a[0] ** 2 + a[1] ** 2, b2 = b[0] ** 2 + b[1] ** 2, c2 = c[0] ** 2 + c[1] ** 2
  const ux = (a2 * (b[1] - c[1]) + b2 * (c[1] - a[1]) + c2 * (a[1] - b[1])) / d
  const uy = (a2 * (c[0] - b[0]) + b2 * (a[0] - c[0]) + c2 * (b[0] - a[0])) / d
  return { center: [ux, uy], radius: Math.hypot(a[0] - ux, a[1] - uy) }
}

describe('least-squares circle through a ring\'s sites', () => {
  it('passes through three points: the circumcircle (closed form)', () => {
    const pts: [number, number][] = [[1.3, -0.4], [7.9, 2.2], [3.1, 6.6]]
    const want = circumcircle(pts[0]!, pts[1]!, pts[2]!)
    const fit = fitCircle(pts)
    expect(fit.center[0]).toBeCloseTo(want.center[0]!, 10)
    expect(fit.center[1]).toBeCloseTo(want.center[1]!, 10)
    expect(fit.radius_nm).toBeCloseTo(want.radius, 10)
    expect(fit.rms_nm).toBeLessThan(1e-10)
  })

  it('recovers the 48-atom, 7.13 nm ring exactly from points on the circle', () => {
    // Geometry of the published Fe ring on Cu(111) (Crommie, Lutz, Eigler, Science 262, 218 (1993)).
    const pts = Array.from({ length: 48 }, (_, k) => [12.5 + 7.13 * Math.cos(k * Math.PI / 24 + 0.1), 9.75 + 7.13 * Math.sin(k * Math.PI / 24 + 0.1)] as [number, number])
    const fit = fitCircle(pts)
    expect(fit.center[0]).toBeCloseTo(12.5, 10)
    expect(fit.center[1]).toBeCloseTo(9.75, 10)
    expect(fit.radius_nm).toBeCloseTo(7.13, 10)
    expect(fit.max_nm).toBeLessThan(1e-9)
  })

  it('minimises the geometric distances on a noisy short arc (optimality conditions and brute force)', () => {
    // A 100° arc with ±0.05 nm noise (fixed seed): the algebraic fit alone is biased here.
    const r = rng(11)
    const pts = Array.from({ length: 15 }, (_, k) => {
      const t = (k / 14) * (100 * Math.PI / 180)
      const rr = 4 + (r() - 0.5) * 0.1
      return [rr * Math.cos(t), rr * Math.sin(t)] as [number, number]
    })
    const fit = fitCircle(pts)
    const [cx, cy] = fit.center
    const d = pts.map(([x, y]) => Math.hypot(x - cx, y - cy))
    // Stationarity of Σ(dᵢ − R)²: R = mean dᵢ and Σ(dᵢ − R)(pᵢ − c)/dᵢ = 0 (closed form of the gradient).
    expect(fit.radius_nm).toBeCloseTo(d.reduce((a, b) => a + b) / d.length, 10)
    let gx = 0, gy = 0
    pts.forEach(([x, y], i) => {
      gx += (d[i]! - fit.radius_nm) * (x - cx) / d[i]!
      gy += (d[i]! - fit.radius_nm) * (y - cy) / d[i]!
    })
    expect(Math.abs(gx) + Math.abs(gy)).toBeLessThan(1e-10)
    // Brute force: no centre on a 41 × 41 grid of ±0.2 nm around it (with its best R) does better.
    const cost = (ax: number, ay: number) => {
      const dd = pts.map(([x, y]) => Math.hypot(x - ax, y - ay))
      const R = dd.reduce((a, b) => a + b) / dd.length
      return dd.reduce((s, v) => s + (v - R) ** 2, 0)
    }
    const best = cost(cx, cy)
    for (let i = -20; i <= 20; i++) for (let j = -20; j <= 20; j++) expect(cost(cx + i * 0.01, cy + j * 0.01)).toBeGreaterThanOrEqual(best - 1e-15)
    expect(fit.radius_nm).toBeGreaterThan(3.8)
    expect(fit.radius_nm).toBeLessThan(4.2)
  })

  it('refuses fewer than three sites and collinear sites, naming the field', () => {
    expect(inputError(() => fitCircle([[0, 0], [1, 1]])).field).toBe('sites')
    const line = inputError(() => fitCircle([[0, 0], [1, 1], [2, 2], [3, 3]]))
    expect(line.field).toBe('sites')
    expect(line.message).toMatch(/straight line/)
    expect(inputError(() => fitCircle([[0, 0], [1, Number.NaN], [2, 0]])).field).toBe('sites[1]')
  })
})

describe('axis of a chain', () => {
  it('finds direction, centre and spacing of a straight chain (closed form)', () => {
    // Au on NiAl(110): spacing 2.89 Å (Nilius, Wallis, Ho, Science 297, 1853 (2002)); 10 atoms at 30°.
    const a = 0.289
    const u = [Math.cos(Math.PI / 6), Math.sin(Math.PI / 6)]
    const pts = Array.from({ length: 10 }, (_, i) => [3 + (9 - i) * a * u[0]!, 4 + (9 - i) * a * u[1]!] as [number, number])
    const fit = fitChain(pts)
    expect(fit.atoms).toBe(10)
    expect(fit.spacing_nm).toBeCloseTo(a, 12)
    expect(fit.direction[0]).toBeCloseTo(u[0]!, 12)
    expect(fit.direction[1]).toBeCloseTo(u[1]!, 12)
    expect(fit.center[0]).toBeCloseTo(3 + 4.5 * a * u[0]!, 12)
    expect(fit.center[1]).toBeCloseTo(4 + 4.5 * a * u[1]!, 12)
    expect(fit.offAxis_rms_nm).toBeLessThan(1e-12)
    expect(fit.along_nm[0]).toBeCloseTo(-4.5 * a, 12)
  })

  it('points a vertical chain along +y and treats one atom as having no spacing', () => {
    const fit = fitChain([[1, 3], [1, 1], [1, 2]])
    expect(fit.direction[0]).toBeCloseTo(0, 12)
    expect(fit.direction[1]).toBeCloseTo(1, 12)
    expect(fit.spacing_nm).toBeCloseTo(1, 12)
    expect(fitChain([[2, 2]]).spacing_nm).toBeNull()
    expect(inputError(() => fitChain([])).field).toBe('sites')
  })
})
