// In a real browser: a small build made through the API (scan with an offset and a rotation,
// marks, a lattice fit, a blueprint), then the route step: solve with streamed progress, see the
// move table, step through the moves, and download the move list as CSV in the instrument frame.
import { readFileSync } from 'node:fs'
import type { Browser } from 'playwright-core'
import { expect, it } from 'vitest'
import type { RunningApp } from '../helpers/app'
import { register, withAppAndBrowser } from '../helpers/browser'
import { Client } from '../helpers/client'

type P = [number, number]
let app: RunningApp
let browser: Browser

// Ag(111): a = 4.09 Å (Ashcroft & Mermin Table 4.3), nearest-neighbour distance a/√2 (derived).
const nn = 0.409 / Math.SQRT2
const a1: P = [nn, 0]
const a2: P = [-nn / 2, (nn * Math.sqrt(3)) / 2]
const origin: P = [8, 8]
const at = (i: number, j: number): P => [origin[0] + i * a1[0] + j * a2[0], origin[1] + i * a1[1] + j * a2[1]]
const frame = { size_x_nm: 16, size_y_nm: 16, offset_x_nm: 120, offset_y_nm: -35, rotation_deg: 30 }

withAppAndBrowser((a, b) => {
  app = a
  browser = b
})

it('solve a route, step through it, download the CSV with its caution', async () => {
  const context = await browser.newContext({ viewport: { width: 1400, height: 900 }, acceptDownloads: true })
  const page = await context.newPage()
  await register(page, app.url, { name: 'Ravi Okafor', email: 'ravi@lab.test', password: 'lateral-manipulation' })
  await page.waitForURL(/\/labs/)
  const c = new Client(app.url)
  await c.post('/api/auth/login', { email: 'ravi@lab.test', password: 'lateral-manipulation' })
  const lab = (await c.post('/api/labs', { name: 'Route e2e lab' })).body
  const sample = (await c.post(`/api/labs/${lab.id}/samples`, { name: 'Ag crystal', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
  const build = (await c.post(`/api/labs/${lab.id}/samples/${sample.id}/builds`, { name: 'Chain of five' })).body
  const scan = (await c.upload(`/api/labs/${lab.id}/samples/${sample.id}/scans`, { name: 'plan.csv', data: '0,0,0\n0,0,0\n0,0,0\n' }, { ...frame, build_id: build.id })).body
  const atoms = [[-4, 12], [0, 12], [4, 12], [8, 12], [12, 12], [-10, -10]].map(([i, j]) => at(i!, j!))
  expect((await c.post(`/api/scans/${scan.id}/marks`, { marks: atoms.map(([x_nm, y_nm]) => ({ x_nm, y_nm })), base_version: 0 })).status).toBe(200)
  expect((await c.post(`/api/scans/${scan.id}/lattice-fit`, { mode: 'hand', surface: 'Ag(111)', site: 'fcc', a1, a2, origin })).status).toBe(201)
  expect((await c.post(`/api/labs/${lab.id}/builds/${build.id}/blueprints`, { name: 'Chain', surface: 'Ag(111)', shapes: [{ type: 'chain', start: [0, 0], direction: 0, count: 5, step: 3 }] })).status).toBe(201)

  await page.goto(`${app.url}/labs/${lab.id}/builds/${build.id}`)
  await page.waitForSelector('[data-test=canvas]')
  await page.click('[data-test=step-route]')
  await page.waitForSelector('[data-test=route-solve]:not([disabled])')
  await page.click('[data-test=route-solve]')
  await page.waitForSelector('[data-test=route-move-table]')
  const count = Number(await page.textContent('[data-test=route-move-count]'))
  expect(count).toBe(5)
  await expect.poll(() => page.locator('[data-test=route-move-table] button').count()).toBe(5)
  expect(await page.textContent('[data-test=step-route]')).toContain('5 moves')

  // Step through: next animates move 1 and makes move 2 the current one; previous goes back.
  expect(await page.textContent('[data-test=route-step]')).toContain('move 1 of 5')
  await page.click('[data-test=route-next]')
  await page.waitForSelector('[data-test=route-step]:has-text("move 2 of 5")')
  await page.click('[data-test=route-move-4]')
  await page.waitForSelector('[data-test=route-step]:has-text("move 4 of 5")')
  await page.click('[data-test=route-prev]')
  await page.waitForSelector('[data-test=route-step]:has-text("move 3 of 5")')

  // The CSV: caution first, then the first move in the instrument frame.
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-test=route-export-csv]')])
  const csv = readFileSync((await download.path())!, 'utf8').split('\n')
  expect(csv[0]).toMatch(/^# CAUTION: .*check these coordinates against the instrument's own frame before any scripted move/i)
  const header = csv.find(l => !l.startsWith('#'))!.split(',')
  expect(header.slice(0, 4)).toEqual(['order', 'atom', 'site', 'kind'])
  const row = csv[csv.indexOf(header.join(',')) + 1]!.split(',')
  const route = (await c.get(`/api/blueprints/${(await c.get(`/api/labs/${lab.id}/builds/${build.id}/blueprints`)).body[0].id}/routes`)).body[0]
  const first = (await c.get(`/api/routes/${route.id}`)).body.result.moves[0]
  // By hand: u = x − 8, v = 8 − y (centre of the 16 nm window, y up), θ = 30°,
  // X = 120 + u·cos θ − v·sin θ, Y = −35 + u·sin θ + v·cos θ.
  const inst = ([x, y]: P): P => {
    const u = x - 8, v = 8 - y, t = Math.PI / 6
    return [120 + u * Math.cos(t) - v * Math.sin(t), -35 + u * Math.sin(t) + v * Math.cos(t)]
  }
  const [sx, sy] = inst(first.path[0])
  const [ex, ey] = inst(first.path.at(-1))
  expect(row.slice(0, 4)).toEqual(['1', String(first.atom), String(first.site), first.kind])
  expect(row.slice(4, 8).map(Number)).toEqual([+sx.toFixed(4), +sy.toFixed(4), +ex.toFixed(4), +ey.toFixed(4)])
  expect(Number(row[8])).toBeCloseTo(first.length_nm, 4)
  // The caution also stands next to the buttons.
  expect(await page.textContent('[data-test=route-caution]')).toMatch(/instrument's own frame/)
  await context.close()
})
