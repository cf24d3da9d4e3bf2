// Adatom detection on a grid sent as JSON (contract in the README's API section).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  const result = await runCompute<{ marks: unknown[] }>({ kind: 'detect', input: await readJson(event) })
  return { marks: result.marks }
})
