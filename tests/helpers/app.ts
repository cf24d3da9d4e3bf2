// Starts the built app (.output) as a real server process with its own SQLite file, storage
// folder and local fake SMTP port, the way production runs it. `npm test` builds once before.
import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'

export interface RunningApp { url: string, dir: string, stop: () => Promise<void>, logs: () => string }

export function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const srv = createServer()
    srv.unref()
    srv.on('error', rej)
    srv.listen(0, '127.0.0.1', () => {
      const address = srv.address()
      const port = typeof address === 'object' && address ? address.port : 0
      srv.close(() => res(port))
    })
  })
}

export async function startApp(env: Record<string, string> = {}): Promise<RunningApp> {
  const entry = resolve('.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('No build found: run `npm run build` first (npm test does this).')
  const dir = mkdtempSync(join(tmpdir(), 'tessera-test-'))
  const [port, smtpPort] = [await freePort(), await freePort()]
  let output = ''
  const child: ChildProcess = spawn(process.execPath, [entry], {
    cwd: dir,
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      NODE_ENV: 'production',
      NUXT_DATABASE_URL: `file:${join(dir, 'tessera.db')}`,
      NUXT_STORAGE_DIR: join(dir, 'storage'),
      NUXT_SESSION_PASSWORD: 'test-session-password-with-at-least-32-characters',
      NUXT_FAKE_SMTP_ENABLED: 'true',
      NUXT_FAKE_SMTP_PORT: String(smtpPort),
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  const collect = (d: Buffer) => {
    output += d
  }
  child.stdout?.on('data', collect)
  child.stderr?.on('data', collect)
  const url = `http://127.0.0.1:${port}`
  const deadline = Date.now() + 30_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`App exited early (${child.exitCode}):\n${output}`)
    try {
      const res = await fetch(`${url}/api/labs`)
      if (res.status === 401) break
    }
    catch { /* not listening yet */ }
    if (Date.now() > deadline) throw new Error(`App did not start within 30 s:\n${output}`)
    await new Promise(r => setTimeout(r, 150))
  }
  // The fake SMTP server starts with the app; give it its own readiness check via the outbox.
  return {
    url,
    dir,
    logs: () => output,
    stop: async () => {
      if (child.exitCode === null) {
        const exited = new Promise(r => child.once('exit', r))
        child.kill('SIGTERM')
        await Promise.race([exited, new Promise(r => setTimeout(r, 3000))])
        if (child.exitCode === null) child.kill('SIGKILL')
      }
      rmSync(dir, { recursive: true, force: true })
    },
  }
}
