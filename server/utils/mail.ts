import nodemailer from 'nodemailer'

export interface Mail { to: string | string[], subject: string, text: string, html?: string, attachments?: { filename: string, content: Buffer, cid?: string }[] }

// Production: the SMTP host from the environment. Development and tests: the local fake SMTP
// server that the fake-smtp plugin starts (it keeps every message for /dev/outbox).
function transport() {
  const { smtp, fakeSmtp } = useRuntimeConfig()
  if (smtp.host) {
    return nodemailer.createTransport({
      host: smtp.host,
      port: Number(smtp.port),
      secure: Boolean(smtp.secure),
      auth: smtp.user ? { user: smtp.user, pass: smtp.pass } : undefined,
    })
  }
  if (fakeSmtp.enabled) {
    return nodemailer.createTransport({ host: '127.0.0.1', port: Number(fakeSmtp.port), secure: false, ignoreTLS: true })
  }
  return undefined
}

export async function sendMail(mail: Mail): Promise<{ sent: boolean }> {
  const t = transport()
  if (!t) {
    console.warn(`[tessera] no SMTP configured; mail "${mail.subject}" to ${String(mail.to)} not sent`)
    return { sent: false }
  }
  await t.sendMail({ from: useRuntimeConfig().smtp.from, ...mail })
  return { sent: true }
}
