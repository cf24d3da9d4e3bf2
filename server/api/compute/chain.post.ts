// 1-D box levels and densities for an atomic chain (contract in the README).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'chain', input: await readJson(event) })
})
