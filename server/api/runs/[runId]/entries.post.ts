import { EntryInput } from '#shared/logbook'

// Logs one outcome of a move (append-only; a correction is a new entry that supersedes another).
// 201 with the new entry; 200 with the same entry when the idempotency key was seen before.
export default defineEventHandler(async (event) => {
  const { db, run, access } = await runForCaller(event, 'member')
  const body = await readBody400(event, EntryInput)
  const { entry, replayed } = await appendEntry(db, run.id, access.userId, body)
  setResponseStatus(event, replayed ? 200 : 201)
  return { entry, replayed }
})
