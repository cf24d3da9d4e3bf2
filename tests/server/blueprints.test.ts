// Lattice fits and blueprints through the API of the built app: a fit recovers a known
// registration from marks placed on a rotated Ag(111) lattice; blueprints save as versions, stale
// edits are refused, bad shapes are refused with the field named and nothing saved; a chain that
// leaves the scan is refused when the scan is named; viewers read fits and blueprints but cannot
// save either.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client, linkIn, waitForMail } from '../helpers/client'

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
    // Parallel up to the rounding of typed digits (a2 = 2·a1 rounded to 5 decimals) counts as parallel too.
    const typed = (v: number) => +v.toFixed(5)
    const tilt = [nn * Math.cos(theta), nn * Math.sin(theta)]
    const nearly = await c.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1: tilt.map(typed), a2: tilt.map(v => typed(2 * v)), origin: [1, 1] })
    expect(nearly.status).toBe(400)
    expect(nearly.body.data.field).toBe('a2')
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

describe('blueprints placed on a scan', () => {
  const path = () => `/api/labs/${labId}/builds/${buildId}/blueprints`

  it('refuses a chain that leaves the scan (through its lattice fit), naming the count, and saves nothing', async () => {
    const before = (await c.get(path())).body.length
    // The scan is 20 × 20 nm; the latest fit (a hand placement, origin (1, 1), a1 along +x) puts
    // ideal site (0, 0) of the fcc type at (1, 1) nm. 80 atoms 2 nn apart along +x need 46 nm.
    const long = { type: 'chain', start: [0, 0], direction: 0, count: 80, step: 2 }
    const res = await c.post(path(), { name: 'too long', surface: 'Ag(111)', shapes: [long], scan_id: scanId })
    expect(res.status).toBe(400)
    expect(res.body.data.field).toBe('shapes[0].count')
    expect(res.body.message).toMatch(/leaves the scan/)
    expect((await c.get(path())).body.length).toBe(before)
    // 20 atoms need 20·2·nn ≈ 11.6 nm (nn = a/√2, a = 4.09 Å): inside, saved.
    const ok = await c.post(path(), { name: 'fits', surface: 'Ag(111)', shapes: [{ ...long, count: 20 }], scan_id: scanId })
    expect(ok.status).toBe(201)
    expect(ok.body.site_count).toBe(20)
    // Without a scan the same long chain is only a plan in the lattice frame and is accepted.
    expect((await c.post(path(), { name: 'anywhere', surface: 'Ag(111)', shapes: [long] })).status).toBe(201)
  })

  it('refuses a scan of another lab or without a lattice fit as scan_id', async () => {
    const sample = (await c.post(`/api/labs/${labId}/samples`, { name: 'Bare', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
    const bare = (await c.upload(`/api/labs/${labId}/samples/${sample.id}/scans`, { name: 'bare.csv', data: '0,0\n0,0\n' }, { size_x_nm: 10, size_y_nm: 10, build_id: buildId })).body.id
    const ring = { type: 'ring', center: [0, 0], radius_nm: 2, n: 12 }
    const none = await c.post(path(), { name: 'r', surface: 'Ag(111)', shapes: [ring], scan_id: bare })
    expect(none.status).toBe(400)
    expect(none.body.data.field).toBe('scan_id')
    const other = new Client(app.url)
    await other.register('elsewhere@lab.test')
    const otherLab = (await other.post('/api/labs', { name: 'Other' })).body.id
    const otherSample = (await other.post(`/api/labs/${otherLab}/samples`, { name: 'O', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
    const foreign = (await other.upload(`/api/labs/${otherLab}/samples/${otherSample.id}/scans`, { name: 'o.csv', data: '0,0\n0,0\n' }, { size_x_nm: 10, size_y_nm: 10 })).body.id
    expect((await c.post(path(), { name: 'r', surface: 'Ag(111)', shapes: [ring], scan_id: foreign })).body.data.field).toBe('scan_id')
  })

  it('lists fit versions with their author', async () => {
    const fits = (await c.get(`/api/scans/${scanId}/lattice-fits`)).body
    expect(fits[0]).toMatchObject({ version: 3, author: 'Test User' })
  })
})

describe('viewers', () => {
  it('see fits and blueprints but may not save a fit, a placement, a lock or a blueprint (403)', async () => {
    const inv = await c.post(`/api/labs/${labId}/invites`, { email: 'vic@lab.test', role: 'viewer' })
    expect(inv.status).toBe(201)
    const mail = await waitForMail(app.url, m => m.to.includes('vic@lab.test'))
    const token = linkIn(mail.text, '/invite').split('/invite/')[1]!
    const vic = new Client(app.url)
    await vic.register('vic@lab.test', 'Vic Viewer')
    expect((await vic.post(`/api/invites/${token}/accept`)).status).toBe(200)

    expect((await vic.get(`/api/scans/${scanId}/lattice-fits`)).status).toBe(200)
    expect((await vic.get(`/api/scans/${scanId}`)).body.lattice_fit.version).toBe(3)
    const list = await vic.get(`/api/labs/${labId}/builds/${buildId}/blueprints`)
    expect(list.status).toBe(200)
    expect((await vic.get(`/api/blueprints/${list.body[0].id}`)).status).toBe(200)

    const writes = [
      vic.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'fit', surface: 'Ag(111)' }),
      vic.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1: [nn, 0], a2: [-nn / 2, nn * Math.sqrt(3) / 2], origin: [1, 1] }),
      vic.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'lock', locked: false }),
      vic.post(`/api/labs/${labId}/builds/${buildId}/blueprints`, { name: 'x', surface: 'Ag(111)', shapes: [{ type: 'ring', center: [0, 0], radius_nm: 2, n: 12 }] }),
    ]
    for (const res of await Promise.all(writes)) expect(res.status).toBe(403)
    // Auth comes before validation: even a malformed body gets 403, not 400.
    expect((await vic.post(`/api/labs/${labId}/builds/${buildId}/blueprints`, { shapes: 'nope' })).status).toBe(403)
    expect((await c.get(`/api/scans/${scanId}/lattice-fits`)).body).toHaveLength(3)
  })
})

