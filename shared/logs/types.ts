/**
 * Battery-monitor logs ("Logs"): the file format we detected, the column mapping the user confirms,
 * the samples a row becomes, and the row-level errors. Pure: no DOM, no Node.
 *
 * Units are SI in field names. Current is stored with one sign convention: positive = into the pack
 * (charging), whatever the monitor wrote; the mapping's `currentSign` says how to turn the file's
 * numbers into that.
 */
import { z } from 'zod'

export const LOG_LIMITS = {
  /** Largest upload accepted. [bytes] */
  maxFileBytes: 200 * 1024 * 1024,
  /** Most data rows in one upload (a month at one sample per second is ~2.7 million). */
  maxRows: 3_000_000,
  /** Errors listed in an answer; the total is still counted. */
  maxErrorsListed: 200,
  /** Rows shown in the preview. */
  previewRows: 20,
  /** Rows the preview and the check read; the import reads every row. */
  checkRows: 50_000,
  maxTemperatureColumns: 8,
  maxCellColumns: 32,
  /** Plausible ranges after unit conversion; outside them a value is called impossible. */
  packVoltageVMax: 100,
  cellVoltageVMin: 0.5,
  cellVoltageVMax: 5,
  currentAbsAMax: 2_000,
  temperatureCMin: -60,
  temperatureCMax: 100,
  maxGapMinutesDefault: 60,
  maxGapMinutesMax: 7 * 24 * 60,
} as const

export const DELIMITERS = [',', ';', '\t', '|'] as const
export type Delimiter = (typeof DELIMITERS)[number]

export const TIMESTAMP_FORMATS = ['ymd', 'dmy', 'mdy', 'epoch-s', 'epoch-ms'] as const
export type TimestampFormat = (typeof TIMESTAMP_FORMATS)[number]

/** Plain-words names of the timestamp formats, for the mapping form. */
export const TIMESTAMP_FORMAT_LABELS: Record<TimestampFormat, string> = {
  ymd: 'Year-month-day (2026-01-15 08:30:00)',
  dmy: 'Day/month/year (15/01/2026 08:30)',
  mdy: 'Month/day/year (01/15/2026 08:30)',
  'epoch-s': 'Seconds since 1970 (Unix time)',
  'epoch-ms': 'Milliseconds since 1970',
}

export const LogFormatSchema = z.strictObject({
  delimiter: z.enum(DELIMITERS, { error: 'must be one of , ; tab |' }),
  /** true = the first row names the columns. */
  hasHeader: z.boolean({ error: 'must be true or false' }),
  /** Decimal mark of numbers: '.' or ',' (a ',' decimal needs a delimiter other than ','). */
  decimalSeparator: z.enum(['.', ','], { error: 'must be . or ,' }),
})
export type LogFormat = z.infer<typeof LogFormatSchema>

const column = () => z.string({ error: 'must be a column name' }).min(1, 'must name a column').max(200)

