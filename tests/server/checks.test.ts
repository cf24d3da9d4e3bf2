// As-built checks through the API of the built app, against hand-computed cases: a site with its
// atom exactly on it, one displaced within the tolerance, one displaced beyond it (off-site, with
// the offset), one missing, an extra atom, and the tolerance edge. Bad input: an after-scan with
// no lattice fit, a blueprint of 0 sites, a scan of another lab.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client } from '../helpers/client'
import { type Lab, makeBlueprint, makeLab, makeScan, sitePos } from '../helpers/plan'

let app: RunningApp
let c: Client
let lab: Lab
let blueprintId: number
const SITES: [number, number][] = [[0, 0], [4, 0], [8, 0], [12, 0]]
const shift = (p: [number, number], dx: number, dy = 0): [number, number] => [p[0] + dx, p[1] + dy]

beforeAll(async () => {
  app = await startApp()
  c = new Client(app.url)
  await c.register('checker@lab.test', 'Cleo Checker')
  lab = await makeLab(c)
  blueprintId = await makeBlueprint(c, lab, SITES)
})
afterAll(async () => {
  await app?.stop()
})

const check = (body: Record<string, unknown>) => c.post(`/api/blueprints/${blueprintId}/checks`, body)

describe('as-built check', () => {
  it('sorts sites into placed, off-site (with the offset) and missing; RMS and fidelity by hand', async () => {
    const found = [sitePos(0, 0), shift(sitePos(4, 0), 0.03, -0.04), shift(sitePos(8, 0), 0.3), [17, 17] as [number, number]]
    const scanId = await makeScan(c, lab, found, 'after')
    const res = await check({ scan_id: scanId })
    expect(res.status).toBe(201)
    const r = res.body.result
    expect(r.site_status).toEqual(['placed', 'placed', 'off-site', 'missing'])
    expect(r.placed).toEqual([0, 1])
    expect(r.missing).toEqual([2, 3])
    expect(r.extra).toEqual([2, 3])
    expect(r.off_site).toHaveLength(1)
    expect(r.off_site[0].site).toBe(2)
    expect(r.off_site[0].offset[0]).toBeCloseTo(0.3, 9)
    expect(r.off_site[0].offset[1]).toBeCloseTo(0, 9)
    // Hand computation: deviations 0 and √(0.03² + 0.04²) = 0.05 nm; RMS = √((0 + 0.05²)/2).
    expect(res.body.rms_nm).toBeCloseTo(Math.sqrt(0.0025 / 2), 9)
    expect(res.body.fidelity).toBe(0.5)
    expect(res.body.tolerance_nm).toBe(0.1)
    expect(r.sites[1][0]).toBeCloseTo(sitePos(4, 0)[0], 9)
    const list = await c.get(`/api/labs/${lab.labId}/checks?build=${lab.buildId}`)
    expect(list.body.map((x: any) => x.id)).toContain(res.body.id)
    expect((await c.get(`/api/checks/${res.body.id}`)).body.scan.purpose).toBe('after')
  })

  it('counts an atom exactly at the tolerance as placed, and just beyond it as off-site', async () => {
    const scanId = await makeScan(c, lab, [shift(sitePos(0, 0), 0.1), sitePos(4, 0), sitePos(8, 0), sitePos(12, 0)], 'after')
    const at = await check({ scan_id: scanId, tolerance_nm: 0.1 })
    expect(at.body.result.site_status[0]).toBe('placed')
    expect(at.body.fidelity).toBe(1)
    // RMS by hand: one deviation of 0.1 nm and three of 0 → √(0.01/4) = 0.05 nm.
    expect(at.body.rms_nm).toBeCloseTo(0.05, 9)
    const below = await check({ scan_id: scanId, tolerance_nm: 0.099 })
    expect(below.body.result.site_status[0]).toBe('off-site')
    expect(below.body.fidelity).toBe(0.75)
  })

  it('refuses an after-scan with no lattice fit, a blueprint with 0 sites, and scans it cannot see', async () => {
    const before = (await c.get(`/api/labs/${lab.labId}/checks`)).body.length
    const noFit = await makeScan(c, lab, [sitePos(0, 0)], 'after', false)
    const res = await check({ scan_id: noFit })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/after-scan has no lattice fit/)
    expect(res.body.data.field).toBe('scan_id')
    // A blueprint of 0 sites cannot even be saved; the stateless check refuses 0 sites as well.
    const empty = await c.post(`/api/labs/${lab.labId}/builds/${lab.buildId}/blueprints`, { name: 'Nothing', surface: 'Ag(111)', site: 'fcc', shapes: [{ type: 'sites', sites: [] }] })
    expect(empty.status).toBe(400)
    expect(empty.body.message).toMatch(/no sites/)
    const zero = await c.post('/api/compute/check', { sites: [], found: [[1, 1]] })
    expect(zero.status).toBe(400)
    expect(zero.body.message).toMatch(/0 sites/)
    const other = new Client(app.url)
    await other.register('else@other.test')
    const otherLab = await makeLab(other, 'Other lab')
    const foreign = await makeScan(other, otherLab, [sitePos(0, 0)], 'after')
    expect((await check({ scan_id: foreign })).status).toBe(404)
    expect((await other.post(`/api/blueprints/${blueprintId}/checks`, { scan_id: foreign })).status).toBe(404)
    expect((await check({})).body.data.field).toBe('scan_id')
    expect((await check({ scan_id: noFit, tolerance_nm: -1 })).body.data.field).toBe('tolerance_nm')
    expect((await c.get(`/api/labs/${lab.labId}/checks`)).body.length).toBe(before)
  })
})

