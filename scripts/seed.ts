// Seed the invented demo into DATABASE_URL when it has no users yet.
import { createDatabase } from '../server/db/client'
import { seedDemoIfEmpty } from '../server/seed/index'
import { DB_NAME, PG_PORT } from './lib/paths'
import { adminUrl } from './lib/pg'

const { pool, db } = createDatabase(process.env.DATABASE_URL ?? adminUrl(PG_PORT, DB_NAME))
const seeded = await seedDemoIfEmpty(db)
console.log(seeded ? '[ohmward] demo data seeded' : '[ohmward] database already has data; seed skipped')
await pool.end()
