// The height grid in nm as Float32 (the small TSG1 layout of shared/scan/gridfile.ts).
export default defineEventHandler(async (event) => {
  const { scan } = await scanForCaller(event, 'viewer')
  const raw = scan.grid_key ? await useStorage('scans').getItemRaw(scan.grid_key) : null
  if (!raw) throw createError({ statusCode: 404, message: 'The height grid of this scan is missing from storage' })
  setResponseHeader(event, 'content-type', 'application/octet-stream')
  setResponseHeader(event, 'cache-control', 'private, max-age=31536000, immutable')
  return raw
})
