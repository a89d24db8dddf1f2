/**
 * Named prepared statements for the hottest reads (every page load runs them). Drizzle builds a prepared
 * query's SQL once, and PostgreSQL parses and plans a named statement once per connection, so a request pays
 * only for binding and running it. A prepared query belongs to one Drizzle instance, so it is built on first
 * use for each (the server has one; tests and benches may have several).
 */
import type { Db } from './client'

export function preparedFor<T>(build: (db: Db) => T): (db: Db) => T {
  const byDb = new WeakMap<Db, T>()
  return (db) => {
    let query = byDb.get(db)
    if (!query) {
      query = build(db)
      byDb.set(db, query)
    }
    return query
  }
}
