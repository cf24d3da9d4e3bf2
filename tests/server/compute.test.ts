// The stateless compute routes of the API contract through HTTP, against the built app (where they
// run in worker threads): contract fields, values against outside references, 400s naming the
// field, 401 without a session.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client } from '../helpers/client'

let app: RunningApp
let c: Client
beforeAll(async () => {
  app = await startApp()
  c = new Client(app.url)
  await c.register('calc@lab.test')
})
afterAll(async () => {
  await app?.stop()
})

describe('POST /api/compute/corral', () => {
  it('gives the hard-wall levels of the worked example', async () => {
    // Worked check (derived from E = E0 + (ħ²/2m*)(j/R)² with the A&S Table 9.5
    // zeros): E0 = −0.44 eV, m* = 0.38, R = 7.13 nm → E01 −0.4286, E11 −0.4110, E21 −0.3880,
    // E02 −0.3799 eV.
    const res = await c.post('/api/compute/corral', { shape: 'circle', radius_nm: 7.13, E0_eV: -0.44, m_eff: 0.38, levels: 4 })
    expect(res.status).toBe(200)
    const got = res.body.levels.map((l: { m: number, n: number, E_eV: number, degeneracy: number }) => [l.m, l.n, l.degeneracy, +l.E_eV.toFixed(4)])
    expect(got).toEqual([[0, 1, 1, -0.4286], [1, 1, 2, -0.411], [2, 1, 2, -0.388], [0, 2, 1, -0.3799]])
    expect(res.body.levels[0].j).toBeCloseTo(2.4048255577, 9)
  })

  it('returns a map of px² values over [−R, R]² and a spectrum when asked', async () => {
    const res = await c.post('/api/compute/corral', { shape: 'circle', radius_nm: 5, E0_eV: -0.44, m_eff: 0.38, broadening_eV: 0.01, bias_V: -0.3, map_px: 32 })
    expect(res.status).toBe(200)
    expect(res.body.map.px).toBe(32)
    expect(res.body.map.ldos).toHaveLength(32 * 32)
    expect(res.body.map.extent_nm).toEqual([-5, 5, -5, 5])
    expect(res.body.spectrum.E_eV.length).toBe(res.body.spectrum.ldos.length)
  })

  it('names the bad field', async () => {
    for (const [body, field] of [
      [{ shape: 'circle', radius_nm: 0, E0_eV: -0.44, m_eff: 0.38 }, 'radius_nm'],
      [{ shape: 'circle', radius_nm: 7, E0_eV: -0.44, m_eff: -1 }, 'm_eff'],
      [{ shape: 'circle', radius_nm: 7, E0_eV: -0.44, m_eff: 0.38, broadening_eV: 0 }, 'broadening_eV'],
      [{ shape: 'circle', radius_nm: 7, E0_eV: -0.44, m_eff: 0.38, bias_V: 0, map_px: 100000 }, 'map_px'],
    ] as const) {
      const res = await c.post('/api/compute/corral', body)
      expect(res.status).toBe(400)
      expect(res.body.data.field).toBe(field)
    }
  })
})

describe('POST /api/compute/check', () => {
  it('matches a hand-computed case: one displaced within tolerance, one missing, one extra', async () => {
    const sites = [[0, 0], [1, 0], [2, 0]]
    const found = [[0.03, 0.04], [1, 0], [5, 5]] // site 0 off by 0.05 nm, site 2 empty, one extra
    const res = await c.post('/api/compute/check', { sites, found, tolerance_nm: 0.1 })
    expect(res.status).toBe(200)
    expect(res.body.placed).toEqual([0, 1])
    expect(res.body.missing).toEqual([2])
    expect(res.body.extra).toEqual([2])
    // rms over placed sites = sqrt((0.05² + 0²) / 2) (hand computed)
    expect(res.body.rms_nm).toBeCloseTo(Math.sqrt(0.05 ** 2 / 2), 12)
    expect(res.body.fidelity).toBeCloseTo(2 / 3, 12)
  })

  it('refuses zero sites with the field named', async () => {
    const res = await c.post('/api/compute/check', { sites: [], found: [[0, 0]] })
    expect(res.status).toBe(400)
    expect(res.body.data.field).toBe('sites')
  })
})

describe('POST /api/compute/scattering', () => {
  it('tends to the clean surface far from a single scatterer', async () => {
    const res = await c.post('/api/compute/scattering', { scatterers: [[0, 0]], E0_eV: -0.44, m_eff: 0.38, point: [40, 0], spectrum_points: 5, spectrum_range_eV: [-0.3, 0.1] })
    expect(res.status).toBe(200)
    for (const v of res.body.spectrum.ldos) expect(Math.abs(v - 1)).toBeLessThan(0.05)
  })

  it('refuses scatterers on top of each other', async () => {
    const res = await c.post('/api/compute/scattering', { scatterers: [[0, 0], [0.01, 0]], E0_eV: -0.44, m_eff: 0.38, point: [1, 1] })
    expect(res.status).toBe(400)
    expect(res.body.data.field).toMatch(/^scatterers/)
  })
})

describe('POST /api/compute/route', () => {
  it('solves a small plan and keeps the contract fields', async () => {
    const res = await c.post('/api/compute/route', { atoms: [[0, 0], [10, 0], [3, 3]], sites: [[1, 0], [9, 0]] })
    expect(res.status).toBe(200)
    expect(res.body.assignment).toEqual(expect.arrayContaining([[0, 0], [1, 1]]))
    expect(res.body.unfilled_sites).toEqual([])
    expect(res.body.total_length_nm).toBeCloseTo(2, 9)
    expect(res.body.lower_bound_nm).toBeCloseTo(2, 9)
    for (const key of ['moves', 'solver_ms']) expect(res.body).toHaveProperty(key)
  })

  it('answers 400 naming the field for NaN-like and empty input', async () => {
    const bad = await c.post('/api/compute/route', { atoms: [[0, 'x']], sites: [[1, 1]] })
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toMatch(/^atoms/)
    const empty = await c.post('/api/compute/route', { atoms: [[0, 0]], sites: [] })
    expect(empty.status).toBe(400)
    expect(empty.body.data.field).toMatch(/^sites/)
    const neg = await c.post('/api/compute/route', { atoms: [[0, 0]], sites: [[1, 1]], clearance_nm: -1 })
    expect(neg.status).toBe(400)
    expect(neg.body.data.field).toBe('clearance_nm')
  })
})

it('needs a session for every compute route', async () => {
  const anon = new Client(app.url)
  for (const name of ['corral', 'check', 'scattering', 'route', 'chain']) expect((await anon.post(`/api/compute/${name}`, {})).status).toBe(401)
})
