import { ReplanRequest } from '#shared/logbook'

// Re-plans the remaining moves of a run (from the logbook's positions, or from a newer scan) and
// answers with the run as it now stands.
export default defineEventHandler(async (event) => {
  const { db, run, access } = await runForCaller(event, 'member')
  const body = await readBody400(event, ReplanRequest)
  await replanRun(db, await loadRun(db, run.id), access.userId, body)
  return runView(db, await loadRun(db, run.id), access.role)
})
