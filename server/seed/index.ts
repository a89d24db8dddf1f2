import { sql } from 'drizzle-orm'
import type { Db } from '../db/client'
import { seedUsers } from './users'
import { seedVehicles } from './vehicles'
import { seedBuildSheet } from './buildsheet'
import { seedReviews } from './reviews'
import { seedLogs } from './logs'

/** Seed the invented demo when the database has no users yet. Returns whether it seeded. */
export async function seedDemoIfEmpty(db: Db): Promise<boolean> {
  const r = await db.execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM users`)
  if ((r.rows[0]?.n ?? 0) > 0) return false
  await seedDemo(db)
  return true
}

/** Every demo step, in order. One line per step. */
export async function seedDemo(db: Db): Promise<void> {
  await seedUsers(db)
  await seedVehicles(db)
  await seedBuildSheet(db)
  await seedReviews(db)
  await seedLogs(db)
}
