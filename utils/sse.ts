// Server-sent events over a POST answer (EventSource only speaks GET): an incremental parser of
// the text/event-stream format (WHATWG HTML §9.2: `field: value` lines, `data` lines joined by
// newlines, a blank line ends an event, lines starting with `:` are comments), and a poster that
// reports progress events and resolves with the `result` event.
export interface SseEvent { event: string, data: string }

export function createSseParser(): (chunk: string) => SseEvent[] {
  let buf = ''
  let event = ''
  let data: string[] = []
  return (chunk) => {
    buf += chunk
    const out: SseEvent[] = []
    for (;;) {
      const m = /\r\n|\r|\n/.exec(buf)
      // A lone \r at the very end may be the first half of \r\n: wait for more.
      if (!m || (m[0] === '\r' && m.index === buf.length - 1)) break
      const line = buf.slice(0, m.index)
      buf = buf.slice(m.index + m[0].length)
      if (line === '') {
        if (data.length) out.push({ event: event || 'message', data: data.join('\n') })
        event = ''
        data = []
        continue
      }
      if (line.startsWith(':')) continue
      const colon = line.indexOf(':')
      const field = colon < 0 ? line : line.slice(0, colon)
      let value = colon < 0 ? '' : line.slice(colon + 1)
      if (value.startsWith(' ')) value = value.slice(1)
      if (field === 'event') event = value
      else if (field === 'data') data.push(value)
    }
    return out
  }
}

export interface Progress { fraction: number, stage: string, elapsed_ms: number }

/**
 * POSTs JSON asking for `text/event-stream`; calls `onProgress` for each `progress` event and
 * resolves with the `result` event's data. Errors (before or during the stream) reject shaped
 * like a fetch error ({ statusCode, data: { message, data } }) so that apiProblem() reads them.
 */
export async function postWithProgress<T>(url: string, body: unknown, onProgress: (p: Progress) => void, signal?: AbortSignal): Promise<T> {
  let res: Response
  try {
    res = await fetch(url, { method: 'POST', headers: { 'accept': 'text/event-stream', 'content-type': 'application/json' }, body: JSON.stringify(body), credentials: 'same-origin', signal })
  }
  catch {
    throw { message: 'Could not reach the server. Check the connection and try again.' }
  }
  if (!res.ok || !res.body) {
    const data = await res.json().catch(() => ({ message: `The server answered ${res.status}` }))
    throw { statusCode: res.status, data }
  }
  const parse = createSseParser()
  const reader = res.body.pipeThrough(new TextDecoderStream()).getReader()
  for (;;) {
    const { value, done } = await reader.read()
    if (done) break
    for (const e of parse(value)) {
      const payload = JSON.parse(e.data)
      if (e.event === 'progress') onProgress(payload as Progress)
      else if (e.event === 'result') return payload as T
      else if (e.event === 'error') throw { statusCode: payload.statusCode, data: payload }
    }
  }
  throw { statusCode: 502, data: { message: 'The connection closed before the route was solved. It may still be saved: reload the routes in a minute.' } }
}
