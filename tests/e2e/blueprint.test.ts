// In a real browser: a build whose scan carries marks on a known Ag(111) lattice (turned 10°),
// fit the lattice in the lattice step, draw a ring and a chain with the blueprint tools, save,
// reload, and find the same sites (the API's expanded sites and the counts shown, before and after);
// and place the lattice by hand with the canvas handles.
import type { Browser, Page } from 'playwright-core'
import { expect, it } from 'vitest'
import type { RunningApp } from '../helpers/app'
import { register, withAppAndBrowser } from '../helpers/browser'
import { Client } from '../helpers/client'

let app: RunningApp
let browser: Browser

// Ag(111): a = 4.09 Å (Ashcroft & Mermin Table 4.3), nearest-neighbour distance a/√2 (derived).
const nn = 0.409 / Math.SQRT2
const theta = (10 * Math.PI) / 180

withAppAndBrowser((a, b) => {
  app = a
  browser = b
})

async function view(page: Page) {
  const [scale, ox, oy] = (await page.getAttribute('[data-test=canvas]', 'data-view'))!.split(' ').map(Number) as [number, number, number]
  const box = (await page.locator('[data-test=canvas]').boundingBox())!
  return (x: number, y: number) => [box.x + x * scale + ox, box.y + y * scale + oy] as const
}
async function drag(page: Page, from: [number, number], to: [number, number]) {
  const at = await view(page)
  await page.mouse.move(...at(...from))
  await page.mouse.down()
  await page.mouse.move(...at(...to), { steps: 8 })
  await page.mouse.up()
}

/** A signed-in page and an API client, and a build whose 20 nm scan has 81 marks on fcc hollows of
 * an Ag(111) lattice turned 10°, three nearest-neighbour steps apart, centred at (10.1, 9.7) nm. */
