// Canvas smoothness with 10 000 marks: the built app in headless Chromium, a 1024² scan with
// 10 000 marks on the workspace canvas, then wheel-zoom and drag-pan for a few seconds while
// counting animation frames. Needs a build (`npx nuxi build`) and Chromium.
import { existsSync } from 'node:fs'
import { syntheticScan } from '../../shared/scan/synthetic'
import { startApp } from '../helpers/app'
import { launch, ready } from '../helpers/browser'
import { Client } from '../helpers/client'
import { section } from './harness'

export async function run(): Promise<void> {
  section('canvas (headless Chromium, built app)')
  if (!existsSync('.output/server/index.mjs')) {
    console.log('skipped: no build found — run `npx nuxi build` first')
    return
  }
  const app = await startApp()
  const browser = await launch()
  try {
    const c = new Client(app.url)
    await c.register('bench@lab.test', 'Bench', 'bench-password-1')
    const lab = (await c.post('/api/labs', { name: 'Bench' })).body
    const sample = (await c.post(`/api/labs/${lab.id}/samples`, { name: 'S', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body
    const build = (await c.post(`/api/labs/${lab.id}/samples/${sample.id}/builds`, { name: 'B' })).body
    const scan = syntheticScan({ width: 1024, height: 1024, pixel_nm: 0.1, density_per_nm2: 0.05, seed: 5 })
    const csv = Array.from({ length: scan.height }, (_, r) => Array.from(scan.data.subarray(r * scan.width, (r + 1) * scan.width), v => v.toFixed(4)).join(' ')).join('\n')
    const up = await c.upload(`/api/labs/${lab.id}/samples/${sample.id}/scans`, { name: 'big.txt', data: csv }, { size_x_nm: 102.4, size_y_nm: 102.4, build_id: build.id })
    const marks = Array.from({ length: 10_000 }, (_, k) => ({ x_nm: 0.5 + (k % 100) * 1.01, y_nm: 0.5 + Math.floor(k / 100) * 1.01, height_nm: 0.08, score: 10 }))
    await c.post(`/api/scans/${up.body.id}/marks`, { marks, base_version: 0 })

    const page = await (await browser.newContext({ viewport: { width: 1600, height: 1000 } })).newPage()
    await page.goto(`${app.url}/login`)
    await ready(page)
    await page.fill('#email', 'bench@lab.test')
    await page.fill('#password', 'bench-password-1')
    await page.click('button[type=submit]')
    await page.waitForURL(u => !u.pathname.startsWith('/login'))
    await page.goto(`${app.url}/labs/${lab.id}/builds/${build.id}`)
    await page.click('[data-test=step-marks]')
    await page.waitForFunction(() => document.body.textContent?.includes('10000 marks'), null, { timeout: 60_000 })
    // Time one full redraw of each layer (what every pan or zoom step costs at most).
    const layerTimes = await page.evaluate(`(() => {
      const stage = window.Konva?.stages?.[0]
      if (!stage) return 'no stage'
      return stage.getLayers().map((l, i) => {
        const t0 = performance.now(); for (let k = 0; k < 10; k++) l.draw(); return i + ':' + ((performance.now() - t0) / 10).toFixed(1) + ' ms'
      }).join(', ')
    })()`)
    console.log(`layer redraw times (median of 10 draws not taken; mean): ${String(layerTimes)}`)
    const box = (await page.locator('[data-test=canvas]').boundingBox())!
    const cx = box.x + box.width / 2
    const cy = box.y + box.height / 2

    // The gestures run inside the page, one input event per animation frame (as a hand on a mouse
    // does), so the figure is the page's own frame rate, not the test driver's round trips.
    const measure = async (label: string, gesture: 'zoom' | 'pan') => {
      const frames = await page.evaluate(`new Promise((done) => {
        const el = document.querySelector('[data-test=canvas]')
        const r = el.getBoundingClientRect(); const cx = r.left + r.width / 2, cy = r.top + r.height / 2
        const times = []; let i = 0; const t0 = performance.now()
        if ('${gesture}' === 'pan') el.dispatchEvent(new PointerEvent('pointerdown', { bubbles: true, button: 1, buttons: 4, pointerId: 1, clientX: cx, clientY: cy }))
        const tick = (t) => {
          times.push(t); i++
          if ('${gesture}' === 'zoom') el.dispatchEvent(new WheelEvent('wheel', { bubbles: true, cancelable: true, clientX: cx, clientY: cy, deltaY: (i % 60 < 30 ? -40 : 40) }))
          else el.dispatchEvent(new PointerEvent('pointermove', { bubbles: true, button: 1, buttons: 4, pointerId: 1, clientX: cx + 200 * Math.sin(i / 15), clientY: cy + 120 * Math.cos(i / 15) }))
          if (t - t0 < 3000) requestAnimationFrame(tick)
          else { el.dispatchEvent(new PointerEvent('pointerup', { bubbles: true, button: 1, pointerId: 1, clientX: cx, clientY: cy })); done(times) }
        }
        requestAnimationFrame(tick)
      })`) as number[]
      const gaps = frames.slice(1).map((t, i) => t - frames[i]!).sort((a, b) => a - b)
      const median = gaps[Math.floor(gaps.length / 2)] ?? Infinity
      const p95 = gaps[Math.floor(gaps.length * 0.95)] ?? Infinity
      const fps = (frames.length - 1) / ((frames.at(-1)! - frames[0]!) / 1000)
      console.log(`${label.padEnd(40)} ${fps.toFixed(1).padStart(5)} frames/s (frame median ${median.toFixed(1)} ms, 95th percentile ${p95.toFixed(1)} ms, ${frames.length} frames)  target ≥ 30 ${fps >= 30 ? 'OK' : 'MISSED'}`)
    }
    await measure('wheel zoom in and out, 10 000 marks', 'zoom')
    await measure('drag pan, 10 000 marks', 'pan')
    if (process.env.CANVAS_BENCH_PROFILE) {
      // Where the time goes during a pan: self time per function from the V8 profiler.
      const cdp = await page.context().newCDPSession(page)
      await cdp.send('Profiler.enable')
      await cdp.send('Profiler.start')
      await page.mouse.down({ button: 'middle' })
      for (let i = 0; i < 40; i++) await page.mouse.move(cx + 200 * Math.sin(i / 10), cy + 120 * Math.cos(i / 10))
      await page.mouse.up({ button: 'middle' })
      const { profile } = await cdp.send('Profiler.stop') as { profile: { nodes: { id: number, callFrame: { functionName: string, url: string, lineNumber: number } }[], samples: number[], timeDeltas: number[] } }
      const self = new Map<number, number>()
      profile.samples.forEach((id, k) => self.set(id, (self.get(id) ?? 0) + (profile.timeDeltas[k] ?? 0)))
      const rows = profile.nodes.map(n => ({ name: `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber}`, ms: (self.get(n.id) ?? 0) / 1000 }))
      const byName = new Map<string, number>()
      for (const r of rows) byName.set(r.name, (byName.get(r.name) ?? 0) + r.ms)
      console.log([...byName].sort((a, b) => b[1] - a[1]).slice(0, 15).map(([n, ms]) => `${ms.toFixed(1).padStart(8)} ms  ${n}`).join('\n'))
    }
  }
  finally {
    await browser.close()
    await app.stop()
  }
}
