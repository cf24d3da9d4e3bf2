import { defineConfig } from 'drizzle-kit'

// `npm run db:generate` writes SQL migrations from server/database/schema.ts (no database needed).
export default defineConfig({
  dialect: 'sqlite',
  schema: './server/database/schema.ts',
  out: './server/database/migrations',
})
