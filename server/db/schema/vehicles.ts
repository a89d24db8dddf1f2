import { sql } from 'drizzle-orm'
import {
  bigserial,
  check,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core'
import type { ApplianceFields, ChargeSourceCreate } from '../../../shared/schemas/vehicles'
import type { BatteryBank, Inverter } from '../../../shared/schemas/plan'
import { users } from './auth'

/**
 * Vehicles, who may see them, and their equipment (issue 5). Equipment parameters are jsonb validated by
 * the engine's plan schema on the way in (shared/schemas/plan.ts), so a stored row maps one-to-one onto
 * the plan; ids, versions and who/when changed are real columns. All values SI, units in the field names.
 */
export const vehicleKind = pgEnum('vehicle_kind', ['van', 'motorhome', 'boat', 'trailer', 'cabin'])
export const vehicleRole = pgEnum('vehicle_role', ['owner', 'editor', 'viewer', 'advisor'])

const tsz = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' })

/** Version, who/when last changed: on every row people edit. */
const editable = () => ({
  version: integer('version').notNull().default(1),
  updatedAt: tsz('updated_at').notNull().defaultNow(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
})

export const vehicles = pgTable('vehicles', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  kind: vehicleKind('kind').notNull(),
  systemVoltageV: integer('system_voltage_v').notNull(),
  notes: text('notes').notNull().default(''),
  createdAt: tsz('created_at').notNull().defaultNow(),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...editable(),
})

/** Who may see a vehicle, and with which role. Invitations (sharing issue) build on this table. */
export const vehicleMemberships = pgTable(
  'vehicle_memberships',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: vehicleRole('role').notNull(),
    createdAt: tsz('created_at').notNull().defaultNow(),
    ...editable(),
  },
  (t) => [
    uniqueIndex('vehicle_memberships_vehicle_user_key').on(t.vehicleId, t.userId),
    index('vehicle_memberships_user_idx').on(t.userId),
  ],
)

/** One battery bank per vehicle; `params` is a BatteryBankSchema object. */
export const batteryBanks = pgTable('battery_banks', {
  vehicleId: uuid('vehicle_id')
    .primaryKey()
    .references(() => vehicles.id, { onDelete: 'cascade' }),
  params: jsonb('params').$type<BatteryBank>().notNull(),
  ...editable(),
})

/** One inverter row per vehicle once saved; `params` null = the vehicle has no inverter. */
export const inverters = pgTable('inverters', {
  vehicleId: uuid('vehicle_id')
    .primaryKey()
    .references(() => vehicles.id, { onDelete: 'cascade' }),
  params: jsonb('params').$type<Inverter | null>(),
  ...editable(),
})

/** The appliance inventory; `params` is an ApplianceFieldsSchema object (plan appliance without id/usage). */
export const appliances = pgTable(
  'appliances',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    /** Insertion order, so lists and plans keep the order people entered (and imported) them. */
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    params: jsonb('params').$type<ApplianceFields>().notNull(),
    createdAt: tsz('created_at').notNull().defaultNow(),
    ...editable(),
  },
  (t) => [index('appliances_vehicle_idx').on(t.vehicleId, t.seq)],
)

/** Charge sources; `params` is the kind's plan schema object without `id` (it includes `kind`). */
export const chargeSources = pgTable(
  'charge_sources',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    kind: text('kind').notNull(),
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    params: jsonb('params').$type<ChargeSourceCreate>().notNull(),
    createdAt: tsz('created_at').notNull().defaultNow(),
    ...editable(),
  },
  (t) => [
    index('charge_sources_vehicle_idx').on(t.vehicleId, t.seq),
    check('charge_sources_kind_check', sql`${t.kind} IN ('solar', 'dcdc', 'shore', 'generator')`),
  ],
)
