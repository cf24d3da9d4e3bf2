// A tiny HTTP client with a cookie jar: one instance is one signed-in (or anonymous) user.
export interface Res<T = any> { status: number, body: T, headers: Headers }

export class Client {
  private cookies = new Map<string, string>()
  constructor(readonly base: string) {}

  async request<T = any>(method: string, path: string, body?: unknown, init: RequestInit = {}): Promise<Res<T>> {
    const headers = new Headers(init.headers)
    if (this.cookies.size) headers.set('cookie', [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; '))
    let payload: BodyInit | undefined = init.body ?? undefined
    if (body !== undefined) {
      headers.set('content-type', 'application/json')
      payload = JSON.stringify(body)
    }
    const res = await fetch(this.base + path, { ...init, method, headers, body: payload })
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';')
      const eq = pair!.indexOf('=')
      const name = pair!.slice(0, eq)
      const value = pair!.slice(eq + 1)
      if (!value || /Max-Age=0|Expires=Thu, 01 Jan 1970/i.test(c)) this.cookies.delete(name)
      else this.cookies.set(name, value)
    }
    const text = await res.text()
    let parsed: any = text
    try {
      parsed = text ? JSON.parse(text) : undefined
    }
    catch { /* not JSON */ }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }
  patch<T = any>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body ?? {}) }
  delete<T = any>(path: string) { return this.request<T>('DELETE', path) }

  /** Multipart upload of one file with text fields, as the browser's upload form sends it. */
  upload<T = any>(path: string, file: { name: string, data: Uint8Array | string, type?: string }, fields: Record<string, string | number> = {}) {
    const form = new FormData()
    for (const [k, v] of Object.entries(fields)) form.append(k, String(v))
    form.append('file', new Blob([file.data as BlobPart], { type: file.type ?? 'application/octet-stream' }), file.name)
    return this.request<T>('POST', path, undefined, { body: form })
  }

  async register(email: string, name = 'Test User', password = 'correct horse battery') {
    const res = await this.post('/api/auth/register', { email, password, name })
    if (res.status !== 200) throw new Error(`register ${email}: ${res.status} ${JSON.stringify(res.body)}`)
    return res.body.user as { id: number, email: string, name: string }
  }
}

export interface OutboxMessage { id: string, to: string[], subject: string, text: string }

/** Waits for a message to arrive at the app's fake SMTP server (read through the dev outbox). */
export async function waitForMail(base: string, match: (m: OutboxMessage) => boolean, timeoutMs = 10_000): Promise<OutboxMessage> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const res = await fetch(`${base}/api/dev/outbox`)
    if (res.ok) {
      const found = (await res.json() as OutboxMessage[]).find(match)
      if (found) return found
    }
    if (Date.now() > deadline) throw new Error('Expected mail did not arrive')
    await new Promise(r => setTimeout(r, 100))
  }
}

export function linkIn(text: string, path: string): string {
  const m = text.match(new RegExp(`https?://\\S+${path}/\\S+`))
  if (!m) throw new Error(`No ${path} link in: ${text}`)
  return m[0]
}