export const LogMappingSchema = z
  .strictObject({
    format: LogFormatSchema,
    timestampColumn: column(),
    timestampFormat: z.enum(TIMESTAMP_FORMATS, { error: `must be one of ${TIMESTAMP_FORMATS.join(', ')}` }),
    /**
     * Offset of the monitor's clock from UTC, used for times written without a zone and to cut days. [min]
     * Europe/Oslo in winter = 60.
     */
    utcOffsetMinutes: z
      .number({ error: 'must be a number' })
      .int('must be a whole number of minutes')
      .min(-14 * 60, 'must be between -840 and 840')
      .max(14 * 60, 'must be between -840 and 840'),
    /** null = add up the cell voltages instead. */
    packVoltageColumn: column().nullable(),
    packVoltageUnit: z.enum(['V', 'mV'], { error: 'must be V or mV' }),
    currentColumn: column(),
    currentUnit: z.enum(['A', 'mA'], { error: 'must be A or mA' }),
    /** Which sign the monitor gives charging current. */
    currentSign: z.enum(['charge-positive', 'discharge-positive'], {
      error: 'must be charge-positive or discharge-positive',
    }),
    socColumn: column().nullable(),
    socUnit: z.enum(['percent', 'fraction'], { error: 'must be percent or fraction' }),
    temperatureColumns: z.array(column()).max(LOG_LIMITS.maxTemperatureColumns),
    temperatureUnit: z.enum(['C', 'F'], { error: 'must be C or F' }),
    /** Cell 1..n in order. */
    cellVoltageColumns: z.array(column()).max(LOG_LIMITS.maxCellColumns),
    cellVoltageUnit: z.enum(['V', 'mV'], { error: 'must be V or mV' }),
    /** A longer stretch without samples is an error (raise it when the monitor was switched off). [min] */
    maxGapMinutes: z
      .number({ error: 'must be a number' })
      .positive('must be more than 0')
      .max(LOG_LIMITS.maxGapMinutesMax, `must be at most ${LOG_LIMITS.maxGapMinutesMax}`),
  })
  .superRefine((m, ctx) => {
    if (m.format.delimiter === ',' && m.format.decimalSeparator === ',') {
      ctx.addIssue({
        code: 'custom',
        path: ['format', 'decimalSeparator'],
        message: 'cannot be , when the delimiter is , too',
      })
    }
    if (m.packVoltageColumn === null && m.cellVoltageColumns.length === 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['packVoltageColumn'],
        message: 'is needed (or map the cell voltages, whose sum is then used)',
      })
    }
    const used = [
      m.timestampColumn,
      m.packVoltageColumn,
      m.currentColumn,
      m.socColumn,
      ...m.temperatureColumns,
      ...m.cellVoltageColumns,
    ].filter((c): c is string => c !== null)
    const seen = new Set<string>()
    for (const c of used) {
      if (seen.has(c)) {
        ctx.addIssue({ code: 'custom', path: ['timestampColumn'], message: `column “${c}” is used twice` })
        break
      }
      seen.add(c)
    }
  })
export type LogMapping = z.infer<typeof LogMappingSchema>

export const LOG_ERROR_CODES = [
  'empty_file',
  'not_text',
  'wrong_delimiter',
  'missing_column',
  'column_count',
  'missing_value',
  'not_a_number',
  'bad_timestamp',
  'timestamp_out_of_order',
  'timestamp_duplicate',
  'gap',
  'impossible_value',
  'no_data_rows',
  'too_many_rows',
] as const
export type LogErrorCode = (typeof LOG_ERROR_CODES)[number]

/** One problem. `row` is the spreadsheet line (the header is line 1); 0 = the file as a whole. */
export const LogErrorSchema = z.object({
  row: z.number().int(),
  /** The file's column name, or null when the problem is the row or the file. */
  column: z.string().nullable(),
  code: z.enum(LOG_ERROR_CODES),
  message: z.string(),
})
export type LogError = z.infer<typeof LogErrorSchema>

/** One row after mapping and unit conversion. */
export interface LogSample {
  /** Milliseconds since 1970-01-01 UTC. */
  tsMs: number
  packVoltageV: number
  /** Positive = into the pack. [A] */
  currentA: number
  socFraction: number | null
  temperaturesC: number[] | null
  cellVoltagesV: number[] | null
}

/** A day of the log (on the monitor's clock, `utcOffsetMinutes`). */
export const LogDaySchema = z.object({
  date: z.string(),
  sampleCount: z.number().int(),
  /** Hours between the day's first and last sample that are covered by samples (gaps excluded). [h] */
  coveredH: z.number(),
  /** Energy into the pack (∫ V·I dt where I > 0). [Wh] */
  energyInWh: z.number(),
  /** Energy out of the pack (∫ V·|I| dt where I < 0). [Wh] */
  energyOutWh: z.number(),
  socMinFraction: z.number().nullable(),
  socMaxFraction: z.number().nullable(),
  packVoltageMinV: z.number(),
  packVoltageMaxV: z.number(),
  /** Largest cell spread (max − min cell voltage) in any sample. [mV] */
  cellSpreadMaxMv: z.number().nullable(),
  /** Median spread over the day's samples. [mV] */
  cellSpreadTypicalMv: z.number().nullable(),
  /** 95th percentile of the spread: "high" without one-sample spikes. [mV] */
  cellSpreadP95Mv: z.number().nullable(),
  temperatureMinC: z.number().nullable(),
  temperatureMaxC: z.number().nullable(),
})
export type LogDay = z.infer<typeof LogDaySchema>
