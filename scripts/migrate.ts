// Apply migrations to DATABASE_URL (default: the local cluster of `npm start`).
import { runMigrations } from './lib/migrate'
import { DB_NAME, PG_PORT } from './lib/paths'
import { adminUrl } from './lib/pg'

const url = process.env.DATABASE_URL ?? adminUrl(PG_PORT, DB_NAME)
await runMigrations(url)
console.log('[ohmward] migrations applied')
