// As-built check: one-to-one matching of found atoms to blueprint sites (contract in DESIGN.md §4).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'check', input: await readJson(event) })
})
