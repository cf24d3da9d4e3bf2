// Saved routes through the API of the built app (solves run in its worker pool): solve from a
// scan's marks and a blueprint through the scan's lattice fit, list and open, re-plan keeping
// placed atoms, progress as server-sent events, roles, other labs, bad input, and a long solve
// that does not hold up other requests.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client, linkIn, waitForMail } from '../helpers/client'
import { rng } from '../unit/route/gen'

type P = [number, number]
let app: RunningApp
let owner: Client
let viewer: Client
let stranger: Client
let labId: number, sampleId: number, buildId: number, scanId: number, blueprintId: number

// Ag(111): a = 4.09 Å (Ashcroft & Mermin Table 4.3), nearest-neighbour distance a/√2 (derived).
const nn = 0.409 / Math.SQRT2
const a1: P = [nn, 0]
const a2: P = [-nn / 2, (nn * Math.sqrt(3)) / 2]
const origin: P = [10, 10]
const at = (i: number, j: number): P => [origin[0] + i * a1[0] + j * a2[0], origin[1] + i * a1[1] + j * a2[1]]
// Six adatoms on fcc sites (i, j) of the registered lattice, well apart and away from the chain.
const atomSites: P[] = [[0, 10], [4, 10], [8, 10], [12, 10], [16, 14], [-6, -8]]
const atoms = atomSites.map(([i, j]) => at(i, j))

async function newScan(name: string) {
  return (await owner.upload(`/api/labs/${labId}/samples/${sampleId}/scans`, { name, data: '0,0\n0,0\n' }, { size_x_nm: 20, size_y_nm: 20, build_id: buildId })).body.id as number
}
async function fitByHand(id: number) {
  const res = await owner.post(`/api/scans/${id}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1, a2, origin })
  expect(res.status).toBe(201)
}
async function putMarks(id: number, pts: P[], base = 0) {
  const res = await owner.post(`/api/scans/${id}/marks`, { marks: pts.map(([x_nm, y_nm]) => ({ x_nm, y_nm })), base_version: base })
  expect(res.status).toBe(200)
}
async function saveBlueprint(shapes: unknown[], name = 'Chain') {
  const res = await owner.post(`/api/labs/${labId}/builds/${buildId}/blueprints`, { name, surface: 'Ag(111)', shapes })
  expect(res.status).toBe(201)
  return res.body.id as number
}

/** Reads a server-sent-event answer event by event, as a browser would. */
function eventsOf(res: Response) {
  const reader = res.body!.getReader()
  const dec = new TextDecoder()
  let buf = ''
  async function next(): Promise<{ event: string, data: any } | null> {
    for (;;) {
      const cut = buf.indexOf('\n\n')
      if (cut >= 0) {
        const block = buf.slice(0, cut)
        buf = buf.slice(cut + 2)
        const event = /^event: (.*)$/m.exec(block)?.[1] ?? 'message'
        const data = block.split('\n').filter(l => l.startsWith('data: ')).map(l => l.slice(6)).join('\n')
        return { event, data: JSON.parse(data) }
      }
      const { value, done } = await reader.read()
      if (done) return null
      buf += dec.decode(value, { stream: true })
    }
  }
  async function all() {
    const out: { event: string, data: any }[] = []
    for (let e = await next(); e; e = await next()) out.push(e)
    return out
  }
  return { next, all }
}

/** A session cookie of its own for raw fetch calls (the helper client reads whole bodies). */
async function sessionCookie(email: string) {
  const res = await fetch(`${app.url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: 'correct horse battery' }) })
  return res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
}

