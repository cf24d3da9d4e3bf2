// Lattice fits and blueprints through the API of the built app: a fit recovers a known
// registration from marks placed on a rotated Ag(111) lattice; blueprints save as versions, stale
// edits are refused, bad shapes are refused with the field named and nothing saved.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client } from '../helpers/client'

let app: RunningApp
let c: Client
let labId: number
let buildId: number
let scanId: number

// Ag(111): a = 4.09 Å (Ashcroft & Mermin Table 4.3), nearest-neighbour distance a/√2 (derived).
const nn = 0.409 / Math.SQRT2
const theta = (10 * Math.PI) / 180

beforeAll(async () => {
  app = await startApp()
  c = new Client(app.url)
  await c.register('fitter@lab.test')
  labId = (await c.post('/api/labs', { name: 'Fit lab' })).body.id
  const sample = (await c.post(`/api/labs/${labId}/samples`, { name: 'Ag', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
  buildId = (await c.post(`/api/labs/${labId}/samples/${sample.id}/builds`, { name: 'Ring' })).body.id
  scanId = (await c.upload(`/api/labs/${labId}/samples/${sample.id}/scans`, { name: 'flat.csv', data: '0,0\n0,0\n' }, { size_x_nm: 20, size_y_nm: 20, build_id: buildId })).body.id
})
afterAll(async () => {
  await app?.stop()
})

describe('lattice fit of a scan', () => {
  it('recovers the rotation of marks placed on fcc sites of a rotated lattice', async () => {
    // Marks on a 10°-rotated hexagonal lattice (fcc hollows), 3 nn apart, with origin (10.1, 9.7).
    const a1 = [nn * Math.cos(theta), nn * Math.sin(theta)]
    const a2 = [nn * Math.cos(theta + (2 * Math.PI) / 3), nn * Math.sin(theta + (2 * Math.PI) / 3)]
    const marks = []
    for (let i = -12; i <= 12; i += 3) {
      for (let j = -12; j <= 12; j += 3) marks.push({ x_nm: 10.1 + i * a1[0]! + j * a2[0]!, y_nm: 9.7 + i * a1[1]! + j * a2[1]! })
    }
    expect((await c.post(`/api/scans/${scanId}/marks`, { marks, base_version: 0 })).status).toBe(200)
    const res = await c.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'fit', surface: 'Ag(111)', site: 'fcc', affine: false })
    expect(res.status).toBe(201)
    const r = res.body.result
    // The rotation is reported within the face's symmetry range (±30° on (111)).
    expect(r.rotation_deg).toBeCloseTo(10, 3)
    expect(Math.hypot(...r.a1 as [number, number])).toBeCloseTo(nn, 6)
    expect(r.residual_nm).toBeLessThan(1e-6)
    expect(r.outliers).toEqual([])
  })

  it('locks the lattice; a locked lattice is not re-fitted', async () => {
    expect((await c.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'lock', locked: true })).body.locked).toBe(true)
    expect((await c.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'fit', surface: 'Ag(111)' })).status).toBe(409)
    const hand = await c.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1: [nn, 0], a2: [-nn / 2, nn * Math.sqrt(3) / 2], origin: [1, 1] })
    expect(hand.status).toBe(201)
    const parallel = await c.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1: [nn, 0], a2: [2 * nn, 0], origin: [1, 1] })
    expect(parallel.status).toBe(400)
    expect(parallel.body.data.field).toBe('a2')
    expect((await c.get(`/api/scans/${scanId}/lattice-fits`)).body.map((f: { version: number }) => f.version)).toEqual([3, 2, 1])
  })
})

describe('blueprints', () => {
  const ring = { type: 'ring', center: [0, 0], radius_nm: 2, n: 12 }
  const path = () => `/api/labs/${labId}/builds/${buildId}/blueprints`

  it('saves a blueprint, expands its sites, and keeps every version', async () => {
    const first = await c.post(path(), { name: 'Ring 12', surface: 'Ag(111)', shapes: [ring] })
    expect(first.status).toBe(201)
    expect(first.body).toMatchObject({ version: 1, site: 'fcc', site_count: 12 })
    const lineage = first.body.lineage
    const second = await c.post(path(), { name: 'Ring 12 + chain', surface: 'Ag(111)', shapes: [ring, { type: 'chain', start: [20, 0], direction: 0, count: 5, step: 2 }], lineage, base_version: 1 })
    expect(second.body).toMatchObject({ version: 2, lineage, site_count: 17 })
    const got = await c.get(`/api/blueprints/${second.body.id}`)
    expect(got.body.sites).toHaveLength(17)
    expect(got.body.versions.map((v: { version: number }) => v.version)).toEqual([2, 1])
    expect((await c.get(`/api/blueprints/${first.body.id}`)).body.sites).toHaveLength(12)
    const stale = await c.post(path(), { name: 'x', surface: 'Ag(111)', shapes: [ring], lineage, base_version: 1 })
    expect(stale.status).toBe(409)
    const list = await c.get(path())
    expect(list.body.map((b: { version: number }) => b.version)).toEqual([2])
  })

  it('refuses shapes that cannot be built, naming the field, and saves nothing', async () => {
    const before = (await c.get(path())).body.length
    const cases: [unknown, RegExp][] = [
      [{ ...ring, n: 2 }, /^shapes\.?\[?0\]?\.n|shapes\[0\]\.n/],
      [{ ...ring, radius_nm: 0.3 }, /radius_nm/],
      [{ type: 'ring', center: [0, 'x'], radius_nm: 2, n: 12 }, /shapes/],
    ]
    for (const [shape, field] of cases) {
      const res = await c.post(path(), { name: 'bad', surface: 'Ag(111)', shapes: [shape] })
      expect(res.status).toBe(400)
      expect(res.body.data.field).toMatch(field)
    }
    expect((await c.post(path(), { name: 'none', surface: 'Ag(111)', shapes: [] })).status).toBe(400)
    expect((await c.post(path(), { name: 'where', surface: 'Zz(999)', shapes: [ring] })).body.data.field).toBe('surface')
    expect((await c.get(path())).body.length).toBe(before)
  })
})
