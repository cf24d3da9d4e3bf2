// What the local fake SMTP server received, newest first. Exists only where the fake server runs
// (development, and test runs that turn it on); elsewhere there is nothing to see.
export default defineEventHandler(async () => {
  if (!useRuntimeConfig().fakeSmtp.enabled) throw createError({ statusCode: 404, message: 'Not found' })
  const outbox = useStorage('outbox')
  const keys = (await outbox.getKeys()).sort().reverse()
  const items = await Promise.all(keys.map(k => outbox.getItem(k)))
  return items.filter(Boolean)
})
