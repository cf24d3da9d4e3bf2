import { existsSync, mkdirSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { createClient } from '@libsql/client'
import { drizzle } from 'drizzle-orm/libsql'
import { migrate } from 'drizzle-orm/libsql/migrator'
import * as schema from '../database/schema'

export { schema }
export type Db = ReturnType<typeof drizzle<typeof schema>>

// One client per process; the first caller also applies pending migrations, and every caller
// waits for them (Nitro plugins are not awaited, so the plugin alone cannot guarantee it).
let ready: Promise<Db> | undefined

function migrationsFolder(configured: string): string {
  const candidates = [
    configured,
    process.argv[1] ? join(dirname(process.argv[1]), 'migrations') : '',
    resolve('server/database/migrations'),
  ].filter(Boolean)
  const found = candidates.find(dir => existsSync(join(dir, 'meta/_journal.json')))
  if (!found) throw new Error(`Database migrations not found (looked in ${candidates.join(', ')})`)
  return found
}

async function open(): Promise<Db> {
  const config = useRuntimeConfig()
  const url = config.databaseUrl
  if (url.startsWith('file:')) {
    const path = url.slice('file:'.length)
    if (path !== ':memory:') mkdirSync(dirname(resolve(path)), { recursive: true })
  }
  const client = createClient({ url, authToken: config.databaseAuthToken || undefined })
  if (url.startsWith('file:')) {
    // WAL lets readers proceed while a writer commits; busy_timeout makes concurrent writers wait
    // for the lock instead of failing.
    await client.execute('PRAGMA journal_mode = WAL')
    await client.execute('PRAGMA busy_timeout = 5000')
    await client.execute('PRAGMA foreign_keys = ON')
  }
  const db = drizzle(client, { schema })
  await migrate(db, { migrationsFolder: migrationsFolder(config.migrationsDir) })
  return db
}

export function useDb(): Promise<Db> {
  ready ??= open().catch((e) => {
    ready = undefined
    throw e
  })
  return ready
}
