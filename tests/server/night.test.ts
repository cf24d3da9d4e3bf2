// Build runs and the logbook through the API of the built app: runs start from a saved route,
// outcomes append in order (never changed: a correction supersedes), a retried request returns
// the entry it created, a stale view or a move that is not the current one is told to refresh,
// two operators logging at once lose nothing, and re-plans keep placed atoms and drop lost ones.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client } from '../helpers/client'
import { addMember, type Lab, makeBlueprint, makeLab, makeRoute, makeScan, sitePos } from '../helpers/plan'

let app: RunningApp
let owner: Client
let mo: Client
let vera: Client
let lab: Lab
let blueprintId: number
let route: any

// Three sites on a row of the lattice; five atoms three rows below (two of them spares).
const SITES: [number, number][] = [[0, 0], [4, 0], [8, 0]]
const ATOMS = [sitePos(0, 3), sitePos(4, 3), sitePos(8, 3), sitePos(2, -5), sitePos(14, -4)]
const key = () => randomUUID()

beforeAll(async () => {
  app = await startApp()
  owner = new Client(app.url)
  await owner.register('ines@lab.test', 'Ines Owner')
  lab = await makeLab(owner)
  mo = new Client(app.url)
  vera = new Client(app.url)
  await addMember(owner, mo, app.url, lab.labId, 'mo@lab.test', 'member')
  await addMember(owner, vera, app.url, lab.labId, 'vera@lab.test', 'viewer')
  const scanId = await makeScan(owner, lab, ATOMS)
  blueprintId = await makeBlueprint(owner, lab, SITES)
  route = await makeRoute(owner, blueprintId, scanId)
})
afterAll(async () => {
  await app?.stop()
})

async function startRun(c: Client = owner) {
  const res = await c.post(`/api/routes/${route.id}/runs`, { notes: 'tip fresh from Au field emission', params: { bias_V: -0.005, setpoint_A: 50e-9, tip_speed_nm_s: 2 } })
  expect(res.status).toBe(201)
  return res.body.id as number
}
const view = async (runId: number) => (await owner.get(`/api/runs/${runId}`)).body
const log = (c: Client, runId: number, body: Record<string, unknown>) => c.post(`/api/runs/${runId}/entries`, { idempotency_key: key(), ...body })