beforeAll(async () => {
  app = await startApp()
  owner = new Client(app.url)
  await owner.register('planner@lab.test')
  labId = (await owner.post('/api/labs', { name: 'Route lab' })).body.id
  sampleId = (await owner.post(`/api/labs/${labId}/samples`, { name: 'Ag', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body.id
  buildId = (await owner.post(`/api/labs/${labId}/samples/${sampleId}/builds`, { name: 'Chain of four' })).body.id
  // Instrument settings the time estimate must use: 4 nm/s, 10 s per move, no check scans.
  expect((await owner.patch(`/api/labs/${labId}`, { settings: { tip_speed_nm_s: 4, overhead_s_per_move: 10, check_every_moves: 0, check_scan_s: 0 } })).status).toBe(200)
  scanId = await newScan('plan.csv')
  await putMarks(scanId, atoms)
  await fitByHand(scanId)
  blueprintId = await saveBlueprint([{ type: 'chain', start: [0, 0], direction: 0, count: 4, step: 3 }])

  await owner.post(`/api/labs/${labId}/invites`, { email: 'watcher@lab.test', role: 'viewer' })
  const mail = await waitForMail(app.url, m => m.to.includes('watcher@lab.test'))
  viewer = new Client(app.url)
  await viewer.register('watcher@lab.test')
  await viewer.post(`/api/invites/${linkIn(mail.text, '/invite').split('/invite/')[1]}/accept`)
  stranger = new Client(app.url)
  await stranger.register('elsewhere@lab.test')
  await stranger.post('/api/labs', { name: 'Other lab' })
})
afterAll(async () => {
  await app?.stop()
})

let routeId: number
let saved: any

describe('solving and saving a route', () => {
  it('solves from the latest marks and the blueprint sites through the lattice fit, and saves it', async () => {
    const res = await owner.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: scanId, clearance_nm: 0.4 })
    expect(res.status).toBe(201)
    saved = res.body
    routeId = saved.id
    // Sites: the blueprint's (i, j) mapped by hand through the fit, origin + i·a1 + j·a2.
    const ideal = (await owner.get(`/api/blueprints/${blueprintId}`)).body.sites as { i: number, j: number }[]
    expect(ideal).toHaveLength(4)
    saved.result.sites.forEach((s: P, k: number) => {
      const want = at(ideal[k]!.i, ideal[k]!.j)
      expect(s[0]).toBeCloseTo(want[0], 9)
      expect(s[1]).toBeCloseTo(want[1], 9)
    })
    expect(saved.result.atoms).toEqual(atoms)
    expect(saved.result.lattice).toEqual({ a1, a2, origin })
    expect(saved).toMatchObject({ blueprint_id: blueprintId, scan_id: scanId, parent_id: null, move_count: 4 })
    expect(saved.options).toMatchObject({ scan_id: scanId, clearance_nm: 0.4, marks_version: 1, lattice_fit_version: 1, time: { tip_speed_nm_s: 4, overhead_s_per_move: 10 } })
    expect(saved.blueprint).toMatchObject({ id: blueprintId, version: 1, name: 'Chain' })
    // Every move ends on its site; every site is filled.
    for (const m of saved.result.moves) {
      const end = m.path.at(-1)
      expect(Math.hypot(end[0] - saved.result.sites[m.site][0], end[1] - saved.result.sites[m.site][1])).toBeLessThan(1e-9)
    }
    expect(saved.result.unfilled_sites).toEqual([])
    expect(saved.total_length_nm).toBeCloseTo(saved.result.moves.reduce((t: number, m: { length_nm: number }) => t + m.length_nm, 0), 9)
    expect(saved.result.total_length_nm).toBeGreaterThanOrEqual(saved.result.lower_bound_nm - 1e-9)
    // Time per move by hand from the lab's settings: length / (4 nm/s) + 10 s.
    saved.result.moves.forEach((m: { length_nm: number, estimate_s: number }) => expect(m.estimate_s).toBeCloseTo(m.length_nm / 4 + 10, 9))
    expect(saved.result.time.total_s).toBeCloseTo(saved.total_length_nm / 4 + 40, 9)
  })

  it('lists the routes of the blueprint and opens one in full', async () => {
    const list = await owner.get(`/api/blueprints/${blueprintId}/routes`)
    expect(list.status).toBe(200)
    expect(list.body).toHaveLength(1)
    expect(list.body[0]).toMatchObject({ id: routeId, blueprint_version: 1, scan_id: scanId, move_count: 4, marks_version: 1, lattice_fit_version: 1, warnings: 0, author: 'Test User' })
    expect(list.body[0].total_s).toBeCloseTo(saved.result.time.total_s, 9)
    expect(list.body[0]).not.toHaveProperty('result')
    const one = await owner.get(`/api/routes/${routeId}`)
    expect(one.status).toBe(200)
    expect(one.body.result.moves).toEqual(saved.result.moves)
    // A new version of the blueprint keeps the lineage's routes in its list.
    const v2 = await owner.post(`/api/labs/${labId}/builds/${buildId}/blueprints`, { name: 'Chain', surface: 'Ag(111)', shapes: [{ type: 'chain', start: [0, 0], direction: 0, count: 3, step: 3 }], lineage: saved.blueprint.lineage, base_version: 1 })
    expect((await owner.get(`/api/blueprints/${v2.body.id}/routes`)).body.map((r: { id: number }) => r.id)).toEqual([routeId])
  })

  it('keeps locked atoms in place and excluded atoms out of the plan', async () => {
    const res = await owner.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: scanId, locked: [0], excluded: [1] })
    expect(res.status).toBe(201)
    const moved = res.body.result.moves.map((m: { atom: number }) => m.atom)
    expect(moved).not.toContain(0)
    expect(moved).not.toContain(1)
    expect(res.body.options).toMatchObject({ locked: [0], excluded: [1] })
  })
})

