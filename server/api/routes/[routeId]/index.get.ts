// One saved route in full: options, the solver's result with its paths, the blueprint version.
export default defineEventHandler(async (event) => {
  const { db, route } = await routeForCaller(event, 'viewer')
  return routeView(db, route)
})
