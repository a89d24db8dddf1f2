import { index, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { users } from './auth'
import { vehicles } from './vehicles'

const tsz = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' })

/** The roles an invitation can give (ownership only moves by transfer). */
export const invitationRole = pgEnum('invitation_role', ['editor', 'viewer', 'advisor'])

/**
 * Invitations to a vehicle's crew (issue 8). The token exists only in the mail; the row keeps its SHA-256.
 * Single use: `acceptedAt` is set in the same statement that checks it is unused and unexpired.
 * Accepting writes a row to vehicle_memberships and one to vehicle_history.
 */
export const vehicleInvitations = pgTable(
  'vehicle_invitations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    /** Lower-cased; only the account with this address can accept. */
    email: text('email').notNull(),
    role: invitationRole('role').notNull(),
    tokenHash: text('token_hash').notNull(),
    invitedBy: text('invited_by').references(() => users.id, { onDelete: 'set null' }),
    expiresAt: tsz('expires_at').notNull(),
    acceptedAt: tsz('accepted_at'),
    acceptedBy: text('accepted_by').references(() => users.id, { onDelete: 'set null' }),
    revokedAt: tsz('revoked_at'),
    createdAt: tsz('created_at').notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('vehicle_invitations_token_key').on(t.tokenHash),
    index('vehicle_invitations_vehicle_idx').on(t.vehicleId, t.createdAt),
  ],
)
