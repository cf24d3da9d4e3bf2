import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'

// The local stand-in for the hosted mail service: a real SMTP server on loopback that keeps
// every message it receives in the 'outbox' storage, where /dev/outbox shows them.
export default defineNitroPlugin((nitro) => {
  const { fakeSmtp } = useRuntimeConfig()
  if (!fakeSmtp.enabled) return
  const outbox = useStorage('outbox')
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const id = `${Date.now()}-${Math.random().toString(36).slice(2, 8)}`
          await outbox.setItem(`${id}.json`, {
            id,
            received_at: new Date().toISOString(),
            from: parsed.from?.text ?? '',
            to: session.envelope.rcptTo.map(r => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            attachments: parsed.attachments.map(a => ({ filename: a.filename ?? '', contentType: a.contentType, size: a.size })),
          })
          callback()
        })
        .catch(callback)
    },
  })
  server.on('error', e => console.error('[tessera] fake SMTP:', e.message))
  server.listen(Number(fakeSmtp.port), '127.0.0.1', () => console.info(`[tessera] fake SMTP listening on 127.0.0.1:${fakeSmtp.port}`))
  nitro.hooks.hook('close', () => new Promise<void>(resolve => server.close(() => resolve())))
})