describe('refitting keeps the blueprint on its atoms', () => {
  it('anchors a refit to the previous origin, whatever marks were added', async () => {
    const c2 = new Client(app.url)
    await c2.register('refit@lab.test')
    const lab = (await c2.post('/api/labs', { name: 'Refit lab' })).body.id
    const sample = (await c2.post(`/api/labs/${lab}/samples`, { name: 'Ag', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
    const scan = (await c2.upload(`/api/labs/${lab}/samples/${sample.id}/scans`, { name: 'f.csv', data: '0,0\n0,0\n' }, { size_x_nm: 30, size_y_nm: 30 })).body.id
    // Marks on an unrotated Ag(111) lattice (nn = 0.409/√2 nm, Ashcroft & Mermin Table 4.3).
    const a1 = [nn, 0], a2 = [-nn / 2, (nn * Math.sqrt(3)) / 2]
    const at = (i: number, j: number) => ({ x_nm: 5 + i * a1[0]! + j * a2[0]!, y_nm: 5 + i * a1[1]! + j * a2[1]! })
    const first = Array.from({ length: 25 }, (_, k) => at((k % 5) * 3, Math.floor(k / 5) * 3))
    await c2.post(`/api/scans/${scan}/marks`, { marks: first, base_version: 0 })
    const fit1 = (await c2.post(`/api/scans/${scan}/lattice-fit`, { mode: 'fit', surface: 'Ag(111)', site: 'fcc', affine: false })).body.result
    // Many marks far to one side move the marks' centre by dozens of cells.
    const more = Array.from({ length: 60 }, (_, k) => at(40 + (k % 10) * 3, 30 + Math.floor(k / 10) * 3))
    await c2.post(`/api/scans/${scan}/marks`, { marks: [...first, ...more], base_version: 1 })
    const fit2 = (await c2.post(`/api/scans/${scan}/lattice-fit`, { mode: 'fit', surface: 'Ag(111)', site: 'fcc', affine: false })).body.result
    expect(Math.hypot(fit2.origin[0] - fit1.origin[0], fit2.origin[1] - fit1.origin[1])).toBeLessThan(0.01)
  })
})
