/**
 * API contract for vehicles, their equipment, scenarios, change history, places and the appliance
 * library (issue 5). The server parses every request body and query with these schemas; the client
 * parses every response with them. Route list: docs/api.md.
 *
 * Equipment fields reuse the engine's plan schema (shared/schemas/plan.ts), so what is stored maps
 * one-to-one onto a `Plan`. Units are SI and sit in the field names.
 *
 * Conventions:
 * - ids are UUIDs; timestamps are ISO 8601 strings in UTC.
 * - every editable record carries `version` (starts at 1), `updatedAt` and `updatedBy`.
 * - updates and deletes carry the `version` the client last saw; a stale one answers
 *   409 `{ error: { code: 'conflict', message, current } }` where `current` is the record as it is now
 *   (for a deleted record `current` is null). Nothing is overwritten silently.
 * - errors: `{ error: { code, message, fields? } }` (shared/schemas/error.ts); 400 `validation_failed`
 *   names each field by its dotted path (`battery.capacityAh`, `trip.nightLowC`, `powerW`).
 * - lists that can grow are paginated: query `?limit=&offset=`, answer `{ items, total, limit, offset }`.
 *   Appliances (≤ 200) and charge sources (≤ 40) per vehicle are bounded and answer `{ items }`.
 * - non-members get 404 for everything under a vehicle (no existence leak); viewers and advisors get
 *   403 on writes; deleting a vehicle is owner only.
 */
import { z } from 'zod'
import {
  APPLIANCE_CATEGORIES,
  ApplianceSchema,
  ApplianceUsageSchema,
  BatteryBankSchema,
  DcDcChargerSchema,
  GeneratorChargerSchema,
  InverterSchema,
  PLAN_LIMITS,
  ShoreChargerSchema,
  SolarArraySchema,
  TripSchema,
  windowLengthH,
} from './plan.ts'

// ---------------------------------------------------------------------------------------------
// Shared pieces
// ---------------------------------------------------------------------------------------------

export const VEHICLE_ROLES = ['owner', 'editor', 'viewer', 'advisor'] as const
export type VehicleRole = (typeof VEHICLE_ROLES)[number]
/** Roles that may change a vehicle's equipment and scenarios. */
export const WRITE_ROLES: readonly VehicleRole[] = ['owner', 'editor']

export const VEHICLE_KINDS = ['van', 'motorhome', 'boat', 'trailer', 'cabin'] as const
export type VehicleKind = (typeof VEHICLE_KINDS)[number]

export const SYSTEM_VOLTAGES_V = [12, 24, 48] as const
export type SystemVoltageV = (typeof SYSTEM_VOLTAGES_V)[number]

export const CHARGE_SOURCE_KINDS = ['solar', 'dcdc', 'shore', 'generator'] as const
export type ChargeSourceKind = (typeof CHARGE_SOURCE_KINDS)[number]

export const LIST_LIMITS = {
  defaultLimit: 20,
  maxLimit: 100,
  nameMaxLength: 120,
  notesMaxLength: 4000,
} as const

const requiredOr = (what: string) => (iss: { input?: unknown }) =>
  iss.input === undefined ? 'is required' : what

/** Query-string value → number; absent or blank → undefined (not 0, as `z.coerce` would make it). */
const fromQuery = (v: unknown) =>
  v === undefined || (typeof v === 'string' && v.trim() === '')
    ? undefined
    : typeof v === 'string'
      ? Number(v)
      : v

/** A number from a query string: absent is "is required", anything not a number is "must be a number". */
export const queryNumber = () => z.preprocess(fromQuery, z.number({ error: requiredOr('must be a number') }))
const queryInt = () => queryNumber().pipe(z.number().int('must be a whole number'))

export const IdSchema = z.uuid({ error: 'must be an id (UUID)' })

/** The version the client last saw. */
export const VersionSchema = z
  .number({ error: requiredOr('must be a number') })
  .int('must be a whole number')
  .min(0, 'must be 0 or more')

export const NameSchema = z
  .string({ error: requiredOr('must be text') })
  .trim()
  .min(1, 'must not be empty')
  .max(LIST_LIMITS.nameMaxLength, `must be at most ${LIST_LIMITS.nameMaxLength} characters`)

export const NotesSchema = z
  .string({ error: 'must be text' })
  .max(LIST_LIMITS.notesMaxLength, `must be at most ${LIST_LIMITS.notesMaxLength} characters`)