describe('re-planning', () => {
  it('solves again from current positions, keeps the placed atoms and points at its parent', async () => {
    const first = saved.result.moves[0]
    // The first move was executed and its atom landed on its site.
    const now: P[] = saved.result.atoms.map((p: P, k: number) => (k === first.atom ? saved.result.sites[first.site] : p))
    const res = await owner.post(`/api/routes/${routeId}/replan`, { atoms: now, placed: [[first.site, first.atom]] })
    expect(res.status).toBe(201)
    const re = res.body
    expect(re).toMatchObject({ parent_id: routeId, blueprint_id: blueprintId, scan_id: scanId, move_count: 3 })
    expect(re.result.moves.map((m: { atom: number }) => m.atom)).not.toContain(first.atom)
    expect(re.result.assignment).toContainEqual([first.atom, first.site])
    expect(re.result.unfilled_sites).toEqual([])
    expect(re.result.atoms).toEqual(now)
    expect(re.result.sites).toEqual(saved.result.sites)
    expect(re.options).toMatchObject({ clearance_nm: 0.4, replan: { placed: [[first.site, first.atom]], atoms_from: 'body' } })
    expect((await owner.get(`/api/blueprints/${blueprintId}/routes`)).body[0]).toMatchObject({ id: re.id, parent_id: routeId })
  })

  it('re-plans from a newer scan: its marks and its own lattice fit', async () => {
    const next = await newScan('after-two-moves.csv')
    const first = saved.result.moves[0]
    await putMarks(next, saved.result.atoms.map((p: P, k: number) => (k === first.atom ? saved.result.sites[first.site] : p)))
    await fitByHand(next)
    const res = await owner.post(`/api/routes/${routeId}/replan`, { scan_id: next, placed: [[first.site, first.atom]] })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ scan_id: next, parent_id: routeId, move_count: 3, options: { marks_version: 1, replan: { atoms_from: 'scan' } } })
  })

  it('refuses a re-plan without positions, with both, or with a pair that does not exist', async () => {
    const none = await owner.post(`/api/routes/${routeId}/replan`, { placed: [] })
    expect(none.status).toBe(400)
    expect(none.body.data.field).toBe('atoms')
    const both = await owner.post(`/api/routes/${routeId}/replan`, { placed: [], atoms, scan_id: scanId })
    expect(both.body.data.field).toBe('scan_id')
    const ghost = await owner.post(`/api/routes/${routeId}/replan`, { placed: [[99, 0]], atoms })
    expect(ghost.status).toBe(400)
    expect(ghost.body.data.field).toBe('placed.0.0')
  })
})