describe('starting a run', () => {
  it('starts from a saved route with who, when, notes and parameters; viewers may not', async () => {
    expect(route.move_count).toBe(3)
    const runId = await startRun(mo)
    const v = await view(runId)
    expect(v.run).toMatchObject({ state: 'open', route_id: route.id, current_route_id: route.id, started_by_name: 'mo', notes: 'tip fresh from Au field emission' })
    expect(v.run.params).toEqual({ bias_V: -0.005, setpoint_A: 50e-9, tip_speed_nm_s: 2 })
    expect(v.state).toMatchObject({ current_move: 0, moves_total: 3, last_seq: 0 })
    // The route assigns each of the three nearest atoms to the site straight above it (3 rows).
    expect(v.route.moves.map((m: any) => [m.atom, m.site]).sort()).toEqual([[0, 0], [1, 1], [2, 2]])
    expect(v.frame).toMatchObject({ size_x_nm: 20, offset_x_nm: 0, rotation_deg: 0 })
    expect((await vera.post(`/api/routes/${route.id}/runs`, {})).status).toBe(403)
    expect((await new Client(app.url).post(`/api/routes/${route.id}/runs`, {})).status).toBe(401)
  })

  it('refuses a route of another lab (404) and bad parameters (400 naming the field)', async () => {
    const stranger = new Client(app.url)
    await stranger.register('x@other.test')
    const res = await stranger.post(`/api/routes/${route.id}/runs`, {})
    expect(res.status).toBe(404)
    expect(res.body.message).toMatch(/No such route/)
    const bad = await owner.post(`/api/routes/${route.id}/runs`, { params: { bias_V: 40 } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('params.bias_V')
    const list = await owner.get(`/api/labs/${lab.labId}/runs?build=${lab.buildId}`)
    expect(list.body.map((r: any) => r.route_id)).toEqual([route.id])
  })
})

describe('the logbook', () => {
  it('advances only on a finishing outcome and refuses a move that is not the current one', async () => {
    const runId = await startRun()
    expect((await log(owner, runId, { move_index: 0, outcome: 'stayed', params: { bias_V: -0.006 } })).status).toBe(201)
    expect((await view(runId)).state.current_move).toBe(0)
    expect((await log(owner, runId, { move_index: 0, outcome: 'placed' })).status).toBe(201)
    const ahead = await log(owner, runId, { move_index: 2, outcome: 'placed' })
    expect(ahead.status).toBe(409)
    expect(ahead.body.message).toMatch(/not the current move \(move 2 is\)/)
    expect(ahead.body.data.current_move).toBe(1)
    expect((await log(owner, runId, { move_index: 0, outcome: 'placed' })).status).toBe(409)
    const v = await view(runId)
    expect(v.entries.map((e: any) => [e.seq, e.move_index, e.outcome, e.author])).toEqual([[1, 0, 'stayed', 'Ines Owner'], [2, 0, 'placed', 'Ines Owner']])
    expect(v.entries[0].params).toEqual({ bias_V: -0.006 })
    expect(v.state.counts).toMatchObject({ stayed: 1, placed: 1 })
  })

  it('returns the same entry for a retried request (200) and refuses a reused key for another entry', async () => {
    const runId = await startRun()
    const body = { move_index: 0, outcome: 'tip-change', note: 'double-clicked', idempotency_key: 'retry-key-0001' }
    const first = await owner.post(`/api/runs/${runId}/entries`, body)
    const again = await owner.post(`/api/runs/${runId}/entries`, body)
    expect([first.status, again.status]).toEqual([201, 200])
    expect(again.body.entry.id).toBe(first.body.entry.id)
    const other = await owner.post(`/api/runs/${runId}/entries`, { ...body, outcome: 'placed' })
    expect(other.status).toBe(409)
    expect(other.body.data.field).toBe('idempotency_key')
    expect((await view(runId)).entries).toHaveLength(1)
  })

  it('tells a stale view to refresh and logs nothing', async () => {
    const runId = await startRun()
    await log(owner, runId, { move_index: 0, outcome: 'stayed', expected_seq: 0 })
    const stale = await log(mo, runId, { move_index: 0, outcome: 'placed', expected_seq: 0 })
    expect(stale.status).toBe(409)
    expect(stale.body.message).toMatch(/1 entry you have not seen yet/)
    expect((await log(mo, runId, { move_index: 0, outcome: 'placed', expected_seq: 1 })).status).toBe(201)
    expect((await view(runId)).entries.map((e: any) => e.outcome)).toEqual(['stayed', 'placed'])
  })

  it('corrects by superseding: the original entry stays as it was; a second correction of it is refused', async () => {
    const runId = await startRun()
    const placed = (await log(owner, runId, { move_index: 0, outcome: 'placed' })).body.entry
    await log(owner, runId, { move_index: 1, outcome: 'placed' })
    const before = (await view(runId)).entries[0]
    const fix = await log(mo, runId, { move_index: 0, outcome: 'off-site', position: [6, 4.2], supersedes: placed.id, note: 'rescan shows it one site over' })
    expect(fix.status).toBe(201)
    const v = await view(runId)
    const { superseded_by, ...original } = v.entries[0]
    const { superseded_by: _b, ...originalBefore } = before
    expect(original).toEqual(originalBefore)
    expect(superseded_by).toBe(fix.body.entry.id)
    expect(v.entries.map((e: any) => e.seq)).toEqual([1, 2, 3])
    expect(v.state.counts).toMatchObject({ 'placed': 1, 'off-site': 1 })
    const atom = v.route.moves[0].atom_id
    expect(v.state.atoms.find((a: any) => a.atom === atom).position).toEqual([6, 4.2])
    const twice = await log(owner, runId, { move_index: 0, outcome: 'lost', supersedes: placed.id })
    expect(twice.status).toBe(409)
    expect(twice.body.message).toMatch(/already corrected by entry 3/)
    const wrongMove = await log(owner, runId, { move_index: 1, outcome: 'lost', supersedes: fix.body.entry.id })
    expect(wrongMove.status).toBe(400)
    expect(wrongMove.body.data.field).toBe('move_index')
    expect((await view(runId)).entries).toHaveLength(3)
  })

  it('refuses bad entries with the field named, viewers with 403, and changes nothing', async () => {
    const runId = await startRun()
    const cases: [Record<string, unknown>, string][] = [
      [{ move_index: 0, outcome: 'off-site' }, 'position'],
      [{ move_index: 0, outcome: 'placed', position: [1, 2] }, 'position'],
      [{ move_index: 0, outcome: 'vanished' }, 'outcome'],
      [{ move_index: -1, outcome: 'placed' }, 'move_index'],
      [{ move_index: 0, outcome: 'placed', params: { voltage: 3 } }, 'params'],
      [{ move_index: 0, outcome: 'placed', supersedes: 999999 }, 'supersedes'],
    ]
    for (const [body, field] of cases) {
      const res = await log(owner, runId, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.data.field).toBe(field)
    }
    expect((await owner.post(`/api/runs/${runId}/entries`, { move_index: 0, outcome: 'placed' })).body.data.field).toBe('idempotency_key')
    expect((await log(vera, runId, { move_index: 0, outcome: 'placed' })).status).toBe(403)
    expect((await log(new Client(app.url), runId, { move_index: 0, outcome: 'placed' })).status).toBe(401)
    expect((await view(runId)).entries).toHaveLength(0)
  })
})

describe('two operators on one run', () => {
  it('keeps every entry of many parallel requests, in order, none duplicated, seq contiguous', async () => {
    const runId = await startRun()
    // 2 operators × 15 tip-change entries, each request sent twice at once (a double click).
    const requests = []
    for (let k = 0; k < 15; k++) {
      for (const c of [owner, mo]) {
        const body = { move_index: 0, outcome: 'tip-change', idempotency_key: key(), note: `k${k}` }
        requests.push(c.post(`/api/runs/${runId}/entries`, body), c.post(`/api/runs/${runId}/entries`, body))
      }
    }
    const res = await Promise.all(requests)
    expect(res.every(r => r.status === 200 || r.status === 201)).toBe(true)
    expect(res.filter(r => r.status === 201)).toHaveLength(30)
    const v = await view(runId)
    expect(v.entries).toHaveLength(30)
    expect(v.entries.map((e: any) => e.seq)).toEqual(Array.from({ length: 30 }, (_, i) => i + 1))
    expect(new Set(v.entries.map((e: any) => e.idempotency_key)).size).toBe(30)
    expect(v.entries.filter((e: any) => e.author === 'mo')).toHaveLength(15)
  })

  it('lets only one of several simultaneous "placed" for the same move through; the rest are told to refresh', async () => {
    const runId = await startRun()
    const res = await Promise.all(Array.from({ length: 8 }, (_, k) => log(k % 2 ? mo : owner, runId, { move_index: 0, outcome: 'placed' })))
    expect(res.filter(r => r.status === 201)).toHaveLength(1)
    expect(res.filter(r => r.status === 409)).toHaveLength(7)
    const v = await view(runId)
    expect(v.entries).toHaveLength(1)
    expect(v.state.current_move).toBe(1)
  })
})

describe('re-planning from the logbook', () => {
  it('after off-site: placed atoms keep their sites, the off-site atom starts where it went', async () => {
    const runId = await startRun()
    let v = await view(runId)
    const [m0, m1] = v.route.moves
    await log(owner, runId, { move_index: 0, outcome: 'placed' })
    const went = sitePos(m1.site * 4 + 2, 1)
    await log(owner, runId, { move_index: 1, outcome: 'off-site', position: went })
    v = await view(runId)
    expect(v.state.needs_replan.message).toMatch(/ended off-site/)
    const res = await owner.post(`/api/runs/${runId}/replan`, { expected_seq: 2 })
    expect(res.status).toBe(200)
    v = res.body
    expect(v.run.current_route_id).not.toBe(route.id)
    expect(v.route.parent_id).toBe(route.id)
    expect(v.history.map((h: any) => h.source)).toEqual(['plan', 'replan'])
    // The placed atom is not moved again; the off-site atom begins at the clicked position.
    expect(v.route.moves.map((m: any) => m.atom_id)).not.toContain(m0.atom_id)
    const k = v.route.atom_ids.indexOf(m1.atom_id)
    expect(v.route.atoms[k]).toEqual(went)
    expect(new Set(v.route.moves.map((m: any) => m.site))).toEqual(new Set([m1.site, 3 - m0.site - m1.site]))
    expect(v.state).toMatchObject({ current_move: 0, needs_replan: null, last_seq: 2 })
    expect(v.state.placed).toEqual([[m0.site, m0.atom_id]])
  })

  it('after lost: the lost atom is not used; a stale re-plan is refused', async () => {
    const runId = await startRun()
    const v0 = await view(runId)
    const m0 = v0.route.moves[0]
    await log(owner, runId, { move_index: 0, outcome: 'lost', note: 'jumped to the tip' })
    expect((await owner.post(`/api/runs/${runId}/replan`, { expected_seq: 0 })).status).toBe(409)
    const v = (await owner.post(`/api/runs/${runId}/replan`, {})).body
    expect(v.route.atom_ids).not.toContain(m0.atom_id)
    expect(v.route.atom_ids).toHaveLength(4)
    expect(v.route.moves.map((m: any) => m.atom_id)).not.toContain(m0.atom_id)
    // All three sites are still to be filled, now with a spare for the lost atom.
    expect(v.route.moves.map((m: any) => m.site).sort()).toEqual([0, 1, 2])
    expect(v.route.unfilled_sites).toEqual([])
    // An entry for a move of the old plan is told to refresh.
    const old = await log(owner, runId, { move_index: 0, outcome: 'placed', route_id: route.id })
    expect(old.status).toBe(409)
    expect(old.body.message).toMatch(/re-planned meanwhile/)
  })

  it('from a newer scan: its marks replace the positions; sites already filled stay', async () => {
    const runId = await startRun()
    // The newer scan finds site 0 filled, the rest of the atoms as before.
    const scanId = await makeScan(owner, lab, [sitePos(0, 0), ATOMS[1]!, ATOMS[2]!, ATOMS[3]!])
    const v = (await owner.post(`/api/runs/${runId}/replan`, { scan_id: scanId })).body
    expect(v.history.at(-1)).toMatchObject({ source: 'scan', scan_id: scanId })
    expect(v.state.placed).toEqual([[0, 0]])
    expect(v.route.moves.map((m: any) => m.site).sort()).toEqual([1, 2])
    const noFit = await makeScan(owner, lab, [sitePos(1, 1)], 'plan', false)
    const res = await owner.post(`/api/runs/${runId}/replan`, { scan_id: noFit })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/no lattice fit/)
  })
})

describe('closing a run', () => {
  it('mails the night summary to the members and refuses further entries', async () => {
    const runId = await startRun()
    await log(owner, runId, { move_index: 0, outcome: 'placed' })
    await log(owner, runId, { move_index: 1, outcome: 'stayed' })
    const bad = await owner.post(`/api/runs/${runId}/close`, { picture_png: Buffer.from('not a png').toString('base64') })
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('picture_png')
    const res = await owner.post(`/api/runs/${runId}/close`, { note: 'ring half done, tip blunt' })
    expect(res.status).toBe(200)
    expect(res.body.run.state).toBe('closed')
    expect(res.body.mail).toMatchObject({ sent: true, to: 3 })
    const mail = (await (await fetch(`${app.url}/api/dev/outbox`)).json() as any[]).find(m => m.subject.startsWith('Night summary') && m.text.includes(`Run ${runId}:`))
    expect(mail.to.sort()).toEqual(['ines@lab.test', 'mo@lab.test', 'vera@lab.test'])
    expect(mail.text).toMatch(/placed 1 · stayed 1 · off-site 0/)
    expect(mail.text).toMatch(/ring half done/)
    expect(mail.text).toContain(`/labs/${lab.labId}/runs/${runId}/report`)
    const after = await log(owner, runId, { move_index: 1, outcome: 'placed' })
    expect(after.status).toBe(409)
    expect(after.body.message).toMatch(/closed/)
    expect((await owner.post(`/api/runs/${runId}/close`, {})).status).toBe(409)
  })
  it('attaches the as-built overlay: the client\'s PNG as sent, else one drawn by the server', async () => {
    const after = await makeScan(owner, lab, [sitePos(0, 0), sitePos(4, 0), ATOMS[2]!], 'after')
    const outbox = async (runId: number) => (await (await fetch(`${app.url}/api/dev/outbox`)).json() as any[]).find(m => m.text.includes(`Run ${runId}:`))
    const drawn = await startRun()
    await log(owner, drawn, { move_index: 0, outcome: 'placed' })
    const check = await owner.post(`/api/blueprints/${blueprintId}/checks`, { scan_id: after, run_id: drawn })
    expect(check.status).toBe(201)
    // Hand count: sites 0 and 1 hold an atom, site 2 does not (its atom still sits 3 rows away).
    expect(check.body.fidelity).toBeCloseTo(2 / 3, 12)
    expect((await owner.post(`/api/runs/${drawn}/close`, {})).body.mail.to).toBe(3)
    const m1 = await outbox(drawn)
    expect(m1.text).toMatch(/fidelity 66\.7 % \(2 of 3 sites placed\)/)
    expect(m1.attachments).toEqual([expect.objectContaining({ filename: `run-${drawn}-overlay.png`, contentType: 'image/png' })])
    expect(m1.attachments[0].size).toBeGreaterThan(1000)
    const sent = await startRun()
    // A 1 × 1 PNG (the smallest valid one), as the client would send its own rendering.
    const png = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg=='
    expect((await owner.post(`/api/runs/${sent}/close`, { picture_png: `data:image/png;base64,${png}` })).status).toBe(200)
    const m2 = await outbox(sent)
    expect(m2.attachments[0].size).toBe(Buffer.from(png, 'base64').length)
    const list = (await owner.get(`/api/labs/${lab.labId}/runs`)).body
    expect(list.find((r: any) => r.id === drawn).fidelity).toBeCloseTo(2 / 3, 12)
  })
})
