import { pgTable, text, timestamp, integer, pgEnum, index, uniqueIndex } from 'drizzle-orm/pg-core'
import { sql } from 'drizzle-orm'

export const accountRole = pgEnum('account_role', ['member', 'advisor', 'admin'])
export const unitSystem = pgEnum('unit_system', ['metric', 'imperial'])
export const temperatureUnit = pgEnum('temperature_unit', ['C', 'F'])

/** People. Lucia's user table: `id text` primary key. E-mail is stored lower-cased. */
export const users = pgTable(
  'users',
  {
    id: text('id').primaryKey(),
    email: text('email').notNull(),
    displayName: text('display_name').notNull(),
    passwordHash: text('password_hash').notNull(),
    role: accountRole('role').notNull().default('member'),
    emailVerifiedAt: timestamp('email_verified_at', { withTimezone: true, mode: 'date' }),
    unitSystem: unitSystem('unit_system').notNull().default('metric'),
    temperatureUnit: temperatureUnit('temperature_unit').notNull().default('C'),
    currency: text('currency').notNull().default('EUR'),
    version: integer('version').notNull().default(1),
    createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('users_email_key').on(sql`lower(${t.email})`)],
)

/** Lucia's session table. */
export const sessions = pgTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
)

export const authTokenPurpose = pgEnum('auth_token_purpose', [
  'verify_email',
  'reset_password',
  'change_email',
])

/**
 * Single-use e-mailed tokens (e-mail verification, password reset, e-mail change). Only the SHA-256 hash of
 * the token is stored; the token itself exists only in the mail. `email` is the address the link proves.
 */
export const authTokens = pgTable(
  'auth_tokens',
  {
    tokenHash: text('token_hash').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: authTokenPurpose('purpose').notNull(),
    email: text('email').notNull(),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true, mode: 'date' }),
    createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  },
  (t) => [index('auth_tokens_user_idx').on(t.userId, t.purpose)],
)