async function setup(email: string) {
  const page = await (await browser.newContext({ viewport: { width: 1500, height: 950 } })).newPage()
  await register(page, app.url, { name: 'Ada Builder', email, password: 'lateral-manipulation' })
  await page.waitForURL(/\/labs/)
  const c = new Client(app.url)
  await c.post('/api/auth/login', { email, password: 'lateral-manipulation' })
  const lab = (await c.post('/api/labs', { name: 'Corral lab' })).body
  const sample = (await c.post(`/api/labs/${lab.id}/samples`, { name: 'Ag crystal', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
  const build = (await c.post(`/api/labs/${lab.id}/samples/${sample.id}/builds`, { name: 'Corral' })).body
  const scan = (await c.upload(`/api/labs/${lab.id}/samples/${sample.id}/scans`, { name: 'flat.csv', data: '0,0\n0,0\n' }, { size_x_nm: 20, size_y_nm: 20, build_id: build.id })).body
  const a1 = [nn * Math.cos(theta), nn * Math.sin(theta)]
  const a2 = [nn * Math.cos(theta + (2 * Math.PI) / 3), nn * Math.sin(theta + (2 * Math.PI) / 3)]
  const marks = []
  for (let i = -12; i <= 12; i += 3) {
    for (let j = -12; j <= 12; j += 3) marks.push({ x_nm: 10.1 + i * a1[0]! + j * a2[0]!, y_nm: 9.7 + i * a1[1]! + j * a2[1]!, height_nm: 0.08, score: 1 })
  }
  expect((await c.post(`/api/scans/${scan.id}/marks`, { marks, base_version: 0 })).status).toBe(200)
  return { page, c, lab, build, scan, a1, a2 }
}

it('fit the lattice, draw a ring and a chain, save, reload: the same sites', async () => {
  const { page, c, lab, build, a1, a2 } = await setup('ada@lab.test')
  await page.goto(`${app.url}/labs/${lab.id}/builds/${build.id}`)
  await page.waitForSelector('[data-test=canvas]')
  await page.click('[data-test=step-lattice]')
  await page.waitForSelector('[data-test=lattice-constant]')
  expect(await page.textContent('[data-test=lattice-constant]')).toContain('Ag: a = 4.09 Å')
  await page.click('[data-test=lattice-fit]:not([disabled])')
  await page.waitForSelector('[data-test=lattice-rotation]')
  // The rotation is reported within the (111) symmetry range, ±30°.
  expect(Number((await page.textContent('[data-test=lattice-rotation]'))!.replace('°', ''))).toBeCloseTo(10, 2)
  expect(await page.textContent('[data-test=lattice-offlattice]')).toContain('all 81 marks on fcc sites')
  expect(await page.textContent('[data-test=step-lattice]')).toContain('Ag(111) fcc')

  await page.click('[data-test=step-blueprint]')
  await page.click('[data-test=bp-tool-ring]')
  await page.fill('[data-test=bp-default-ring-n]', '18')
  await page.press('[data-test=bp-default-ring-n]', 'Tab')
  await drag(page, [10, 10], [12.5, 10])
  await page.waitForSelector('[data-test=bp-shape-editor]')
  expect(await page.textContent('[data-test=bp-site-count]')).toBe('18')
  await page.click('[data-test=bp-tool-chain]')
  // From the fcc site nearest (3, 16.5) nm along a1 (the 10° row) to 18 steps further: with the
  // tool's spacing of 2 steps that is 18 / 2 + 1 = 10 atoms (hand computation).
  const det = a1[0]! * a2[1]! - a1[1]! * a2[0]!
  const [px, py] = [3 - 10.1, 16.5 - 9.7]
  const [i0, j0] = [Math.round((px * a2[1]! - py * a2[0]!) / det), Math.round((a1[0]! * py - a1[1]! * px) / det)]
  const start: [number, number] = [10.1 + i0 * a1[0]! + j0 * a2[0]!, 9.7 + i0 * a1[1]! + j0 * a2[1]!]
  await drag(page, start, [start[0] + 18 * a1[0]!, start[1] + 18 * a1[1]!])
  expect(await page.textContent('[data-test=bp-site-count]')).toBe('28')
  expect(await page.textContent('[data-test=bp-rules-summary]')).toContain('all clear')

  await page.fill('[data-test=bp-name]', 'Corral and chain')
  await page.click('[data-test=bp-save]')
  await page.waitForSelector('[data-test=bp-save-status]:has-text("saved as version 1")')
  const list = (await c.get(`/api/labs/${lab.id}/builds/${build.id}/blueprints`)).body
  expect(list).toHaveLength(1)
  const before = (await c.get(`/api/blueprints/${list[0].id}`)).body
  expect(before.blueprint).toMatchObject({ name: 'Corral and chain', version: 1, site_count: 28, site: 'fcc' })
  expect(before.per_shape.map((p: { count: number }) => p.count)).toEqual([18, 10])

  await page.reload()
  await page.waitForSelector('[data-test=canvas]')
  await page.click('[data-test=step-blueprint]')
  await page.waitForSelector('[data-test=bp-site-count]')
  await expect.poll(() => page.textContent('[data-test=bp-site-count]')).toBe('28')
  expect(await page.textContent('[data-test=bp-available]')).toBe('81')
  expect(await page.textContent('[data-test=bp-shapes]')).toContain('Ring · N 18')
  const after = (await c.get(`/api/blueprints/${(await c.get(`/api/labs/${lab.id}/builds/${build.id}/blueprints`)).body[0].id}`)).body
  expect(after.sites).toEqual(before.sites)
  expect(await page.textContent('[data-test=bp-save-status]')).toContain('saved as version 1')
})

it('place the lattice by hand: the knob turns it, Ctrl+Z undoes, the cross moves it, save adds a version', async () => {
  const { page, c, lab, build, scan } = await setup('hal@lab.test')
  await page.goto(`${app.url}/labs/${lab.id}/builds/${build.id}`)
  await page.waitForSelector('[data-test=canvas]')
  await page.click('[data-test=step-lattice]')
  await page.click('[data-test=lattice-hand]')
  await page.waitForSelector('[data-test=lattice-hand-panel]')
  const origin = async () => [Number(await page.inputValue('#hand-ox')), Number(await page.inputValue('#hand-oy'))] as const
  const [ox, oy] = await origin()
  const at = await view(page)
  const [sx, sy] = at(ox, oy)
  expect(Number(await page.inputValue('[data-test=hand-rotation]'))).toBeCloseTo(0, 6)
  // The knob sits 70 px along a1 (here +x); dragging it to 30° below the x axis on screen turns
  // the lattice by +30° (the scan's y axis points down, like the screen's).
  await page.mouse.move(sx + 70, sy)
  await page.mouse.down()
  await page.mouse.move(sx + 70 * Math.cos(Math.PI / 6), sy + 70 * Math.sin(Math.PI / 6), { steps: 6 })
  await page.mouse.up()
  expect(Number(await page.inputValue('[data-test=hand-rotation]'))).toBeCloseTo(30, 1)
  await page.keyboard.press('Control+z')
  expect(Number(await page.inputValue('[data-test=hand-rotation]'))).toBeCloseTo(0, 6)
  await page.keyboard.press('Control+Shift+z')
  expect(Number(await page.inputValue('[data-test=hand-rotation]'))).toBeCloseTo(30, 1)
  await drag(page, [ox, oy], [ox + 1, oy])
  const [nx, ny] = await origin()
  expect(nx - ox).toBeCloseTo(1, 2)
  expect(ny - oy).toBeCloseTo(0, 2)
  await page.click('[data-test=hand-save]')
  await page.waitForSelector('[data-test=lattice-stats]')
  const fits = (await c.get(`/api/scans/${scan.id}/lattice-fits`)).body
  expect(fits).toHaveLength(1)
  expect(fits[0]).toMatchObject({ source: 'hand', version: 1, site: 'fcc' })
  expect(fits[0].result.rotation_deg).toBeCloseTo(30, 1)
  expect(await page.textContent('[data-test=lattice-versions]')).toContain('by hand')
})
