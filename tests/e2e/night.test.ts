// In a real browser: start a build run from the workspace's Night step, log three outcomes with
// the keyboard (placed, stayed, off-site with a click on the structure), re-plan with R, close
// the run, and find the night summary in the fake SMTP server's outbox.
import type { Browser } from 'playwright-core'
import { expect, it } from 'vitest'
import type { RunningApp } from '../helpers/app'
import { register, withAppAndBrowser } from '../helpers/browser'
import { Client, waitForMail } from '../helpers/client'
import { makeBlueprint, makeLab, makeRoute, makeScan, sitePos } from '../helpers/plan'

let app: RunningApp
let browser: Browser

withAppAndBrowser((a, b) => {
  app = a
  browser = b
})

it('start → three outcomes by keyboard → re-plan → close → the summary mail arrives', async () => {
  const page = await (await browser.newContext({ viewport: { width: 1500, height: 1000 } })).newPage()
  await register(page, app.url, { name: 'Oda Night', email: 'oda@lab.test', password: 'lateral-manipulation' })
  await page.waitForURL(/\/labs/)
  const c = new Client(app.url)
  await c.post('/api/auth/login', { email: 'oda@lab.test', password: 'lateral-manipulation' })
  const lab = await makeLab(c, 'Night e2e lab')
  const scanId = await makeScan(c, lab, [sitePos(0, 3), sitePos(4, 3), sitePos(8, 3), sitePos(2, -5)])
  const route = await makeRoute(c, await makeBlueprint(c, lab, [[0, 0], [4, 0], [8, 0]]), scanId)
  expect(route.move_count).toBe(3)

  await page.goto(`${app.url}/labs/${lab.labId}/builds/${lab.buildId}`)
  await page.click('[data-test=step-logbook]')
  await page.waitForSelector('[data-test=night-route]')
  await page.fill('#rs-bias', '-5')
  await page.fill('#rs-setpoint', '50')
  await page.fill('#rs-notes', 'fresh tip')
  await page.click('[data-test=run-start-submit]')
  await page.waitForURL(/\/runs\/\d+$/)
  await page.waitForSelector('[data-test=move-card] [data-test=move-number]')
  expect(await page.textContent('[data-test=move-number]')).toBe('1')

  // The buttons rest for a moment after each entry (a double click must not log the next move).
  const ready = () => page.waitForSelector('[data-test=outcome-placed]:not([disabled])')
  await ready()
  await page.keyboard.press('p')
  await page.waitForSelector('[data-test=entry-1]')
  expect(await page.textContent('[data-test=move-number]')).toBe('2')
  await ready()
  await page.keyboard.press('s')
  await page.waitForSelector('[data-test=entry-2]')
  await ready()
  await page.keyboard.press('o')
  await page.waitForSelector('[data-test=offsite-panel]')
  const box = (await page.locator('[data-test=run-structure]').boundingBox())!
  await page.mouse.click(box.x + box.width * 0.3, box.y + box.height * 0.35)
  await page.keyboard.press('Enter')
  await page.waitForSelector('[data-test=entry-3]')
  expect(await page.textContent('[data-test=entry-3]')).toContain('Off-site')
  expect(await page.textContent('[data-test=replan-bar]')).toMatch(/ended off-site/)

  await page.keyboard.press('r')
  await page.waitForSelector('[data-test=run-history] li:nth-child(2)')
  expect(await page.textContent('[data-test=run-history]')).toContain('from the logbook')
  expect(await page.textContent('[data-test=count-placed]')).toContain('1')

  await page.click('[data-test=run-close]')
  await page.fill('#close-note', 'stopped after the re-plan')
  await page.click('[data-test=close-confirm]')
  await page.waitForSelector('[data-test=run-closed-note]')
  expect(await page.textContent('[data-test=run-state]')).toContain('closed')

  const mail = await waitForMail(app.url, m => m.subject.startsWith('Night summary') && m.to.includes('oda@lab.test'))
  expect(mail.text).toMatch(/placed 1 · stayed 1 · off-site 1 · lost 0/)
  expect(mail.text).toMatch(/1 re-plan\b/)
  expect(mail.text).toContain('stopped after the re-plan')
})
