import { eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { OUTCOMES } from '#shared/logbook'
import type { Db } from './db'
import type { LoadedRun } from './runs'

// The night summary mailed to the lab's members when a run is closed: moves done, outcome counts,
// the as-built fidelity if a check exists, a link to the printable report, the overlay picture.

const LABEL: Record<string, string> = { 'placed': 'placed', 'stayed': 'stayed', 'off-site': 'off-site', 'lost': 'lost', 'tip-change': 'tip change', 'skipped': 'skipped' }
const escape = (s: string) => s.replace(/[&<>"]/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!)
const when = (d: Date | null) => d ? d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC' : '—'

export async function mailNightSummary(event: H3Event, db: Db, loaded: LoadedRun, opts: { note?: string, picture?: Buffer }) {
  const { run, state } = loaded
  const members = await db.select({ email: schema.users.email, name: schema.users.name, id: schema.users.id }).from(schema.memberships)
    .innerJoin(schema.users, eq(schema.users.id, schema.memberships.user_id)).where(eq(schema.memberships.lab_id, run.lab_id))
  const build = run.build_id ? await db.query.builds.findFirst({ where: eq(schema.builds.id, run.build_id) }) : undefined
  const lab = await db.query.labs.findFirst({ where: eq(schema.labs.id, run.lab_id) })
  const names = await userNames(db, [run.started_by, ...(run.closed_by ? [run.closed_by] : [])])
  const check = await latestRunCheck(db, run.lab_id, run.id)
  let picture = opts.picture
  if (!picture && check) {
    const scan = await db.query.scans.findFirst({ where: eq(schema.scans.id, check.scan_id) })
    picture = scan ? await drawCheckPng(scan, check.result as never).catch(() => undefined) : undefined
  }
  const done = Object.entries(state.counts).filter(([o]) => o !== 'stayed' && o !== 'tip-change').reduce((s, [, n]) => s + n, 0)
  const outcomes = OUTCOMES.map(o => `${LABEL[o]} ${state.counts[o]}`).join(' · ')
  const replans = state.chain.length - 1
  const res = check?.result as { placed?: number[], site_status?: unknown[] } | undefined
  const fidelity = check
    ? `As-built check: fidelity ${(check.fidelity * 100).toFixed(1)} % (${res?.placed?.length ?? '?'} of ${res?.site_status?.length ?? '?'} sites placed), RMS deviation ${check.rms_nm === null ? '—' : `${check.rms_nm.toFixed(3)} nm`}, tolerance ${check.tolerance_nm} nm.`
    : 'No as-built check recorded for this run yet.'
  const link = `${baseUrl(event)}/labs/${run.lab_id}/runs/${run.id}/report`
  const title = `Night summary: ${build?.name ?? `run ${run.id}`}`
  const lines = [
    `${title} (${lab?.name ?? 'lab'})`,
    '',
    `Run ${run.id}: started ${when(run.started_at)} by ${names.get(run.started_by) ?? '?'}, closed ${when(run.closed_at)}${run.closed_by ? ` by ${names.get(run.closed_by) ?? '?'}` : ''}.`,
    `Moves done: ${done} (${state.entries_total} logbook entries, ${replans} re-plan${replans === 1 ? '' : 's'}).`,
    `Outcomes: ${outcomes}.`,
    fidelity,
    ...(opts.note ? ['', `Note: ${opts.note}`] : []),
    '',
    `Printable report: ${link}`,
    '',
    'Tessera plans and records; the instrument does the moving. Check coordinates against the instrument\'s own frame before any scripted move; cryogen, high-voltage and vacuum work follows the facility\'s own safety rules.',
  ]
  const html = `<div style="font-family:sans-serif">${lines.map(l => l ? `<p>${escape(l).replace(escape(link), `<a href="${escape(link)}">${escape(link)}</a>`)}</p>` : '').join('')}${picture ? '<p><img src="cid:overlay" alt="As-built overlay" style="max-width:640px"></p>' : ''}</div>`
  const to = members.map(m => m.email)
  const sent = await sendMail({
    to, subject: title, text: lines.join('\n'), html,
    ...(picture && { attachments: [{ filename: `run-${run.id}-overlay.png`, content: picture, cid: 'overlay' }] }),
  }).catch((e: Error) => {
    console.error('[tessera] night summary mail failed:', e.message)
    return { sent: false }
  })
  return { sent: sent.sent, to: to.length, picture: !!picture }
}
