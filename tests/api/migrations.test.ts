import { describe, it, expect } from 'vitest'
import pg from 'pg'
import { runMigrations } from '../../scripts/lib/migrate'

/** A brand-new database migrates from zero, and a second migrate changes nothing. */
describe('migrations', () => {
  it('apply to an empty database and are a no-op the second time', async () => {
    const adminUrl = process.env.PG_ADMIN_URL
    if (!adminUrl) throw new Error('PG_ADMIN_URL is set by npm test')
    const name = `t_migrate_${process.pid}_${Date.now().toString(36)}`
    const admin = new pg.Client({ connectionString: adminUrl })
    await admin.connect()
    await admin.query(`CREATE DATABASE ${name}`)
    const url = adminUrl.replace(/\/postgres$/, `/${name}`)
    try {
      await runMigrations(url)
      const db = new pg.Client({ connectionString: url })
      await db.connect()
      const tablesOf = async () =>
        (
          await db.query<{ t: string }>(
            "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = 'public' ORDER BY 1",
          )
        ).rows.map((r) => r.t)
      const count = async () =>
        Number((await db.query('SELECT count(*) FROM drizzle.__drizzle_migrations')).rows[0].count)
      const tables1 = await tablesOf()
      const applied1 = await count()
      expect(tables1).toEqual(expect.arrayContaining(['users', 'sessions']))
      expect(applied1).toBeGreaterThan(0)

      await runMigrations(url)
      expect(await tablesOf()).toEqual(tables1)
      expect(await count()).toBe(applied1)
      await db.end()
    } finally {
      await admin.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`)
      await admin.end()
    }
  })
})
