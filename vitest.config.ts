import { defineConfig } from 'vitest/config'

// unit: the shared core and pure helpers, plain Node. server: HTTP against the built app (a real
// server process per file, each with its own SQLite file). e2e: the system Chromium against the
// built app. `npm test` builds once before these run.
export default defineConfig({
  test: {
    projects: [
      // Brute-force reference checks are heavy; a loaded CI machine must not turn them into timeouts.
      { test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node', testTimeout: 60_000 } },
      { test: { name: 'server', include: ['tests/server/**/*.test.ts'], environment: 'node', testTimeout: 60_000, hookTimeout: 60_000 } },
      { test: { name: 'e2e', include: ['tests/e2e/**/*.test.ts'], environment: 'node', testTimeout: 120_000, hookTimeout: 60_000 } },
    ],
  },
})
