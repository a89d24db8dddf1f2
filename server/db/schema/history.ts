import { bigserial, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { users } from './auth'
import { vehicles } from './vehicles'

/**
 * Who changed what and when, per vehicle (issue 5). Written in the same transaction as the change.
 * `before`/`after` keep the record's fields for audit; the API shows `summary` and `changedFields`.
 */
export const vehicleHistory = pgTable(
  'vehicle_history',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    /** vehicle | battery | inverter | appliance | source | scenario | membership */
    entity: text('entity').notNull(),
    entityId: text('entity_id'),
    /** create | update | delete | import | duplicate */
    action: text('action').notNull(),
    summary: text('summary').notNull(),
    changedFields: jsonb('changed_fields').$type<string[]>().notNull().default([]),
    version: integer('version'),
    before: jsonb('before').$type<unknown>(),
    after: jsonb('after').$type<unknown>(),
    actorId: text('actor_id').references(() => users.id, { onDelete: 'set null' }),
    at: timestamp('at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
    /** Order of writing: several entries of one transaction share `at`. */
    seq: bigserial('seq', { mode: 'number' }).notNull(),
  },
  (t) => [index('vehicle_history_vehicle_seq_idx').on(t.vehicleId, t.seq)],
)
