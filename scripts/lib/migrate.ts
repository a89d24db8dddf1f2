import pg from 'pg'
import { drizzle } from 'drizzle-orm/node-postgres'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import { fileURLToPath } from 'node:url'

export const MIGRATIONS_DIR = fileURLToPath(new URL('../../drizzle', import.meta.url))

/** Apply every migration in drizzle/ that the database has not seen; a second run is a no-op. */
export async function runMigrations(url: string): Promise<void> {
  // Quiet the NOTICEs PostgreSQL prints for "IF NOT EXISTS" on the migrations table.
  const pool = new pg.Pool({ connectionString: url, max: 1, options: '-c client_min_messages=warning' })
  try {
    await migrate(drizzle(pool), { migrationsFolder: MIGRATIONS_DIR })
  } finally {
    await pool.end()
  }
}
