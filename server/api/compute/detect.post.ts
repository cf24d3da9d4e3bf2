// Adatom detection on a grid sent as JSON (contract in DESIGN.md §4).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  const result = await runCompute<{ marks: unknown[] }>({ kind: 'detect', input: await readJson(event) })
  return { marks: result.marks }
})
