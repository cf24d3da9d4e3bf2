export default defineEventHandler(async () => {
  if (!useRuntimeConfig().fakeSmtp.enabled) throw createError({ statusCode: 404, message: 'Not found' })
  await useStorage('outbox').clear()
  return { ok: true }
})