describe('progress as server-sent events', () => {
  it('streams progress events and ends with the saved route', async () => {
    const res = await fetch(`${app.url}/api/blueprints/${blueprintId}/routes`, {
      method: 'POST',
      headers: { 'accept': 'text/event-stream', 'content-type': 'application/json', 'cookie': await sessionCookie('planner@lab.test') },
      body: JSON.stringify({ scan_id: scanId }),
    })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/event-stream/)
    const events = await eventsOf(res).all()
    const last = events.at(-1)!
    expect(last.event).toBe('result')
    expect(last.data.move_count).toBe(4)
    const progress = events.slice(0, -1)
    expect(progress.length).toBeGreaterThanOrEqual(2)
    expect(progress.every(e => e.event === 'progress')).toBe(true)
    const fractions = progress.map(e => e.data.fraction as number)
    expect(fractions.every((f, k) => f >= 0 && f <= 1 && (k === 0 || f >= fractions[k - 1]!))).toBe(true)
    expect(fractions.at(-1)).toBe(1)
    expect((await owner.get(`/api/routes/${last.data.id}`)).status).toBe(200)
  })

  it('answers bad input with a plain 400 even when progress was asked for', async () => {
    const res = await fetch(`${app.url}/api/blueprints/${blueprintId}/routes`, {
      method: 'POST',
      headers: { 'accept': 'text/event-stream', 'content-type': 'application/json', 'cookie': await sessionCookie('planner@lab.test') },
      body: JSON.stringify({ scan_id: scanId, clearance_nm: -1 }),
    })
    expect(res.status).toBe(400)
    expect((await res.json()).data.field).toBe('clearance_nm')
  })
})

describe('roles and labs', () => {
  it('lets a viewer read routes but not solve or re-plan (403)', async () => {
    expect((await viewer.get(`/api/blueprints/${blueprintId}/routes`)).status).toBe(200)
    expect((await viewer.get(`/api/routes/${routeId}`)).status).toBe(200)
    expect((await viewer.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: scanId })).status).toBe(403)
    expect((await viewer.post(`/api/routes/${routeId}/replan`, { atoms, placed: [] })).status).toBe(403)
  })

  it('shows nothing of another lab (404) and needs a session (401)', async () => {
    expect((await stranger.get(`/api/routes/${routeId}`)).status).toBe(404)
    expect((await stranger.get(`/api/blueprints/${blueprintId}/routes`)).status).toBe(404)
    expect((await stranger.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: scanId })).status).toBe(404)
    expect((await stranger.post(`/api/routes/${routeId}/replan`, { atoms, placed: [] })).status).toBe(404)
    const anon = new Client(app.url)
    expect((await anon.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: 'x' })).status).toBe(401)
    expect((await anon.get(`/api/routes/${routeId}`)).status).toBe(401)
  })

  it('does not take a scan of another lab', async () => {
    const otherLab = (await stranger.get('/api/labs')).body[0].id
    const s = (await stranger.post(`/api/labs/${otherLab}/samples`, { name: 'X', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
    const theirs = (await stranger.upload(`/api/labs/${otherLab}/samples/${s.id}/scans`, { name: 'x.csv', data: '0,0\n0,0\n' }, { size_x_nm: 5, size_y_nm: 5 })).body.id
    const res = await owner.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: theirs })
    expect(res.status).toBe(404)
    expect(res.body.data.field).toBe('scan_id')
  })
})

