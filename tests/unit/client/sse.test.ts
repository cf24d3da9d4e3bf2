// The event-stream parser against the format's own rules (WHATWG HTML §9.2.6, "Interpreting an
// event stream"): events split across chunks, multi-line data, comments, CRLF line ends.
import { describe, expect, it } from 'vitest'
import { createSseParser } from '../../../utils/sse'

describe('createSseParser', () => {
  it('reassembles events split anywhere across chunks', () => {
    const text = 'event: progress\ndata: {"fraction":0.5}\n\nevent: result\ndata: {"id":3}\n\n'
    for (let cut = 1; cut < text.length; cut++) {
      const parse = createSseParser()
      const got = [...parse(text.slice(0, cut)), ...parse(text.slice(cut))]
      expect(got).toEqual([{ event: 'progress', data: '{"fraction":0.5}' }, { event: 'result', data: '{"id":3}' }])
    }
  })

  it('joins data lines with newlines, skips comments, defaults the event name, reads CRLF', () => {
    const parse = createSseParser()
    expect(parse(': keep-alive\r\ndata: a\r\ndata:b\r\n\r\nevent: x\r\n\r\n')).toEqual([{ event: 'message', data: 'a\nb' }])
  })

  it('waits for the blank line before it dispatches', () => {
    const parse = createSseParser()
    expect(parse('event: result\ndata: {}\n')).toEqual([])
    expect(parse('\n')).toEqual([{ event: 'result', data: '{}' }])
  })
})
