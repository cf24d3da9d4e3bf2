// As-built check: one-to-one matching of found atoms to blueprint sites (contract in the README's API section).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'check', input: await readJson(event) })
})
