// In a real browser: upload a scan to a build, detect the adatoms, drag one mark to a new place,
// reload the page, and find the mark where it was left (saved as a new version of the marks).
import { writeFileSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, Page } from 'playwright-core'
import { expect, it } from 'vitest'
import { syntheticScan } from '../../shared/scan/synthetic'
import type { RunningApp } from '../helpers/app'
import { ready, register, withAppAndBrowser } from '../helpers/browser'
import { Client } from '../helpers/client'

let app: RunningApp
let browser: Browser
let buildUrl: string
const scan = syntheticScan({ width: 160, height: 160, pixel_nm: 0.1, density_per_nm2: 0.1, margin_nm: 1.5, fwhm_nm: 0.8, height_nm: 0.08, noise_nm: 0.002, seed: 21 })

withAppAndBrowser((a, b) => {
  app = a
  browser = b
})

async function marksFromApi(page: Page): Promise<{ x_nm: number, y_nm: number }[]> {
  return page.evaluate(async () => {
    const scans = await (await fetch(`/api/labs/${location.pathname.split('/')[2]}/scans?build=${location.pathname.split('/')[4]}`)).json()
    return (await (await fetch(`/api/scans/${scans[0].id}/marks`)).json()).marks
  })
}

it('upload → detect → drag a mark → reload → the mark is where it was left', async () => {
  const page = await (await browser.newContext({ viewport: { width: 1400, height: 900 } })).newPage()
  await register(page, app.url, { name: 'Nia Park', email: 'nia@lab.test', password: 'lateral-manipulation' })
  await page.waitForURL(/\/labs/)
  // Lab, sample and build through the API with the browser's own session.
  const c = new Client(app.url)
  await c.post('/api/auth/login', { email: 'nia@lab.test', password: 'lateral-manipulation' })
  const lab = (await c.post('/api/labs', { name: 'E2E lab' })).body
  const sample = (await c.post(`/api/labs/${lab.id}/samples`, { name: 'Ag crystal', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
  const build = (await c.post(`/api/labs/${lab.id}/samples/${sample.id}/builds`, { name: 'Chain' })).body
  buildUrl = `${app.url}/labs/${lab.id}/builds/${build.id}`

  const file = join(app.dir, 'topo.csv')
  writeFileSync(file, Array.from({ length: scan.height }, (_, r) => Array.from(scan.data.subarray(r * scan.width, (r + 1) * scan.width), v => v.toFixed(6)).join(' ')).join('\n'))
  await page.goto(buildUrl)
  await page.waitForSelector('[data-test=scan-upload]')
  await ready(page)
  await page.setInputFiles('#scan-file', file)
  await page.fill('#scan-sx', '16')
  await page.fill('#scan-sy', '16')
  await page.click('text=Upload scan')
  await page.waitForSelector('[data-test=detect]:not([disabled])')
  await page.click('[data-test=detect]')
  await expect.poll(async () => (await marksFromApi(page)).length, { timeout: 15_000 }).toBe(scan.atoms.length)

  // Drag the first mark by (+1.0, +0.5) nm on screen coordinates of the canvas.
  const before = (await marksFromApi(page))[0]!
  // The canvas publishes its view (px per nm, offset) so that a test can aim at world points.
  const [scale, ox, oy] = (await page.getAttribute('[data-test=canvas]', 'data-view'))!.split(' ').map(Number) as [number, number, number]
  const canvas = (await page.locator('[data-test=canvas]').boundingBox())!
  expect(scale).toBeGreaterThan(0)
  const at = (x: number, y: number) => [canvas.x + x * scale + ox, canvas.y + y * scale + oy] as const
  await page.mouse.move(...at(before.x_nm, before.y_nm))
  await page.mouse.down()
  await page.mouse.move(...at(before.x_nm + 1, before.y_nm + 0.5), { steps: 6 })
  await page.mouse.up()
  await page.waitForSelector('[data-test=marks-save-status]:has-text("all changes saved")')

  await page.reload()
  await expect.poll(async () => {
    const moved = (await marksFromApi(page))[0]!
    return [+(moved.x_nm - before.x_nm).toFixed(2), +(moved.y_nm - before.y_nm).toFixed(2)]
  }).toEqual([1, 0.5])
  await page.click('[data-test=step-marks]')
  await page.waitForSelector('[data-test=marks-table]')
  expect(await page.textContent('[data-test=marks-table]')).toContain((before.x_nm + 1).toFixed(3))
})
