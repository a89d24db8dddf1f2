import {
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  real,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core'
import type { LogMapping } from '../../../shared/logs/types'
import type { SpreadTrend } from '../../../shared/logs/trend'
import { users } from './auth'
import { vehicles } from './vehicles'

/**
 * Battery-monitor logs (issue 9). An upload row exists only once its file imported without an error (the
 * import is one transaction); samples and daily summaries belong to it and go with it. SI units throughout;
 * current is positive into the pack whatever the monitor wrote (the mapping says how it was turned).
 */
const tsz = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' })

export const logUploads = pgTable(
  'log_uploads',
  {
    id: uuid('id').primaryKey(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    fileName: text('file_name').notNull(),
    sizeBytes: integer('size_bytes').notNull(),
    rowCount: integer('row_count').notNull(),
    firstTs: tsz('first_ts').notNull(),
    lastTs: tsz('last_ts').notNull(),
    mapping: jsonb('mapping').$type<LogMapping>().notNull(),
    spreadTrend: jsonb('spread_trend').$type<SpreadTrend>().notNull(),
    createdAt: tsz('created_at').notNull().defaultNow(),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [index('log_uploads_vehicle_idx').on(t.vehicleId, t.createdAt)],
)

export const logSamples = pgTable(
  'log_samples',
  {
    uploadId: uuid('upload_id')
      .notNull()
      .references(() => logUploads.id, { onDelete: 'cascade' }),
    ts: tsz('ts').notNull(),
    packVoltageV: real('pack_voltage_v').notNull(),
    /** Positive = into the pack. */
    currentA: real('current_a').notNull(),
    socFraction: real('soc_fraction'),
    temperaturesC: real('temperatures_c').array(),
    cellVoltagesV: real('cell_voltages_v').array(),
  },
  // The primary key is the (upload_id, ts) index; a log never holds two samples at one instant.
  (t) => [primaryKey({ name: 'log_samples_pkey', columns: [t.uploadId, t.ts] })],
)

export const logDays = pgTable(
  'log_days',
  {
    uploadId: uuid('upload_id')
      .notNull()
      .references(() => logUploads.id, { onDelete: 'cascade' }),
    date: date('date', { mode: 'string' }).notNull(),
    sampleCount: integer('sample_count').notNull(),
    coveredH: doublePrecision('covered_h').notNull(),
    energyInWh: doublePrecision('energy_in_wh').notNull(),
    energyOutWh: doublePrecision('energy_out_wh').notNull(),
    socMinFraction: doublePrecision('soc_min_fraction'),
    socMaxFraction: doublePrecision('soc_max_fraction'),
    packVoltageMinV: doublePrecision('pack_voltage_min_v').notNull(),
    packVoltageMaxV: doublePrecision('pack_voltage_max_v').notNull(),
    cellSpreadMaxMv: doublePrecision('cell_spread_max_mv'),
    cellSpreadTypicalMv: doublePrecision('cell_spread_typical_mv'),
    cellSpreadP95Mv: doublePrecision('cell_spread_p95_mv'),
    temperatureMinC: doublePrecision('temperature_min_c'),
    temperatureMaxC: doublePrecision('temperature_max_c'),
  },
  (t) => [primaryKey({ name: 'log_days_pkey', columns: [t.uploadId, t.date] })],
)

/** The last confirmed column mapping per vehicle, proposed again for its next upload. */
export const logMappings = pgTable('log_mappings', {
  vehicleId: uuid('vehicle_id')
    .primaryKey()
    .references(() => vehicles.id, { onDelete: 'cascade' }),
  mapping: jsonb('mapping').$type<LogMapping>().notNull(),
  updatedAt: tsz('updated_at').notNull().defaultNow(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
})
