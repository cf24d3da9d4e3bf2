import { and, eq } from 'drizzle-orm'
import { RunClose } from '#shared/logbook'

const PNG_MAGIC = Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A])

// Closes a run (nothing more can be logged) and mails the night summary to the lab's members,
// with the overlay picture the client rendered (or one drawn here when a check exists).
export default defineEventHandler(async (event) => {
  const { db, run, access } = await runForCaller(event, 'member')
  const body = await readBody400(event, RunClose)
  let picture: Buffer | undefined
  if (body.picture_png) {
    picture = Buffer.from(body.picture_png.replace(/^data:image\/png;base64,/, ''), 'base64')
    if (picture.length < 8 || !picture.subarray(0, 8).equals(PNG_MAGIC)) throw createError({ statusCode: 400, message: 'picture_png: not a PNG image (send it base64-encoded)', data: { field: 'picture_png' } })
  }
  const notes = body.note ? `${run.notes}${run.notes ? '\n\n' : ''}At close: ${body.note}` : run.notes
  const [closed] = await db.update(schema.buildRuns).set({ state: 'closed', closed_at: new Date(), closed_by: access.userId, notes })
    .where(and(eq(schema.buildRuns.id, run.id), eq(schema.buildRuns.state, 'open'))).returning()
  if (!closed) throw createError({ statusCode: 409, message: 'This run is already closed.', data: { field: 'run' } })
  await audit(db, { labId: access.labId, userId: access.userId, action: 'run.close', target: `run:${run.id}`, detail: { note: body.note ?? '' } })
  const loaded = await loadRun(db, run.id)
  const mail = await mailNightSummary(event, db, loaded, { note: body.note, picture })
  return { ...(await runView(db, loaded, access.role)), mail }
})
