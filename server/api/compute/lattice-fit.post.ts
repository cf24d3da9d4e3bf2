// Lattice fit from marks (contract in the README's API section).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'lattice-fit', input: await readJson(event) })
})
