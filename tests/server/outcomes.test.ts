// Move success rates from the logbook through the API of the built app, against hand tallies:
// by outcome, by move length, by drag direction relative to the lattice and by bias; corrected
// entries count once; forecasts start at 30 attempts.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client } from '../helpers/client'
import { type Lab, makeBlueprint, makeLab, makeRoute, makeScan, NN, sitePos } from '../helpers/plan'

let app: RunningApp
let c: Client
let lab: Lab
let runId: number

beforeAll(async () => {
  app = await startApp()
  c = new Client(app.url)
  await c.register('stats@lab.test', 'Sol Stats')
  lab = await makeLab(c)
  const scanId = await makeScan(c, lab, [sitePos(0, 3), sitePos(4, 3), sitePos(8, 3)])
  const route = await makeRoute(c, await makeBlueprint(c, lab, [[0, 0], [4, 0], [8, 0]]), scanId)
  runId = (await c.post(`/api/routes/${route.id}/runs`, { params: { bias_V: -0.005, setpoint_A: 5e-8 } })).body.id
})
afterAll(async () => {
  await app?.stop()
})

const log = (body: Record<string, unknown>) => c.post(`/api/runs/${runId}/entries`, { idempotency_key: randomUUID(), ...body })

describe('lab success rates', () => {
  it('tallies effective entries by outcome, length, direction and bias (hand tally)', async () => {
    await log({ move_index: 0, outcome: 'stayed' })
    await log({ move_index: 0, outcome: 'stayed', params: { bias_V: -0.01 } })
    const wrong = (await log({ move_index: 0, outcome: 'lost' })).body.entry
    // The lost atom was really placed: the correction replaces it in the tallies.
    await log({ move_index: 0, outcome: 'placed', supersedes: wrong.id })
    await log({ move_index: 1, outcome: 'placed', params: { bias_V: -0.01 } })
    await log({ move_index: 2, outcome: 'skipped' })
    const s = (await c.get(`/api/labs/${lab.labId}/stats`)).body
    expect(s.counts).toEqual({ 'placed': 2, 'stayed': 2, 'off-site': 0, 'lost': 0, 'tip-change': 0, 'skipped': 1 })
    expect(s.attempts).toBe(4)
    expect(s.rate).toBeCloseTo(0.5, 12)
    // Every move drags 3 lattice steps straight along −a2: 3 × 0.2892 nm = 0.868 nm (0.5–1 nm bin).
    const bin = s.by_length.find((b: any) => b.attempts > 0)
    expect(bin).toMatchObject({ from_nm: 0.5, to_nm: 1, attempts: 4, placed: 2 })
    expect(3 * NN).toBeGreaterThan(0.5)
    // −a2 points at −60° from a1: a close-packed direction, 0° modulo the hexagonal 60°.
    expect(s.by_direction).toHaveLength(1)
    expect(s.by_direction[0].symmetry_deg).toBe(60)
    expect(s.by_direction[0].bins[0]).toMatchObject({ from_deg: 0, to_deg: 10, attempts: 4, placed: 2 })
    // Bias: the run's −5 mV unless the entry names its own.
    expect(s.by_bias.map((b: any) => [b.value, b.attempts, b.placed])).toEqual([[-0.01, 2, 1], [-0.005, 2, 1]])
    expect(s.by_setpoint.map((b: any) => [b.value, b.attempts])).toEqual([[5e-8, 4]])
    expect(s.enough).toBe(false)
  })

  it('filters by sample (another lab\'s sample is 404)', async () => {
    const other = (await c.post(`/api/labs/${lab.labId}/samples`, { name: 'CU-2', surface: 'Cu(111)', adsorbate: 'Fe', temperature_K: 4.3 })).body.id
    expect((await c.get(`/api/labs/${lab.labId}/stats?sample=${other}`)).body.attempts).toBe(0)
    expect((await c.get(`/api/labs/${lab.labId}/stats?sample=${lab.sampleId}`)).body.attempts).toBe(4)
    const stranger = new Client(app.url)
    await stranger.register('s@other.test')
    const theirs = await makeLab(stranger, 'Theirs')
    expect((await c.get(`/api/labs/${lab.labId}/stats?sample=${theirs.sampleId}`)).status).toBe(404)
    expect((await stranger.get(`/api/labs/${lab.labId}/stats`)).status).toBe(404)
  })

  it('forecasts the remaining moves once the lab has 30 attempts', async () => {
    const runs = (await c.get(`/api/labs/${lab.labId}/runs`)).body
    const route = (await c.get(`/api/runs/${runId}`)).body.route
    const second = (await c.post(`/api/routes/${route.id}/runs`, {})).body.id
    expect((await c.get(`/api/runs/${second}`)).body.forecast).toMatchObject({ enough: false, based_on_attempts: 4, expected_placed: null })
    for (let k = 0; k < 26; k++) await c.post(`/api/runs/${second}/entries`, { idempotency_key: randomUUID(), move_index: 0, outcome: 'tip-change' })
    const v = (await c.get(`/api/runs/${second}`)).body
    // 30 attempts, 2 placed: p = 1/15 for each of the 3 moves still to do; time planned ÷ p.
    expect(v.forecast.enough).toBe(true)
    expect(v.forecast.expected_placed).toBeCloseTo(3 / 15, 9)
    expect(v.forecast.expected_s).toBeCloseTo(v.forecast.planned_s * 15, 6)
    expect(runs[0]).toMatchObject({ id: runId, entries: 5, placed: 2 })
  })
})
