// The original file, byte for byte as it was uploaded.
export default defineEventHandler(async (event) => {
  const { scan } = await scanForCaller(event, 'viewer')
  const raw = await useStorage('scans').getItemRaw(scan.storage_key)
  if (!raw) throw createError({ statusCode: 404, message: 'The original file of this scan is missing from storage' })
  setResponseHeader(event, 'content-type', 'application/octet-stream')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${scan.filename.replace(/["\\\r\n]/g, '_')}"`)
  return raw
})
