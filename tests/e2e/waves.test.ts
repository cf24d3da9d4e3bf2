// In a real browser: a build with a ring blueprint on a Cu(111) scan (made through the API), the
// wave step shows the hard-wall ladder whose first level matches corralLevels for the fitted
// radius; the bias slider redraws the LDOS map layer; a click on the canvas moves the spectrum's
// probe; a measured spectrum is read and its peaks are compared with the levels; bad values get
// the server's message next to their field.
import { writeFileSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, Page } from 'playwright-core'
import { expect, it } from 'vitest'
import { toScanFrame } from '../../shared/blueprint/frame'
import { corralLevels, lorentzian } from '../../shared/waves/corral'
import { fitCircle } from '../../shared/waves/geometry'
import type { RunningApp } from '../helpers/app'
import { register, withAppAndBrowser } from '../helpers/browser'
import { Client } from '../helpers/client'

let app: RunningApp
let browser: Browser

withAppAndBrowser((a, b) => {
  app = a
  browser = b
})

// Cu(111): a = 3.61 Å (Ashcroft & Mermin, Table 4.3), nearest-neighbour distance a/√2 (derived).
const nn = 0.361 / Math.SQRT2
// Cu(111) surface state by tunnelling spectroscopy: E0 = −0.44 eV, m* = 0.38 (Crommie, Lutz,
// Eigler, Nature 363, 524 (1993); from memory) — the preset a Cu(111) sample starts from.
const CU = { E0_eV: -0.44, m_eff: 0.38 }

/** Screen position (page px) of a world point, from the view the canvas publishes. */
async function screenOf(page: Page, x: number, y: number): Promise<[number, number]> {
  const [scale, ox, oy] = (await page.getAttribute('[data-test=canvas]', 'data-view'))!.split(' ').map(Number) as [number, number, number]
  const box = (await page.locator('[data-test=canvas]').boundingBox())!
  return [box.x + x * scale + ox, box.y + y * scale + oy]
}

/** Alpha of the wave layer's own canvas at a world point (0 where nothing is drawn). */
async function waveAlpha(page: Page, x: number, y: number): Promise<number> {
  const [scale, ox, oy] = (await page.getAttribute('[data-test=canvas]', 'data-view'))!.split(' ').map(Number) as [number, number, number]
  return page.evaluate(([sx, sy]) => {
    const K = (window as unknown as { Konva: { stages: { findOne: (s: string) => any }[] } }).Konva
    const layer = K.stages[0]!.findOne('.waves')
    if (!layer || !layer.visible()) return -1
    const canvas = layer.getCanvas()
    const r = canvas.getPixelRatio()
    return canvas._canvas.getContext('2d').getImageData(Math.round(sx! * r), Math.round(sy! * r), 1, 1).data[3]
  }, [x * scale + ox, y * scale + oy])
}