export const IsoDateTimeSchema = z.iso.datetime({ offset: true })

export const UserRefSchema = z.object({ id: z.string(), displayName: z.string() })
export type UserRef = z.infer<typeof UserRefSchema>

/** Who/when last changed a record, and its version for optimistic concurrency. */
export const RecordMetaSchema = z.object({
  version: z.number().int(),
  updatedAt: IsoDateTimeSchema,
  /** null when the user who made the change has since been deleted. */
  updatedBy: UserRefSchema.nullable(),
})
export type RecordMeta = z.infer<typeof RecordMetaSchema>

/** Query of paginated lists. */
export const PageQuerySchema = z.object({
  limit: z
    .preprocess(
      fromQuery,
      z
        .number({ error: 'must be a number' })
        .int('must be a whole number')
        .min(1, 'must be at least 1')
        .max(LIST_LIMITS.maxLimit, `must be at most ${LIST_LIMITS.maxLimit}`),
    )
    .default(LIST_LIMITS.defaultLimit),
  offset: z
    .preprocess(
      fromQuery,
      z.number({ error: 'must be a number' }).int('must be a whole number').min(0, 'must be 0 or more'),
    )
    .default(0),
})
export type PageQuery = z.infer<typeof PageQuerySchema>

export const pageOf = <T extends z.ZodType>(item: T) =>
  z.object({
    items: z.array(item),
    total: z.number().int(),
    limit: z.number().int(),
    offset: z.number().int(),
  })
export type Page<T> = { items: T[]; total: number; limit: number; offset: number }

export const itemsOf = <T extends z.ZodType>(item: T) => z.object({ items: z.array(item) })

/** Query of every DELETE: the version the client last saw. */
export const DeleteQuerySchema = z.object({
  version: queryInt().pipe(z.number().min(0, 'must be 0 or more')),
})

// ---------------------------------------------------------------------------------------------
// Vehicles and members
// ---------------------------------------------------------------------------------------------

export const VehicleInputSchema = z.strictObject({
  name: NameSchema,
  kind: z.enum(VEHICLE_KINDS, { error: `must be one of ${VEHICLE_KINDS.join(', ')}` }),
  systemVoltageV: z.literal(SYSTEM_VOLTAGES_V, { error: 'must be 12, 24 or 48' }),
  notes: NotesSchema.optional(),
})
/**
 * POST /api/vehicles. The creator becomes its owner. `crewFrom`: share the new vehicle with the crew of that
 * vehicle (one the creator can change), as a what-if saved on a copy of a shared van stays with the people
 * who share it: its owner and editors become editors, its viewers viewers (advisors are not carried over;
 * they read a vehicle for a review).
 */
export const VehicleCreateSchema = VehicleInputSchema.extend({ crewFrom: IdSchema.optional() })
export type VehicleCreate = z.infer<typeof VehicleCreateSchema>

/** PATCH /api/vehicles/:vehicleId */
export const VehiclePatchSchema = VehicleInputSchema.partial().extend({ version: VersionSchema })
export type VehiclePatch = z.infer<typeof VehiclePatchSchema>

export const MemberSchema = z.object({
  userId: z.string(),
  displayName: z.string(),
  role: z.enum(VEHICLE_ROLES),
  since: IsoDateTimeSchema,
})
export type Member = z.infer<typeof MemberSchema>

export const VehicleSchema = z
  .object({
    id: IdSchema,
    name: z.string(),
    kind: z.enum(VEHICLE_KINDS),
    systemVoltageV: z.number(),
    notes: z.string(),
    /** The signed-in user's role on this vehicle. */
    myRole: z.enum(VEHICLE_ROLES),
    createdAt: IsoDateTimeSchema,
    scenarioCount: z.number().int(),
    applianceCount: z.number().int(),
  })
  .extend(RecordMetaSchema.shape)
export type Vehicle = z.infer<typeof VehicleSchema>

/** GET /api/vehicles/:vehicleId (and the answer of POST/PATCH). */
export const VehicleDetailSchema = VehicleSchema.extend({ members: z.array(MemberSchema) })
export type VehicleDetail = z.infer<typeof VehicleDetailSchema>

/** GET /api/vehicles */
export const VehicleListSchema = pageOf(VehicleSchema)
export type VehicleList = Page<Vehicle>

// ---------------------------------------------------------------------------------------------
// Battery bank and inverter (one per vehicle)
// ---------------------------------------------------------------------------------------------

