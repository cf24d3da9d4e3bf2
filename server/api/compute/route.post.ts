// The route solver, stateless (contract in the README's API section). Runs in a worker with a time limit.
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'route', input: await readJson(event) })
})
