// The wave preview's one stored setting: a sample's surface state (E0, m*, source), saved through
// the sample PATCH route by members and owners, refused for viewers (403) and for bad values
// (400 naming the field, nothing changed). Runs on the demo lab (TESSERA_DEMO=1).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client } from '../helpers/client'

let app: RunningApp
let owner: Client
let viewer: Client
let labId: number
let sampleId: number

beforeAll(async () => {
  app = await startApp({ TESSERA_DEMO: '1' })
  owner = new Client(app.url)
  viewer = new Client(app.url)
  expect((await owner.post('/api/auth/login', { email: 'demo@tessera.test', password: 'tessera-demo' })).status).toBe(200)
  expect((await viewer.post('/api/auth/login', { email: 'viewer@tessera.test', password: 'tessera-demo' })).status).toBe(200)
  labId = (await owner.get('/api/labs')).body[0].id
  sampleId = (await owner.get(`/api/labs/${labId}/samples`)).body.find((s: { surface: string }) => s.surface === 'Ag(111)').id
})
afterAll(async () => {
  await app?.stop()
})

const path = () => `/api/labs/${labId}/samples/${sampleId}`
// Ag(111) by tunnelling spectroscopy (Li et al., Phys. Rev. Lett. 1998, from memory).
const agState = { E0_eV: -0.067, m_eff: 0.42, source: 'own STS at 5 K; cf. Li et al., PRL 1998' }

describe('sample surface state', () => {
  it('is saved by an owner and read back with the sample and the build', async () => {
    const res = await owner.patch(path(), { surface_state: agState })
    expect(res.status).toBe(200)
    expect(res.body.surface_state).toEqual(agState)
    expect((await owner.get(path())).body.surface_state).toEqual(agState)
    const build = await owner.post(`${path()}/builds`, { name: 'Ring on Ag' })
    const info = await viewer.get(`/api/labs/${labId}/builds/${build.body.id}`)
    expect(info.body.sample.surface_state).toEqual(agState)
  })

  it('refuses a viewer with 403 and keeps the saved value', async () => {
    const res = await viewer.patch(path(), { surface_state: { E0_eV: -0.5, m_eff: 0.3 } })
    expect(res.status).toBe(403)
    expect((await viewer.get(path())).body.surface_state).toEqual(agState)
  })

  it('refuses m* ≤ 0, a missing E0 and a long source with the field named, changing nothing', async () => {
    const cases: [unknown, string][] = [
      [{ E0_eV: -0.44, m_eff: 0 }, 'surface_state.m_eff'],
      [{ E0_eV: -0.44, m_eff: -0.38 }, 'surface_state.m_eff'],
      [{ m_eff: 0.38 }, 'surface_state.E0_eV'],
      [{ E0_eV: 'low', m_eff: 0.38 }, 'surface_state.E0_eV'],
      [{ E0_eV: -0.44, m_eff: 0.38, source: 'x'.repeat(301) }, 'surface_state.source'],
    ]
    for (const [state, field] of cases) {
      const res = await owner.patch(path(), { surface_state: state })
      expect(res.status).toBe(400)
      expect(res.body.data.field).toBe(field)
    }
    expect((await owner.get(path())).body.surface_state).toEqual(agState)
  })

  it('clears with null', async () => {
    expect((await owner.patch(path(), { surface_state: null })).body.surface_state).toBeNull()
  })
})
