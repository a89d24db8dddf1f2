import pg from 'pg'
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres'
import * as schema from './schema/index'

export type Db = NodePgDatabase<typeof schema>

export interface Database {
  pool: pg.Pool
  db: Db
}

export function createDatabase(url: string, options: { max?: number } = {}): Database {
  const pool = new pg.Pool({
    connectionString: url,
    max: options.max ?? 10,
    connectionTimeoutMillis: 3_000,
    idleTimeoutMillis: 30_000,
  })
  // A dropped connection (e.g. the database restarted) must not crash the process; the pool replaces it.
  pool.on('error', () => {})
  return { pool, db: drizzle(pool, { schema }) }
}