/**
 * GET /api/vehicles/:vehicleId/battery. `battery` is null (and `version` 0) until one is saved.
 */
export const BatteryRecordSchema = z.object({
  vehicleId: IdSchema,
  battery: BatteryBankSchema.nullable(),
  version: z.number().int(),
  updatedAt: IsoDateTimeSchema.nullable(),
  updatedBy: UserRefSchema.nullable(),
})
export type BatteryRecord = z.infer<typeof BatteryRecordSchema>

/** PUT /api/vehicles/:vehicleId/battery. `version` 0 creates the first one. */
export const BatteryPutSchema = z.strictObject({ version: VersionSchema, battery: BatteryBankSchema })
export type BatteryPut = z.infer<typeof BatteryPutSchema>

/** GET /api/vehicles/:vehicleId/inverter. `inverter` null = no inverter (version 0: never saved). */
export const InverterRecordSchema = z.object({
  vehicleId: IdSchema,
  inverter: InverterSchema.nullable(),
  version: z.number().int(),
  updatedAt: IsoDateTimeSchema.nullable(),
  updatedBy: UserRefSchema.nullable(),
})
export type InverterRecord = z.infer<typeof InverterRecordSchema>

/** PUT /api/vehicles/:vehicleId/inverter. `inverter: null` removes it. */
export const InverterPutSchema = z.strictObject({
  version: VersionSchema,
  inverter: InverterSchema.nullable(),
})
export type InverterPut = z.infer<typeof InverterPutSchema>

// ---------------------------------------------------------------------------------------------
// Appliances (the inventory)
// ---------------------------------------------------------------------------------------------

/** An appliance's own fields: the plan's ApplianceSchema without `id` (server-made) and `usage` (per scenario). */
export const ApplianceFieldsSchema = ApplianceSchema.omit({ id: true, usage: true })
export type ApplianceFields = z.infer<typeof ApplianceFieldsSchema>

/** The check PlanSchema makes per appliance, made early so the inventory never holds a row the engine refuses. */
export function hoursFitWindowIssue(a: {
  hoursPerDay: number
  startHour: number
  endHour: number
}): string | null {
  const len = windowLengthH(a.startHour, a.endHour)
  return a.hoursPerDay > len + 1e-9
    ? `${a.hoursPerDay} h does not fit in the window ${a.startHour}–${a.endHour} (${len} h)`
    : null
}

/** POST /api/vehicles/:vehicleId/appliances (also each row of an import). */
export const ApplianceCreateSchema = ApplianceFieldsSchema.superRefine((a, ctx) => {
  const issue = hoursFitWindowIssue(a)
  if (issue) ctx.addIssue({ code: 'custom', path: ['hoursPerDay'], message: issue })
})
export type ApplianceCreate = z.infer<typeof ApplianceCreateSchema>

/**
 * PATCH /api/vehicles/:vehicleId/appliances/:applianceId: any subset of the fields plus `version`.
 * The server merges it with the stored row and validates the result with ApplianceCreateSchema.
 */
export const AppliancePatchSchema = ApplianceFieldsSchema.partial().extend({ version: VersionSchema })
export type AppliancePatch = z.infer<typeof AppliancePatchSchema>

export const ApplianceRecordSchema = ApplianceFieldsSchema.extend({
  id: IdSchema,
  vehicleId: IdSchema,
}).extend(RecordMetaSchema.shape)
export type ApplianceRecord = z.infer<typeof ApplianceRecordSchema>

/** GET /api/vehicles/:vehicleId/appliances (bounded by PLAN_LIMITS.appliancesMax, not paginated). */
export const ApplianceListSchema = itemsOf(ApplianceRecordSchema)
export type ApplianceList = { items: ApplianceRecord[] }

/** CSV columns, in the order the export writes them. Import needs the header row; column order is free. */
export const APPLIANCE_CSV_COLUMNS = [
  'name',
  'category',
  'supply',
  'powerW',
  'quantity',
  'hoursPerDay',
  'startHour',
  'endHour',
  'dutyCycleFraction',
  'standbyW',
] as const
export type ApplianceCsvColumn = (typeof APPLIANCE_CSV_COLUMNS)[number]
/** Columns that may be left empty (the engine's defaults apply). */
export const APPLIANCE_CSV_OPTIONAL_COLUMNS: readonly ApplianceCsvColumn[] = ['dutyCycleFraction', 'standbyW']

