// A small plan through the API: a lab with an Ag(111) sample and a build, a flat scan with marks
// at given positions, a hand-placed lattice, a blueprint of single sites and a saved route. Site
// (i, j) of the hand lattice sits at origin + i·a1 + j·a2 in the scan frame.
import { expect } from 'vitest'
import { type Client, linkIn, waitForMail } from './client'

// Ag(111): a = 4.09 Å (Ashcroft & Mermin, Table 4.3); nearest-neighbour distance a/√2 (derived).
export const NN = 0.409 / Math.SQRT2
export const A1: [number, number] = [NN, 0]
export const A2: [number, number] = [-NN / 2, (NN * Math.sqrt(3)) / 2]
export const ORIGIN: [number, number] = [5, 5]

export const sitePos = (i: number, j: number): [number, number] => [ORIGIN[0] + i * A1[0] + j * A2[0], ORIGIN[1] + i * A1[1] + j * A2[1]]

export interface Lab { labId: number, sampleId: number, buildId: number }

export async function makeLab(c: Client, name = 'Night lab'): Promise<Lab> {
  const labId = (await c.post('/api/labs', { name })).body.id
  const sampleId = (await c.post(`/api/labs/${labId}/samples`, { name: 'AG-1', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body.id
  const buildId = (await c.post(`/api/labs/${labId}/samples/${sampleId}/builds`, { name: 'Chain of three' })).body.id
  return { labId, sampleId, buildId }
}

/** A 20 × 20 nm scan with marks at `atoms` and the hand lattice; returns its id. */
export async function makeScan(c: Client, lab: Lab, atoms: [number, number][], purpose: 'plan' | 'after' = 'plan', fit = true): Promise<number> {
  const up = await c.upload(`/api/labs/${lab.labId}/samples/${lab.sampleId}/scans`, { name: `${purpose}.csv`, data: '0,0,0\n0,0,0\n0,0,0\n' }, { size_x_nm: 20, size_y_nm: 20, build_id: lab.buildId, purpose })
  expect(up.status).toBe(201)
  const scanId = up.body.id
  expect((await c.post(`/api/scans/${scanId}/marks`, { marks: atoms.map(([x_nm, y_nm]) => ({ x_nm, y_nm })), base_version: 0 })).status).toBe(200)
  if (fit) expect((await c.post(`/api/scans/${scanId}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1: A1, a2: A2, origin: ORIGIN })).status).toBe(201)
  return scanId
}

export async function makeBlueprint(c: Client, lab: Lab, sites: [number, number][]): Promise<number> {
  const res = await c.post(`/api/labs/${lab.labId}/builds/${lab.buildId}/blueprints`, { name: 'Sites', surface: 'Ag(111)', site: 'fcc', shapes: [{ type: 'sites', sites }] })
  expect(res.status).toBe(201)
  return res.body.id
}

export async function makeRoute(c: Client, blueprintId: number, scanId?: number): Promise<any> {
  const res = await c.post(`/api/blueprints/${blueprintId}/routes`, scanId ? { scan_id: scanId } : {})
  expect(res.status).toBe(201)
  return res.body
}

/** Invites `email` into the lab with `role`, registers that user on `other` and accepts. */
export async function addMember(owner: Client, other: Client, base: string, labId: number, email: string, role: 'member' | 'viewer') {
  expect((await owner.post(`/api/labs/${labId}/invites`, { email, role })).status).toBe(201)
  const mail = await waitForMail(base, m => m.to.includes(email) && /invite/i.test(m.text))
  const token = linkIn(mail.text, '/invite').split('/invite/')[1]!
  await other.register(email, email.split('@')[0])
  expect((await other.post(`/api/invites/${token}/accept`)).status).toBe(200)
}
