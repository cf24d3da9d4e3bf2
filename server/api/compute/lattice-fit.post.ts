// Lattice fit from marks (contract in DESIGN.md §4).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'lattice-fit', input: await readJson(event) })
})