/**
 * POST /api/vehicles/:vehicleId/appliances/import
 * - `confirm: false` → 200 ImportPreview; nothing is saved.
 * - `confirm: true` and no errors → 201 ImportResult; all rows saved in one transaction.
 * - `confirm: true` with any error → 400 `{ error: { code: 'import_invalid', message, errors } }`; nothing saved.
 * `mode: 'replace'` deletes the current inventory (and its scenario usage) in the same transaction.
 */
export const ApplianceImportRequestSchema = z.strictObject({
  csv: z.string({ error: requiredOr('must be text') }).max(1_000_000, 'must be at most 1 MB'),
  confirm: z.boolean({ error: requiredOr('must be true or false') }),
  mode: z.enum(['append', 'replace'], { error: 'must be append or replace' }).default('append'),
})
export type ApplianceImportRequest = z.input<typeof ApplianceImportRequestSchema>

/** One problem in the file. `row` is the spreadsheet line number (the header is line 1); 0 = the whole file. */
export const ImportErrorSchema = z.object({
  row: z.number().int(),
  /** The CSV column, or null when the problem is the row or the file as a whole. */
  column: z.string().nullable(),
  message: z.string(),
})
export type ImportError = z.infer<typeof ImportErrorSchema>

export const ImportPreviewRowSchema = z.object({
  row: z.number().int(),
  /** The row's cells by column name, as text. */
  values: z.record(z.string(), z.string()),
  /** The appliance this row becomes, or null when the row has errors. */
  appliance: ApplianceFieldsSchema.nullable(),
})
export type ImportPreviewRow = z.infer<typeof ImportPreviewRowSchema>

export const ImportPreviewSchema = z.object({
  saved: z.literal(false),
  mode: z.enum(['append', 'replace']),
  rows: z.array(ImportPreviewRowSchema),
  errors: z.array(ImportErrorSchema),
})
export type ImportPreview = z.infer<typeof ImportPreviewSchema>

export const ImportResultSchema = z.object({
  saved: z.literal(true),
  mode: z.enum(['append', 'replace']),
  created: z.array(ApplianceRecordSchema),
  /** How many existing appliances `replace` removed. */
  removed: z.number().int(),
})
export type ImportResult = z.infer<typeof ImportResultSchema>

// ---------------------------------------------------------------------------------------------
// Charge sources
// ---------------------------------------------------------------------------------------------

const SolarFields = SolarArraySchema.omit({ id: true })
const DcDcFields = DcDcChargerSchema.omit({ id: true })
const ShoreFields = ShoreChargerSchema.omit({ id: true })
const GeneratorFields = GeneratorChargerSchema.omit({ id: true })

/** POST /api/vehicles/:vehicleId/sources: one of the plan's charge sources without `id`. */
export const ChargeSourceCreateSchema = z.discriminatedUnion(
  'kind',
  [SolarFields, DcDcFields, ShoreFields, GeneratorFields],
  {
    error: `kind must be one of ${CHARGE_SOURCE_KINDS.join(', ')}`,
  },
)
export type ChargeSourceCreate = z.infer<typeof ChargeSourceCreateSchema>

type DistributivePartialOmitKind<T> = T extends unknown ? Partial<Omit<T, 'kind'>> : never

/**
 * PATCH /api/vehicles/:vehicleId/sources/:sourceId: `version` plus any subset of the source's fields.
 * `kind` cannot change (send it or leave it out; a different kind answers 400). The server merges the
 * patch with the stored source and validates the result with the kind's schema, so unknown or wrong
 * fields are named.
 */
export const ChargeSourcePatchSchema = z
  .object({ version: VersionSchema, kind: z.enum(CHARGE_SOURCE_KINDS).optional() })
  .catchall(z.unknown())
export type ChargeSourcePatch = {
  version: number
  kind?: ChargeSourceKind
} & DistributivePartialOmitKind<ChargeSourceCreate>

export const ChargeSourceRecordSchema = z.discriminatedUnion('kind', [
  SolarFields.extend({ id: IdSchema, vehicleId: IdSchema }).extend(RecordMetaSchema.shape),
  DcDcFields.extend({ id: IdSchema, vehicleId: IdSchema }).extend(RecordMetaSchema.shape),
  ShoreFields.extend({ id: IdSchema, vehicleId: IdSchema }).extend(RecordMetaSchema.shape),
  GeneratorFields.extend({ id: IdSchema, vehicleId: IdSchema }).extend(RecordMetaSchema.shape),
])
export type ChargeSourceRecord = z.infer<typeof ChargeSourceRecordSchema>

