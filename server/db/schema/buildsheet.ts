import {
  bigserial,
  check,
  doublePrecision,
  index,
  integer,
  jsonb,
  numeric,
  pgTable,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core'
import { sql } from 'drizzle-orm'
import type { CableRunOverrides, ProtectionOverrides } from '../../../shared/buildsheet/index'
import { users } from './auth'
import { scenarios } from './scenarios'
import { vehicles } from './vehicles'

/**
 * Build sheet (issue 7): per-vehicle settings (protection-rule overrides, checklist ticks, cable-run edits,
 * the scenario the sheet is built from) and the parts list. Money is numeric(12,2), read and written as a
 * decimal string; never a float.
 */
const tsz = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' })

export const buildSheetSettings = pgTable('build_sheet_settings', {
  vehicleId: uuid('vehicle_id')
    .primaryKey()
    .references(() => vehicles.id, { onDelete: 'cascade' }),
  /** null = the vehicle's first scenario. */
  scenarioId: uuid('scenario_id').references(() => scenarios.id, { onDelete: 'set null' }),
  protection: jsonb('protection').$type<ProtectionOverrides>().notNull().default({}),
  checklist: jsonb('checklist').$type<Record<string, boolean>>().notNull().default({}),
  cableRuns: jsonb('cable_runs').$type<CableRunOverrides>().notNull().default({}),
  version: integer('version').notNull().default(1),
  updatedAt: tsz('updated_at').notNull().defaultNow(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
})

export const parts = pgTable(
  'parts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    /** Insertion order. */
    position: bigserial('position', { mode: 'number' }).notNull(),
    name: text('name').notNull(),
    quantity: numeric('quantity', { precision: 12, scale: 3 }).notNull(),
    unitPrice: numeric('unit_price', { precision: 12, scale: 2 }).notNull(),
    currency: text('currency').notNull(),
    /** Mass of one unit; null = unknown. [kg] */
    massKg: doublePrecision('mass_kg'),
    note: text('note').notNull().default(''),
    createdAt: tsz('created_at').notNull().defaultNow(),
    version: integer('version').notNull().default(1),
    updatedAt: tsz('updated_at').notNull().defaultNow(),
    updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [
    index('parts_vehicle_idx').on(t.vehicleId, t.position),
    check('parts_quantity_check', sql`${t.quantity} >= 0`),
    check('parts_unit_price_check', sql`${t.unitPrice} >= 0`),
    check('parts_currency_check', sql`${t.currency} ~ '^[A-Z]{3}$'`),
  ],
)
