import { pgTable, text, timestamp, integer } from 'drizzle-orm/pg-core'

/**
 * Hit counters for express-rate-limit (server/auth/rate-limit-store.ts), shared by every server process on
 * the database. One row per limiter + client key; the window restarts when `resetAt` has passed.
 */
export const rateLimits = pgTable('rate_limits', {
  key: text('key').primaryKey(),
  hits: integer('hits').notNull(),
  resetAt: timestamp('reset_at', { withTimezone: true, mode: 'date' }).notNull(),
})
