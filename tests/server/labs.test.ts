// Labs, roles and samples against the built app: the one role guard answers 403 for a viewer who
// writes, 404 for another lab's data; the invite mail arrives at the fake SMTP server and its
// link joins the lab with the invited role; the last owner cannot leave.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client, linkIn, waitForMail } from '../helpers/client'

let app: RunningApp
let owner: Client
let labId: number
const sample = { name: 'AG-01', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 }

beforeAll(async () => {
  app = await startApp()
  owner = new Client(app.url)
  await owner.register('owner@lab.test', 'Olu Owner')
  const lab = await owner.post('/api/labs', { name: 'Basement STM' })
  expect(lab.status).toBe(201)
  labId = lab.body.id
})
afterAll(async () => {
  await app?.stop()
})

async function invite(email: string, role: string): Promise<string> {
  const res = await owner.post(`/api/labs/${labId}/invites`, { email, role })
  expect(res.status).toBe(201)
  const mail = await waitForMail(app.url, m => m.to.includes(email))
  expect(mail.subject).toContain('Basement STM')
  return linkIn(mail.text, '/invite').split('/invite/')[1]!
}

describe('labs and roles', () => {
  it('lists the caller\'s labs with their role', async () => {
    const res = await owner.get('/api/labs')
    expect(res.body).toEqual([{ id: labId, name: 'Basement STM', role: 'owner' }])
  })

  it('creates and lists samples with the contract fields', async () => {
    const created = await owner.post(`/api/labs/${labId}/samples`, sample)
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject(sample)
    const list = await owner.get(`/api/labs/${labId}/samples`)
    expect(list.body.map((s: { name: string }) => s.name)).toContain('AG-01')
    const bad = await owner.post(`/api/labs/${labId}/samples`, { ...sample, temperature_K: -3 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('temperature_K')
    const badSurface = await owner.post(`/api/labs/${labId}/samples`, { ...sample, surface: 'silver' })
    expect(badSurface.status).toBe(400)
    expect(badSurface.body.data.field).toBe('surface')
  })

  it('invites a viewer by e-mail; the link joins with that role; viewers read but cannot write', async () => {
    const token = await invite('vera@lab.test', 'viewer')
    const vera = new Client(app.url)
    const preview = await vera.get(`/api/invites/${token}`)
    expect(preview.body).toMatchObject({ lab: { name: 'Basement STM' }, role: 'viewer' })
    await vera.register('vera@lab.test', 'Vera Viewer')
    const accepted = await vera.post(`/api/invites/${token}/accept`)
    expect(accepted.body).toMatchObject({ lab_id: labId, role: 'viewer', joined: true })
    expect((await vera.get('/api/labs')).body).toEqual([{ id: labId, name: 'Basement STM', role: 'viewer' }])
    expect((await vera.get(`/api/labs/${labId}/samples`)).status).toBe(200)
    expect((await vera.post(`/api/labs/${labId}/samples`, sample)).status).toBe(403)
    expect((await vera.post(`/api/labs/${labId}/invites`, { email: 'x@lab.test' })).status).toBe(403)
    // The link works once.
    const again = await new Client(app.url).post(`/api/invites/${token}/accept`)
    expect(again.status).toBe(401)
    const other = new Client(app.url)
    await other.register('late@lab.test')
    const used = await other.post(`/api/invites/${token}/accept`)
    expect(used.status).toBe(400)
    expect(used.body.message).toMatch(/already been used/)
  })

  it('hides another lab\'s samples behind a 404', async () => {
    const stranger = new Client(app.url)
    await stranger.register('stranger@lab.test')
    const theirs = await stranger.post('/api/labs', { name: 'Other lab' })
    const theirSample = await stranger.post(`/api/labs/${theirs.body.id}/samples`, sample)
    expect((await owner.get(`/api/labs/${theirs.body.id}/samples`)).status).toBe(404)
    expect((await owner.get(`/api/labs/${theirs.body.id}/samples/${theirSample.body.id}`)).status).toBe(404)
    // Their sample through our lab's path is no better.
    expect((await owner.get(`/api/labs/${labId}/samples/${theirSample.body.id}`)).status).toBe(404)
    expect((await owner.patch(`/api/labs/${labId}/samples/${theirSample.body.id}`, { name: 'mine now' })).status).toBe(404)
  })

  it('changes roles, keeps the last owner, removes members', async () => {
    const token = await invite('mo@lab.test', 'member')
    const mo = new Client(app.url)
    const me = await mo.register('mo@lab.test', 'Mo Member')
    await mo.post(`/api/invites/${token}/accept`)
    expect((await mo.post(`/api/labs/${labId}/samples`, { ...sample, name: 'by member' })).status).toBe(201)
    expect((await mo.patch(`/api/labs/${labId}/members/${me.id}`, { role: 'owner' })).status).toBe(403)

    const ownerId = (await owner.get(`/api/labs/${labId}/members`)).body.me.user_id
    const leave = await owner.delete(`/api/labs/${labId}/members/${ownerId}`)
    expect(leave.status).toBe(400)
    expect(leave.body.message).toMatch(/last owner/)
    expect((await owner.patch(`/api/labs/${labId}/members/${ownerId}`, { role: 'member' })).status).toBe(400)

    expect((await owner.patch(`/api/labs/${labId}/members/${me.id}`, { role: 'viewer' })).body.role).toBe('viewer')
    expect((await mo.post(`/api/labs/${labId}/samples`, sample)).status).toBe(403)
    expect((await owner.patch(`/api/labs/${labId}/members/${me.id}`, { role: 'boss' })).status).toBe(400)
    expect((await owner.delete(`/api/labs/${labId}/members/${me.id}`)).status).toBe(200)
    expect((await mo.get(`/api/labs/${labId}/samples`)).status).toBe(404)
  })

  it('archives a sample without losing it', async () => {
    const created = await owner.post(`/api/labs/${labId}/samples`, { ...sample, name: 'to archive' })
    const id = created.body.id
    expect((await owner.patch(`/api/labs/${labId}/samples/${id}`, { archived: true })).status).toBe(200)
    const active = await owner.get(`/api/labs/${labId}/samples`)
    expect(active.body.some((s: { id: number }) => s.id === id)).toBe(false)
    const archived = await owner.get(`/api/labs/${labId}/samples?archived=1`)
    expect(archived.body.find((s: { id: number }) => s.id === id)?.name).toBe('to archive')
  })

  it('says plainly when an invitation was withdrawn', async () => {
    const res = await owner.post(`/api/labs/${labId}/invites`, { email: 'gone@lab.test', role: 'member' })
    const mail = await waitForMail(app.url, m => m.to.includes('gone@lab.test'))
    const token = linkIn(mail.text, '/invite').split('/invite/')[1]!
    expect((await owner.delete(`/api/labs/${labId}/invites/${res.body.id}`)).status).toBe(200)
    const looked = await new Client(app.url).get(`/api/invites/${token}`)
    expect(looked.status).toBe(400)
    expect(looked.body.message).toMatch(/withdrawn/)
  })
})
