import { index, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import type { ApplianceUsage, Trip } from '../../../shared/schemas/plan'
import { users } from './auth'
import { appliances, vehicles } from './vehicles'

/**
 * Scenarios (a trip for one vehicle) and their per-appliance usage (issue 5). `trip` is a TripSchema
 * object (shared/schemas/plan.ts); usage rows are ApplianceUsageSchema objects and go when their
 * appliance or scenario goes. Usage is edited through its scenario, so the scenario's version covers it.
 */
const tsz = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' })

export const scenarios = pgTable(
  'scenarios',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    notes: text('notes').notNull().default(''),
    placeName: text('place_name').notNull().default(''),
    trip: jsonb('trip').$type<Trip>().notNull(),
    createdAt: tsz('created_at').notNull().defaultNow(),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    version: integer('version').notNull().default(1),
    updatedAt: tsz('updated_at').notNull().defaultNow(),
    updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [index('scenarios_vehicle_idx').on(t.vehicleId, t.createdAt)],
)

export const scenarioApplianceUsage = pgTable(
  'scenario_appliance_usage',
  {
    scenarioId: uuid('scenario_id')
      .notNull()
      .references(() => scenarios.id, { onDelete: 'cascade' }),
    applianceId: uuid('appliance_id')
      .notNull()
      .references(() => appliances.id, { onDelete: 'cascade' }),
    usage: jsonb('usage').$type<ApplianceUsage>().notNull(),
    version: integer('version').notNull().default(1),
    updatedAt: tsz('updated_at').notNull().defaultNow(),
    updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [
    primaryKey({ columns: [t.scenarioId, t.applianceId] }),
    index('scenario_appliance_usage_appliance_idx').on(t.applianceId),
  ],
)