describe('bad input: 400 naming the field, nothing saved', () => {
  it('refuses non-numeric, negative and malformed options', async () => {
    const before = (await owner.get(`/api/blueprints/${blueprintId}/routes`)).body.length
    const cases: [unknown, string][] = [
      [{ scan_id: 'seven' }, 'scan_id'],
      [{ scan_id: scanId, clearance_nm: 'NaN' }, 'clearance_nm'],
      [{ scan_id: scanId, clearance_nm: -0.1 }, 'clearance_nm'],
      [{ scan_id: scanId, cost: 'cheapest' }, 'cost'],
      [{ scan_id: scanId, keep_out: [[[0, 0], [1, 'a'], [2, 2]]] }, 'keep_out.0.1.1'],
      [{ scan_id: scanId, keep_out: [[[0, 0], [1, 1]]] }, 'keep_out.0'],
      [{ scan_id: scanId, locked: [99] }, 'locked.0'],
      [{ scan_id: scanId, excluded: [-1] }, 'excluded.0'],
    ]
    for (const [body, field] of cases) {
      const res = await owner.post(`/api/blueprints/${blueprintId}/routes`, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.data.field).toBe(field)
    }
    // JSON cannot carry NaN; a body that is not JSON at all is refused as such.
    const raw = await owner.request('POST', `/api/blueprints/${blueprintId}/routes`, undefined, { headers: { 'content-type': 'application/json' }, body: '{"scan_id": NaN}' })
    expect(raw.status).toBe(400)
    expect((await owner.get(`/api/blueprints/${blueprintId}/routes`)).body.length).toBe(before)
  })

  it('names the missing piece: a scan without a lattice fit, without marks, a blueprint without sites', async () => {
    const bare = await newScan('bare.csv')
    const noFit = await owner.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: bare })
    expect(noFit.status).toBe(400)
    expect(noFit.body.data.field).toBe('lattice_fit')
    expect(noFit.body.message).toMatch(/no lattice fit/)
    await fitByHand(bare)
    const noMarks = await owner.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: bare })
    expect(noMarks.status).toBe(400)
    expect(noMarks.body.data.field).toBe('marks')
    await putMarks(bare, [])
    expect((await owner.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: bare })).body.data.field).toBe('marks')
    // A blueprint with no sites never gets saved (the blueprint step refuses it, naming the
    // shapes), so no route can be asked for one.
    const empty = await owner.post(`/api/labs/${labId}/builds/${buildId}/blueprints`, { name: 'Nothing', surface: 'Ag(111)', shapes: [{ type: 'sites', sites: [] }] })
    expect(empty.status).toBe(400)
    expect(empty.body.data.field).toMatch(/^shapes/)
  })

  it('refuses more atoms + sites than the documented limit of 20 000', async () => {
    const big = await newScan('crowded.csv')
    await fitByHand(big)
    const many: P[] = Array.from({ length: 20_000 }, (_, k) => [(k % 200) * 0.1, Math.floor(k / 200) * 0.1])
    await putMarks(big, many)
    const res = await owner.post(`/api/blueprints/${blueprintId}/routes`, { scan_id: big })
    expect(res.status).toBe(400)
    expect(res.body.data.field).toBe('marks')
    expect(res.body.message).toMatch(/20000/)
  })
})

// Last in the file: the long solve keeps the single compute worker busy until the app stops.
it('answers other requests while a long solve runs in the worker pool', async () => {
  const R = rng(7)
  const n = 2500
  const siteIdx: P[] = Array.from({ length: n }, (_, k) => [3 * (k % 50), 3 * Math.floor(k / 50)])
  const taken = new Set(siteIdx.map(s => s.join(',')))
  const atomIdx: P[] = []
  while (atomIdx.length < n) {
    const p: P = [Math.floor(R() * 200) - 25, Math.floor(R() * 200) - 25]
    if (!taken.has(p.join(','))) {
      taken.add(p.join(','))
      atomIdx.push(p)
    }
  }
  const big = await newScan('big.csv')
  await fitByHand(big)
  await putMarks(big, atomIdx.map(([i, j]) => at(i, j)))
  const bp = await saveBlueprint([{ type: 'sites', sites: siteIdx }], 'Large patch')
  const abort = new AbortController()
  const res = await fetch(`${app.url}/api/blueprints/${bp}/routes`, {
    method: 'POST', signal: abort.signal,
    headers: { 'accept': 'text/event-stream', 'content-type': 'application/json', 'cookie': await sessionCookie('planner@lab.test') },
    body: JSON.stringify({ scan_id: big }),
  })
  expect(res.status).toBe(200)
  let finished = false
  // The solve has started once its first progress event arrives…
  const stream = eventsOf(res)
  expect((await stream.next())?.event).toBe('progress')
  const rest = stream.all().then(() => {
    finished = true
  }, () => {
    finished = true
  })
  // …and another user's request is answered while it runs.
  const other = await stranger.get('/api/labs')
  expect(other.status).toBe(200)
  const mine = await owner.get(`/api/blueprints/${blueprintId}/routes`)
  expect(mine.status).toBe(200)
  expect(finished).toBe(false)
  abort.abort()
  await rest
})