/** GET /api/vehicles/:vehicleId/sources (bounded by PLAN_LIMITS.sourcesMax). */
export const ChargeSourceListSchema = itemsOf(ChargeSourceRecordSchema)
export type ChargeSourceList = { items: ChargeSourceRecord[] }

// ---------------------------------------------------------------------------------------------
// Scenarios
// ---------------------------------------------------------------------------------------------

/** Per-appliance usage for one scenario, keyed by appliance id. Omitted appliances keep their usual use. */
export const ScenarioUsageSchema = z.record(IdSchema, ApplianceUsageSchema)
export type ScenarioUsage = z.infer<typeof ScenarioUsageSchema>

const ScenarioFields = z.strictObject({
  name: NameSchema,
  notes: NotesSchema.optional(),
  /** What the place search or the user called the place ("Svolvær, NO"); the trip holds its coordinates. */
  placeName: z.string().max(200, 'must be at most 200 characters').optional(),
  trip: TripSchema,
  usage: ScenarioUsageSchema.optional(),
})

/** POST /api/vehicles/:vehicleId/scenarios */
export const ScenarioCreateSchema = ScenarioFields
export type ScenarioCreate = z.infer<typeof ScenarioCreateSchema>

/**
 * PATCH /api/scenarios/:scenarioId: `version` plus any of the fields. `trip` is replaced whole;
 * `usage`, when sent, replaces the whole usage map.
 */
export const ScenarioPatchSchema = ScenarioFields.partial().extend({ version: VersionSchema })
export type ScenarioPatch = z.infer<typeof ScenarioPatchSchema>

/**
 * POST /api/scenarios/:scenarioId/duplicate → 201 Scenario (a copy in the same vehicle, version 1). `trip`,
 * when sent, replaces the copy's trip in the same transaction (the Outlook's "Save as a new scenario" for a
 * tried driving time, night low or sky).
 */
export const ScenarioDuplicateSchema = z.strictObject({ name: NameSchema, trip: TripSchema.optional() })
export type ScenarioDuplicate = z.infer<typeof ScenarioDuplicateSchema>

const ScenarioCommon = z.object({
  id: IdSchema,
  vehicleId: IdSchema,
  vehicleName: z.string(),
  /** The signed-in user's role on the scenario's vehicle. */
  myRole: z.enum(VEHICLE_ROLES),
  name: z.string(),
  placeName: z.string(),
  createdAt: IsoDateTimeSchema,
})

/** GET /api/scenarios/:scenarioId (and the answer of POST/PATCH/duplicate). */
export const ScenarioSchema = ScenarioCommon.extend({
  notes: z.string(),
  trip: TripSchema,
  usage: ScenarioUsageSchema,
}).extend(RecordMetaSchema.shape)
export type Scenario = z.infer<typeof ScenarioSchema>

/** An item of the scenario lists: enough to pick and compare without loading each one. */
export const ScenarioSummarySchema = ScenarioCommon.extend({
  startDate: z.string(),
  days: z.number().int(),
  latitudeDeg: z.number(),
  longitudeDeg: z.number(),
  timeZone: z.string(),
  nightLowC: z.number(),
  dayHighC: z.number(),
}).extend(RecordMetaSchema.shape)
export type ScenarioSummary = z.infer<typeof ScenarioSummarySchema>

/** GET /api/scenarios?vehicleId= (every scenario I can read) and GET /api/vehicles/:vehicleId/scenarios. */
export const ScenarioListQuerySchema = PageQuerySchema.extend({ vehicleId: IdSchema.optional() })
export type ScenarioListQuery = z.infer<typeof ScenarioListQuerySchema>
export const ScenarioListSchema = pageOf(ScenarioSummarySchema)
export type ScenarioList = Page<ScenarioSummary>

// GET /api/scenarios/:scenarioId/plan answers a `Plan` (shared/schemas/plan.ts PlanSchema): appliance and
// source ids are the records' ids, `usage` carries this scenario's overrides, name is "<vehicle> · <scenario>".
// A vehicle without a battery bank answers 422 `{ error: { code: 'plan_incomplete', message, fields } }`.

// ---------------------------------------------------------------------------------------------
// Change history
// ---------------------------------------------------------------------------------------------

