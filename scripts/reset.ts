// `npm run db:reset`: drop and recreate the local demo database, migrate and seed it again.
import pg from 'pg'
import { ensureCluster, startCluster, ensureDatabase, adminUrl, log } from './lib/pg'
import { runMigrations } from './lib/migrate'
import { PG_DIR, PG_PORT, DB_NAME } from './lib/paths'
import { createDatabase } from '../server/db/client'
import { seedDemo } from '../server/seed/index'

const cluster = ensureCluster(PG_DIR, PG_PORT)
startCluster(cluster)
await ensureDatabase(PG_PORT, 'postgres')
const admin = new pg.Client({ connectionString: adminUrl(PG_PORT) })
await admin.connect()
await admin.query(`DROP DATABASE IF EXISTS "${DB_NAME}" WITH (FORCE)`)
await admin.end()
const url = await ensureDatabase(PG_PORT, DB_NAME)
await runMigrations(url)
const { pool, db } = createDatabase(url, { max: 1 })
await seedDemo(db)
await pool.end()
log('demo database reset')
