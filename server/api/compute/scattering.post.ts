// s-wave multiple scattering for any arrangement of scatterers (contract in the README).
export default defineEventHandler(async (event) => {
  await requireUserId(event)
  return runCompute({ kind: 'scattering', input: await readJson(event) })
})