export const HISTORY_ENTITIES = [
  'vehicle',
  'battery',
  'inverter',
  'appliance',
  'source',
  'scenario',
  'membership',
] as const
export type HistoryEntity = (typeof HISTORY_ENTITIES)[number]
export const HISTORY_ACTIONS = ['create', 'update', 'delete', 'import', 'duplicate'] as const
export type HistoryAction = (typeof HISTORY_ACTIONS)[number]

export const HistoryEntrySchema = z.object({
  id: IdSchema,
  vehicleId: IdSchema,
  entity: z.enum(HISTORY_ENTITIES),
  /** The changed record's id (vehicle id for battery/inverter); null for a whole-list import. */
  entityId: z.string().nullable(),
  action: z.enum(HISTORY_ACTIONS),
  /** Plain words, e.g. "Changed appliance “Fridge”: powerW, hoursPerDay". */
  summary: z.string(),
  /** Top-level fields that changed (empty for create/delete). */
  changedFields: z.array(z.string()),
  /** The record's version after the change (null after a delete or import). */
  version: z.number().int().nullable(),
  actor: UserRefSchema.nullable(),
  at: IsoDateTimeSchema,
})
export type HistoryEntry = z.infer<typeof HistoryEntrySchema>

/** GET /api/vehicles/:vehicleId/history, newest first. */
export const HistoryListSchema = pageOf(HistoryEntrySchema)
export type HistoryList = Page<HistoryEntry>

// ---------------------------------------------------------------------------------------------
// Places and time zones
// ---------------------------------------------------------------------------------------------

/** GET /api/places?q=&limit= : cities whose name starts with (or contains) q, most populous first. */
export const PlaceSearchQuerySchema = z.object({
  q: z
    .string({ error: requiredOr('must be text') })
    .trim()
    .min(2, 'must be at least 2 characters')
    .max(100),
  limit: queryInt()
    .pipe(z.number().min(1, 'must be at least 1').max(10, 'must be at most 10'))
    .optional()
    .default(10),
})
export type PlaceSearchQuery = z.infer<typeof PlaceSearchQuerySchema>

export const PlaceSchema = z.object({
  name: z.string(),
  /** ISO 3166-1 alpha-2. */
  countryCode: z.string(),
  latitudeDeg: z.number(),
  longitudeDeg: z.number(),
  population: z.number().int(),
  /** IANA time zone at the coordinates. */
  timeZone: z.string(),
})
export type Place = z.infer<typeof PlaceSchema>
export const PlaceListSchema = itemsOf(PlaceSchema)
export type PlaceList = { items: Place[] }

/** GET /api/places/timezone?latitudeDeg=&longitudeDeg= */
export const TimeZoneQuerySchema = z.object({
  latitudeDeg: queryNumber().pipe(
    z.number().min(-90, 'must be between -90 and 90').max(90, 'must be between -90 and 90'),
  ),
  longitudeDeg: queryNumber().pipe(
    z.number().min(-180, 'must be between -180 and 180').max(180, 'must be between -180 and 180'),
  ),
})
export type TimeZoneQuery = z.infer<typeof TimeZoneQuerySchema>
export const TimeZoneAnswerSchema = z.object({
  latitudeDeg: z.number(),
  longitudeDeg: z.number(),
  timeZone: z.string(),
})
export type TimeZoneAnswer = z.infer<typeof TimeZoneAnswerSchema>

// ---------------------------------------------------------------------------------------------
// Appliance library
// ---------------------------------------------------------------------------------------------

/** One typical appliance (data/appliance-library.json). Values are common practice, no source. */
export const LibraryApplianceSchema = ApplianceFieldsSchema.omit({ quantity: true }).extend({
  /** Stable key, e.g. "compressor-fridge-50l". */
  key: z.string().regex(/^[a-z0-9-]+$/),
  quantity: z.number().int().min(1),
  /** Short explanation of the typical values. */
  note: z.string(),
})
export type LibraryAppliance = z.infer<typeof LibraryApplianceSchema>

export const ApplianceLibrarySchema = z.object({
  /** Where the values come from ("common practice, no source"). */
  source: z.string(),
  items: z.array(LibraryApplianceSchema),
})
export type ApplianceLibrary = z.infer<typeof ApplianceLibrarySchema>

export { APPLIANCE_CATEGORIES, PLAN_LIMITS }
