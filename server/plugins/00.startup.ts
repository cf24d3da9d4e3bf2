// Start-up: fail fast on a production server without a session secret (otherwise every session
// call would fail later with a 500), then open the database, which applies migrations, and seed
// the demo lab where asked.
export default defineNitroPlugin(async () => {
  const config = useRuntimeConfig()
  if (!import.meta.dev && (config.session.password?.length ?? 0) < 32) {
    console.error('[tessera] NUXT_SESSION_PASSWORD must be set to at least 32 characters in production.')
    process.exit(1)
  }
  try {
    const db = await useDb()
    if (import.meta.dev || config.demo || process.env.TESSERA_DEMO === '1') await seedDemo(db)
  }
  catch (e) {
    console.error('[tessera] database start-up failed:', e)
    process.exit(1)
  }
})
