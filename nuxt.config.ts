import { cp } from 'node:fs/promises'
import { join } from 'node:path'

// https://nuxt.com/docs/api/configuration/nuxt-config
export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/eslint'],
  $development: {
    runtimeConfig: {
      fakeSmtp: { enabled: true, port: 2525 },
      public: { devOutbox: true },
    },
  },
  devtools: { enabled: false },
  app: {
    head: {
      title: 'Tessera',
      htmlAttrs: { lang: 'en' },
      meta: [{ name: 'description', content: 'Plan, build and check atom-by-atom nanostructures.' }],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  css: ['~/assets/css/main.css'],
  runtimeConfig: {
    // file:./data/tessera.db by default; a libsql:// or https:// URL for a libSQL server.
    databaseUrl: 'file:./data/tessera.db',
    databaseAuthToken: '',
    migrationsDir: '',
    storageDir: './data/storage',
    storageDriver: 'fs',
    s3: { endpoint: '', bucket: '', region: 'auto', accessKeyId: '', secretAccessKey: '' },
    uploadMaxBytes: 256 * 1024 * 1024,
    publicBaseUrl: '',
    demo: false,
    // Time limit of one route solve in the worker pool (ms); the solver stops itself at it.
    routeTimeLimitMs: 180_000,
    smtp: { host: '', port: 587, secure: false, user: '', pass: '', from: 'Tessera <tessera@localhost>' },
    // A local SMTP server that keeps every message; on in development, opt-in elsewhere.
    fakeSmtp: { enabled: false, port: 2525 },
    session: {
      name: 'tessera-session',
      password: '',
      maxAge: 60 * 60 * 24 * 14,
      cookie: { secure: true, sameSite: 'lax' },
    },
    public: { devOutbox: false },
  },
  // Keep pages/, components/, stores/… at the repository root even if an app/ folder appears.
  srcDir: '.',
  routeRules: {
    // The workspace canvas is client-only (konva needs a DOM).
    '/labs/*/builds/**': { ssr: false },
    '/labs/*/runs/**': { ssr: false },
  },
  compatibilityDate: '2026-11-01',
  nitro: {
    hooks: {
      // Ship the migrations inside .output so the production build is self-contained.
      async compiled(nitro) {
        const { rootDir, output } = nitro.options
        await cp(join(rootDir, 'server/database/migrations'), join(output.serverDir, 'migrations'), { recursive: true })
        // The compute worker is its own bundle: worker threads load a file, not a chunk.
        const { build } = await import('esbuild')
        await build({
          entryPoints: [join(rootDir, 'server/workers/compute.ts')],
          outfile: join(output.serverDir, 'workers/compute.mjs'),
          bundle: true, platform: 'node', format: 'esm', target: 'node20', logLevel: 'warning',
          banner: { js: 'import { createRequire as __cr } from "node:module"; const require = __cr(import.meta.url);' },
        })
      },
    },
  },
  vite: {
    optimizeDeps: { include: ['konva', 'vue-konva', 'chart.js', 'vue-chartjs', 'zod'] },
  },
  typescript: { strict: true },
  eslint: {
    config: { stylistic: true },
  },
})