it('ring blueprint → level ladder, bias slider redraws the map, click moves the probe, measured peaks compared', async () => {
  const page = await (await browser.newContext({ viewport: { width: 1500, height: 950 } })).newPage()
  await register(page, app.url, { name: 'Ines Okafor', email: 'ines@lab.test', password: 'surface-state-44' })
  await page.waitForURL(/\/labs/)
  const c = new Client(app.url)
  await c.post('/api/auth/login', { email: 'ines@lab.test', password: 'surface-state-44' })
  const lab = (await c.post('/api/labs', { name: 'Corral lab' })).body
  const sample = (await c.post(`/api/labs/${lab.id}/samples`, { name: 'Cu crystal', surface: 'Cu(111)', adsorbate: 'Fe', temperature_K: 4.3 })).body
  const build = (await c.post(`/api/labs/${lab.id}/samples/${sample.id}/builds`, { name: 'Ring 24' })).body
  const flat = Array.from({ length: 64 }, () => Array.from({ length: 64 }, () => '0').join(',')).join('\n')
  const scan = (await c.upload(`/api/labs/${lab.id}/samples/${sample.id}/scans`, { name: 'flat.csv', data: flat }, { size_x_nm: 20, size_y_nm: 20, build_id: build.id })).body
  const fit = await c.post(`/api/scans/${scan.id}/lattice-fit`, { mode: 'hand', surface: 'Cu(111)', site: 'fcc', a1: [nn, 0], a2: [-nn / 2, (nn * Math.sqrt(3)) / 2], origin: [10, 10] })
  expect(fit.status).toBe(201)
  const saved = await c.post(`/api/labs/${lab.id}/builds/${build.id}/blueprints`, { name: 'Ring 24', surface: 'Cu(111)', shapes: [{ type: 'ring', center: [0, 0], radius_nm: 3.5, n: 24 }] })
  expect(saved.status).toBe(201)
  const ideal = (await c.get(`/api/blueprints/${saved.body.id}`)).body.sites as { i: number, j: number, b: number, shape: number }[]
  const xy = toScanFrame(ideal, fit.body.result)
  const placed = ideal.map((s, k) => ({ i: s.i, j: s.j, b: s.b, shape: s.shape, x_nm: xy[k]![0], y_nm: xy[k]![1] }))

  await page.goto(`${app.url}/labs/${lab.id}/builds/${build.id}`)
  await page.waitForSelector('[data-test=canvas]')
  // The blueprint step fills this store in the workspace; here the test places the saved
  // blueprint's sites (mapped through the saved lattice fit) into it the same way.
  await page.evaluate(({ row, sites }) => {
    const pinia = (document.querySelector('#__nuxt') as unknown as { __vue_app__: { config: { globalProperties: { $pinia: { _s: Map<string, any> } } } } }).__vue_app__.config.globalProperties.$pinia
    const store = pinia._s.get('blueprint')!
    store.current = row
    store.sites = sites
  }, { row: saved.body, sites: placed })
  await page.click('[data-test=step-waves]')

  // The ladder: first level of the hard wall at the fitted radius (inset 0).
  const circle = fitCircle(xy)
  expect(Math.abs(circle.radius_nm - 3.5)).toBeLessThan(0.15)
  const lv = corralLevels({ radius_nm: circle.radius_nm, ...CU, count: 10 })
  await page.waitForSelector('[data-test=level-ladder]')
  expect(await page.textContent('[data-test=fitted-radius]')).toBe(`${circle.radius_nm.toFixed(4)} nm`)
  await expect.poll(() => page.textContent('[data-test=level-0] [data-test=level-E]')).toBe(lv[0]!.E_eV.toFixed(4))
  expect(await page.textContent('[data-test=level-0] td')).toBe('0,1')
  expect(await page.textContent('[data-test=preset-source]')).toContain('Crommie, Lutz, Eigler')

  // Bias slider → the map is recomputed at the new bias and the wave layer is drawn.
  await page.fill('[data-test=bias-slider]', '-0.35')
  await expect.poll(() => page.textContent('[data-test=wave-legend-bias]'), { timeout: 15_000 }).toBe('-0.350 V')
  const [cx, cy] = circle.center
  // (the layer's default opacity is 0.7: alpha 0.7·255 ≈ 179 in its own canvas)
  await expect.poll(() => waveAlpha(page, cx + 0.5, cy)).toBeGreaterThan(150)
  // Outside the hard wall the map is left clear.
  expect(await waveAlpha(page, cx + circle.radius_nm + 0.3, cy)).toBe(0)
  // Far outside the model's range: a warning, not an error; the map is still drawn.
  await page.fill('[data-test=bias-slider]', String(CU.E0_eV + 1.15))
  await page.waitForSelector('[data-test=waves-warnings]:has-text("outside")')
  expect(await page.locator('[data-test=waves-problem]').count()).toBe(0)

  // A click on the canvas moves the probe; the spectrum is recomputed there.
  await page.mouse.click(...await screenOf(page, cx + 1.2, cy - 0.6))
  await expect.poll(async () => {
    const text = (await page.textContent('[data-test=spectrum-point]')) ?? ''
    const m = text.match(/([\d.]+) nm from the centre/)
    return m ? Math.abs(Number(m[1]) - Math.hypot(1.2, 0.6)) < 0.05 : false
  }, { timeout: 15_000 }).toBe(true)
  expect(await page.locator('[data-test=waves-spectrum] canvas').count()).toBe(1)
  // Moving the probe is a canvas action: Ctrl+Z puts it back at the centre.
  await page.keyboard.press('Control+z')
  await page.waitForSelector('[data-test=spectrum-point]:has-text("0.000 nm from the centre")')

  // A measured spectrum with peaks 2 meV above E(0,1) and 3 meV below E(0,2).
  const e01 = lv.find(l => l.m === 0 && l.n === 1)!.E_eV
  const e02 = lv.find(l => l.m === 0 && l.n === 2)!.E_eV
  const rows = Array.from({ length: 401 }, (_, i) => {
    const V = -0.45 + 0.001 * i
    return `${V.toFixed(3)},${(0.2 + lorentzian(V - (e01 + 0.002), 0.004) + 0.8 * lorentzian(V - (e02 - 0.003), 0.005)).toFixed(6)}`
  })
  const file = join(app.dir, 'centre.csv')
  writeFileSync(file, `point spectrum, corral centre\nbias (V),dI/dV (nS)\n${rows.join('\n')}\n`)
  await page.setInputFiles('[data-test=measured-file]', file)
  await page.waitForSelector('[data-test=peak-table]')
  expect(await page.locator('[data-test=peak-table] tbody tr').count()).toBe(2)
  const cells = async (i: number) => page.locator(`[data-test=peak-${i}] td`).allTextContents()
  const [p0, p1] = [await cells(0), await cells(1)]
  expect(p0[1]).toBe('0,1')
  expect(Math.abs(Number(p0[3]) - 2)).toBeLessThan(0.2)
  expect(p1[1]).toBe('0,2')
  expect(Math.abs(Number(p1[3]) + 3)).toBeLessThan(0.2)

  // Bad values: the server's message stands next to the field.
  await page.fill('#wave-radius', '0')
  await expect.poll(() => page.textContent('[data-test=error-wave-radius]')).toContain('must be > 0 nm')
  await page.fill('#wave-radius', '')
  await page.fill('#wave-gamma', '0')
  await expect.poll(() => page.textContent('[data-test=error-wave-gamma]')).toContain('must be > 0 eV')
  await page.fill('#wave-meff', '-0.38')
  await expect.poll(() => page.textContent('[data-test=error-wave-meff]')).toContain('must be > 0')
  await page.fill('#wave-meff', '0.38')
  await page.fill('#wave-gamma', '0.01')

  // Two scatterers on top of each other (an imported site list could hold them): named.
  const doubled = [...placed, { ...placed[0]!, x_nm: placed[0]!.x_nm + 0.01 }]
  await page.evaluate((sites) => {
    const pinia = (document.querySelector('#__nuxt') as unknown as { __vue_app__: { config: { globalProperties: { $pinia: { _s: Map<string, any> } } } } }).__vue_app__.config.globalProperties.$pinia
    pinia._s.get('blueprint')!.sites = sites
  }, doubled)
  await page.click('[data-test=model-scattering]')
  await expect.poll(() => page.textContent('[data-test=error-scatterers]'), { timeout: 15_000 }).toMatch(/scatterers\[24\]: lies 0\.010 nm from scatterers\[0\] \(closer than 0\.05 nm\)/)
})
