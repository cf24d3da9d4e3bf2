// Hard-wall circular corral: levels, point spectrum and LDOS map (contract in DESIGN.md §4).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'corral', input: await readJson(event) })
})
