// A build run with its current route, every logbook entry, the derived state (current move,
// where each atom is now, outcome counts), the plan's history and a forecast.
export default defineEventHandler(async (event) => {
  const { db, run, access } = await runForCaller(event, 'viewer')
  return runView(db, await loadRun(db, run.id), access.role)
})
