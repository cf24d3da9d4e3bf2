// In a real browser: a researcher registers, creates a lab, invites a colleague; the colleague
// opens the link from the mail the fake SMTP server received, in a second browser context,
// registers, accepts, and sees the lab.
import type { Browser } from 'playwright-core'
import { expect, it } from 'vitest'
import type { RunningApp } from '../helpers/app'
import { ready, register, withAppAndBrowser } from '../helpers/browser'
import { linkIn, waitForMail } from '../helpers/client'

let app: RunningApp
let browser: Browser
withAppAndBrowser((a, b) => {
  app = a
  browser = b
})

it('register → create lab → invite → accept in a second context → see the lab', async () => {
  const pi = await (await browser.newContext()).newPage()
  await register(pi, app.url, { name: 'Rhea Lindqvist', email: 'rhea@lab.test', password: 'tunnel-junction-42' })
  await pi.waitForURL(/\/labs/)
  await ready(pi)
  await pi.fill('#lab-name', 'Cryostat Two')
  await pi.click('button[type=submit]')
  await pi.waitForURL(/\/labs\/\d+$/)
  await expect.poll(() => pi.textContent('[data-test=lab-name]')).toBe('Cryostat Two')

  await pi.click('text=People')
  await pi.waitForURL(/\/people$/)
  await ready(pi, '[data-test=send-invite]:not([disabled])')
  await pi.fill('#invite-email', 'sami@lab.test')
  await pi.selectOption('#invite-role', 'member')
  await pi.click('[data-test=send-invite]')
  await pi.waitForSelector('text=Invitation sent to sami@lab.test')
  await pi.waitForSelector('[data-test=pending-invites] >> text=sami@lab.test')

  const mail = await waitForMail(app.url, m => m.to.includes('sami@lab.test'))
  const link = linkIn(mail.text, '/invite')
  expect(new URL(link).origin).toBe(app.url)

  const colleague = await (await browser.newContext()).newPage()
  await colleague.goto(link)
  await colleague.waitForSelector('text=Join Cryostat Two')
  await colleague.click('text=Create an account')
  await colleague.waitForURL(/\/register/)
  await ready(colleague)
  expect(await colleague.inputValue('#email')).toBe('sami@lab.test')
  await colleague.fill('#name', 'Sami Okafor')
  await colleague.fill('#password', 'setpoint-100pA')
  await colleague.click('button[type=submit]')
  await colleague.waitForURL(/\/invite\//)
  await colleague.click('[data-test=accept-invite]')
  await colleague.waitForURL(/\/labs\/\d+$/)
  await expect.poll(() => colleague.textContent('[data-test=lab-name]')).toBe('Cryostat Two')
  await expect.poll(() => colleague.textContent('[data-test=lab-switcher]')).toContain('member')

  // Back in the first context the new member is listed.
  await pi.reload()
  await pi.waitForSelector('[data-test=member-table] >> text=Sami Okafor')
})