describe('after-scan registered to the planning scan', () => {
  it('finds every site although the after-scan drifted and its fit chose another origin site', async () => {
    // Hand-computed case: the after-scan drifted by (0.7, −0.4) nm and its lattice origin was put
    // on site (2, 1) of the plan's lattice; the check must carry the blueprint back onto its atoms.
    const lab2 = await makeLab(c, 'Drift lab')
    const bp = await makeBlueprint(c, lab2, SITES)
    const spectators: [number, number][] = [[1, 18], [18, 17], [17, 2], [3, 12], [12, 15]]
    const movers: [number, number][] = [[2, 9], [6, 10], [10, 11], [14, 12]]
    const plan = await makeScan(c, lab2, [...spectators, ...movers])
    expect((await c.post(`/api/blueprints/${bp}/routes`, { scan_id: plan })).status).toBe(201)
    const drift: [number, number] = [0.7, -0.4]
    const moved = (p: [number, number]): [number, number] => [p[0] + drift[0], p[1] + drift[1]]
    const after = [...spectators.map(moved), ...SITES.map(([i, j]) => moved(sitePos(i, j)))]
    const up = await c.upload(`/api/labs/${lab2.labId}/samples/${lab2.sampleId}/scans`, { name: 'after.csv', data: '0,0\n0,0\n' }, { size_x_nm: 20, size_y_nm: 20, build_id: lab2.buildId, purpose: 'after' })
    await c.post(`/api/scans/${up.body.id}/marks`, { marks: after.map(([x_nm, y_nm]) => ({ x_nm, y_nm })), base_version: 0 })
    const origin = moved(sitePos(2, 1))
    expect((await c.post(`/api/scans/${up.body.id}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1: sitePos(1, 0).map((v, k) => v - sitePos(0, 0)[k]!), a2: sitePos(0, 1).map((v, k) => v - sitePos(0, 0)[k]!), origin })).status).toBe(201)
    const res = await c.post(`/api/blueprints/${bp}/checks`, { scan_id: up.body.id })
    expect(res.status).toBe(201)
    expect(res.body.fidelity).toBe(1)
    expect(res.body.result.registration.shift).toEqual([-2, -1])
    expect(res.body.result.registration.drift_nm[0]).toBeCloseTo(0.7, 3)
  })
})

describe('route on another plan scan than the one the blueprint was drawn on', () => {
  it('carries the sites to the same atoms of the substrate (drift and origin site handled)', async () => {
    // Hand-computed: the second scan drifted by (−0.5, 0.3) nm and its lattice origin sits on site
    // (3, −1) of the first scan's lattice; the sites must come out at the drifted positions.
    const lab3 = await makeLab(c, 'Second-scan lab')
    const spectators: [number, number][] = [[1, 18], [18, 17], [17, 2], [3, 12], [12, 15], [15, 9]]
    const first = await makeScan(c, lab3, spectators)
    const bp = (await c.post(`/api/labs/${lab3.labId}/builds/${lab3.buildId}/blueprints`, { name: 'Sites', surface: 'Ag(111)', site: 'fcc', shapes: [{ type: 'sites', sites: SITES }], scan_id: first })).body
    expect(bp.scan_id).toBe(first)
    const drift: [number, number] = [-0.5, 0.3]
    const moved = (p: [number, number]): [number, number] => [p[0] + drift[0], p[1] + drift[1]]
    const up = await c.upload(`/api/labs/${lab3.labId}/samples/${lab3.sampleId}/scans`, { name: 'second.csv', data: '0,0\n0,0\n' }, { size_x_nm: 20, size_y_nm: 20, build_id: lab3.buildId })
    await c.post(`/api/scans/${up.body.id}/marks`, { marks: spectators.map(moved).map(([x_nm, y_nm]) => ({ x_nm, y_nm })), base_version: 0 })
    const d = (i: number, j: number) => sitePos(i, j).map((v, k) => v - sitePos(0, 0)[k]!)
    expect((await c.post(`/api/scans/${up.body.id}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1: d(1, 0), a2: d(0, 1), origin: moved(sitePos(3, -1)) })).status).toBe(201)
    const route = await c.post(`/api/blueprints/${bp.id}/routes`, { scan_id: up.body.id })
    expect(route.status).toBe(201)
    route.body.result.sites.forEach((p: [number, number], k: number) => {
      const want = moved(sitePos(SITES[k]![0], SITES[k]![1]))
      expect(Math.hypot(p[0] - want[0], p[1] - want[1])).toBeLessThan(1e-6)
    })
  })
})
