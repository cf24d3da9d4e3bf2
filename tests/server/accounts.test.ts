// Accounts against the built app with its own SQLite file: register, sign in, sign out, the
// session requirement, rate limiting, and the password reset link received by the fake SMTP server.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type RunningApp } from '../helpers/app'
import { Client, linkIn, waitForMail } from '../helpers/client'

let app: RunningApp
beforeAll(async () => {
  app = await startApp()
})
afterAll(async () => {
  await app?.stop()
})

describe('accounts', () => {
  it('registers, reads its labs, signs out and back in', async () => {
    const c = new Client(app.url)
    const user = await c.register('ada@lab.test', 'Ada Quill')
    expect(user).toMatchObject({ email: 'ada@lab.test', name: 'Ada Quill' })
    expect((await c.get('/api/labs')).status).toBe(200)
    expect((await c.post('/api/auth/logout')).status).toBe(200)
    expect((await c.get('/api/labs')).status).toBe(401)
    const login = await c.post('/api/auth/login', { email: 'ADA@lab.test ', password: 'correct horse battery' })
    expect(login.status).toBe(200)
    expect((await c.get('/api/labs')).status).toBe(200)
  })

  it('answers 409 with a clear message for an e-mail already registered', async () => {
    const c = new Client(app.url)
    await c.register('twice@lab.test')
    const again = await new Client(app.url).post('/api/auth/register', { email: 'twice@lab.test', password: 'another password', name: 'X' })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/already exists/)
  })

  it('names the bad field in a 400 and never a 500', async () => {
    const c = new Client(app.url)
    const cases: [unknown, string][] = [
      [{ email: 'not-an-email', password: 'long enough pw', name: 'A' }, 'email'],
      [{ email: 'a@b.test', password: 'short', name: 'A' }, 'password'],
      [{ email: 'a@b.test', password: 'long enough pw', name: '' }, 'name'],
      [{ email: 'a@b.test', password: 12345678901, name: 'A' }, 'password'],
    ]
    for (const [body, field] of cases) {
      const res = await c.post('/api/auth/register', body)
      expect(res.status).toBe(400)
      expect(res.body.data.field).toBe(field)
      expect(res.body.message).toContain(field)
    }
    const notJson = await c.request('POST', '/api/auth/login', undefined, { body: '{oops', headers: { 'content-type': 'application/json' } })
    expect(notJson.status).toBe(400)
  })

  it('rejects wrong credentials with 401 and rate-limits repeated failures', async () => {
    const c = new Client(app.url)
    await c.register('limit@lab.test')
    const anon = new Client(app.url)
    const statuses: number[] = []
    for (let i = 0; i < 9; i++) statuses.push((await anon.post('/api/auth/login', { email: 'limit@lab.test', password: 'wrong password' })).status)
    expect(statuses.slice(0, 8).every(s => s === 401)).toBe(true)
    expect(statuses[8]).toBe(429)
    // Even the right password is refused while the limit holds.
    expect((await anon.post('/api/auth/login', { email: 'limit@lab.test', password: 'correct horse battery' })).status).toBe(429)
  })

  it('needs a session for every lab route', async () => {
    const anon = new Client(app.url)
    for (const [method, path] of [['GET', '/api/labs'], ['POST', '/api/labs'], ['GET', '/api/labs/1/samples'], ['POST', '/api/labs/1/samples'], ['GET', '/api/labs/1/members']] as const) {
      expect((await anon.request(method, path, method === 'POST' ? {} : undefined)).status).toBe(401)
    }
  })

  it('resets a password through the e-mailed link, once', async () => {
    const c = new Client(app.url)
    await c.register('forgetful@lab.test')
    const anon = new Client(app.url)
    expect((await anon.post('/api/auth/forgot', { email: 'forgetful@lab.test' })).status).toBe(200)
    // Unknown addresses get the same answer, and no mail.
    expect((await anon.post('/api/auth/forgot', { email: 'nobody@lab.test' })).status).toBe(200)
    const mail = await waitForMail(app.url, m => m.to.includes('forgetful@lab.test') && /Reset/.test(m.subject))
    const token = linkIn(mail.text, '/reset').split('/reset/')[1]!
    const reset = await anon.post('/api/auth/reset', { token, password: 'a brand new password' })
    expect(reset.status).toBe(200)
    expect((await anon.get('/api/labs')).status).toBe(200)
    const reuse = await new Client(app.url).post('/api/auth/reset', { token, password: 'yet another password' })
    expect(reuse.status).toBe(400)
    expect(reuse.body.message).toMatch(/already been used/)
    expect((await new Client(app.url).post('/api/auth/login', { email: 'forgetful@lab.test', password: 'a brand new password' })).status).toBe(200)
    expect((await new Client(app.url).post('/api/auth/login', { email: 'forgetful@lab.test', password: 'correct horse battery' })).status).toBe(401)
    const outbox = await (await fetch(`${app.url}/api/dev/outbox`)).json() as { to: string[] }[]
    expect(outbox.some(m => m.to.includes('nobody@lab.test'))).toBe(false)
  })
})
