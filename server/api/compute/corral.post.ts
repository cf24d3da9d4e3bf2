// Hard-wall circular corral: levels, point spectrum and LDOS map (contract in the README's API section).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'corral', input: await readJson(event) })
})
