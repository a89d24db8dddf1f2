/**
 * API contract of the build sheet (issue 7): per-vehicle settings (protection overrides, checklist ticks,
 * cable-run edits, the chosen scenario) and the parts list. The server parses requests with these; the
 * client parses responses with them. Money is a decimal string, never a float.
 */
import { z } from 'zod'
import { PlanSchema } from '../schemas/plan.ts'
import { PROTECTION_KEYS } from './protection.ts'
import { CONDUCTOR_CLASSES, INSULATION_RATINGS_C } from './conductors.ts'
import { MONEY_PATTERN, QUANTITY_PATTERN } from './money.ts'

const requiredOr = (what: string) => (iss: { input?: unknown }) =>
  iss.input === undefined ? 'is required' : what
const finite = () =>
  z.number({ error: requiredOr('must be a number') }).refine(Number.isFinite, 'must be a finite number')

export const BUILD_SHEET_LIMITS = {
  partsMax: 500,
  partNameMaxLength: 200,
  noteMaxLength: 1000,
  cableRunsMax: 300,
  checklistMax: 500,
  lengthMMax: 100,
  currentAMax: 2000,
} as const

const VersionSchema = z
  .number({ error: requiredOr('must be a number') })
  .int('must be a whole number')
  .min(0, 'must be 0 or more')

export const ProtectionOverridesSchema = z.partialRecord(
  z.enum(PROTECTION_KEYS, { error: 'is not a known threshold' }),
  finite(),
)

export const CableRunOverrideSchema = z.strictObject({
  oneWayLengthM: finite()
    .gt(0, 'must be greater than 0')
    .max(BUILD_SHEET_LIMITS.lengthMMax, `must be at most ${BUILD_SHEET_LIMITS.lengthMMax} m`)
    .optional(),
  currentA: finite()
    .gt(0, 'must be greater than 0')
    .max(BUILD_SHEET_LIMITS.currentAMax, `must be at most ${BUILD_SHEET_LIMITS.currentAMax} A`)
    .optional(),
  maxDropPercent: finite().gt(0, 'must be greater than 0').max(20, 'must be at most 20 %').optional(),
  conductorTempC: finite().min(-40, 'must be at least -40 °C').max(150, 'must be at most 150 °C').optional(),
  conductorClass: z.enum(CONDUCTOR_CLASSES, { error: 'must be class5 or class2' }).optional(),
  insulationRatingC: z.literal(INSULATION_RATINGS_C, { error: 'must be 70, 90 or 105' }).optional(),
})

const runId = z.string().min(1).max(200)

export const BuildSheetSettingsSchema = z.object({
  /** The scenario whose plan the sheet uses; null = the vehicle's first scenario. */
  scenarioId: z.uuid().nullable(),
  protection: ProtectionOverridesSchema,
  /** Checklist item id → ticked. */
  checklist: z.record(z.string().max(200), z.boolean()),
  cableRuns: z.record(runId, CableRunOverrideSchema),
})
export type BuildSheetSettings = z.infer<typeof BuildSheetSettingsSchema>

export const EMPTY_SETTINGS: BuildSheetSettings = {
  scenarioId: null,
  protection: {},
  checklist: {},
  cableRuns: {},
}

/** PUT /api/vehicles/:vehicleId/build-sheet/settings: the fields sent replace the stored ones. */
export const BuildSheetSettingsPutSchema = z.strictObject({
  version: VersionSchema,
  scenarioId: z.uuid({ error: 'must be a scenario id' }).nullable().optional(),
  protection: ProtectionOverridesSchema.optional(),
  checklist: z
    .record(z.string().max(200), z.boolean({ error: 'must be true or false' }))
    .refine((r) => Object.keys(r).length <= BUILD_SHEET_LIMITS.checklistMax, 'has too many items')
    .optional(),
  cableRuns: z
    .record(runId, CableRunOverrideSchema)
    .refine((r) => Object.keys(r).length <= BUILD_SHEET_LIMITS.cableRunsMax, 'has too many runs')
    .optional(),
})
export type BuildSheetSettingsPut = z.infer<typeof BuildSheetSettingsPutSchema>

const UserRef = z.object({ id: z.string(), displayName: z.string() })

export const BuildSheetSettingsRecordSchema = BuildSheetSettingsSchema.extend({
  version: z.number().int(),
  updatedAt: z.string().nullable(),
  updatedBy: UserRef.nullable(),
})
export type BuildSheetSettingsRecord = z.infer<typeof BuildSheetSettingsRecordSchema>

// ---------------------------------------------------------------------------------------------
// Parts
// ---------------------------------------------------------------------------------------------

const CurrencySchema = z
  .string({ error: requiredOr('must be text') })
  .regex(/^[A-Z]{3}$/, 'must be a three-letter currency code such as EUR')

const PartFields = z.strictObject({
  name: z
    .string({ error: requiredOr('must be text') })
    .trim()
    .min(1, 'must not be empty')
    .max(
      BUILD_SHEET_LIMITS.partNameMaxLength,
      `must be at most ${BUILD_SHEET_LIMITS.partNameMaxLength} characters`,
    ),
  quantity: z
    .string({ error: requiredOr('must be a number written as text, e.g. "2" or "1.5"') })
    .regex(QUANTITY_PATTERN, 'must be a number ≥ 0 with at most 3 decimals, e.g. "2" or "1.5"'),
  unitPrice: z
    .string({ error: requiredOr('must be an amount written as text, e.g. "12.30"') })
    .regex(MONEY_PATTERN, 'must be an amount ≥ 0 with at most 2 decimals, e.g. "12.30"'),
  currency: CurrencySchema,
  /** Mass of one unit; null = unknown. [kg] */
  massKg: finite().min(0, 'must be 0 or more').max(10_000, 'must be at most 10000 kg').nullable(),
  note: z.string().max(BUILD_SHEET_LIMITS.noteMaxLength).optional(),
})

export const PartCreateSchema = PartFields
export type PartCreate = z.infer<typeof PartCreateSchema>
export const PartPatchSchema = PartFields.partial().extend({ version: VersionSchema })
export type PartPatch = z.infer<typeof PartPatchSchema>

export const PartRecordSchema = z.object({
  id: z.uuid(),
  vehicleId: z.uuid(),
  name: z.string(),
  quantity: z.string(),
  unitPrice: z.string(),
  currency: z.string(),
  massKg: z.number().nullable(),
  note: z.string(),
  position: z.number().int(),
  version: z.number().int(),
  updatedAt: z.string(),
  updatedBy: UserRef.nullable(),
})
export type PartRecord = z.infer<typeof PartRecordSchema>
export const PartListSchema = z.object({ items: z.array(PartRecordSchema) })

// ---------------------------------------------------------------------------------------------
// GET /api/vehicles/:vehicleId/build-sheet
// ---------------------------------------------------------------------------------------------

export const BuildSheetResponseSchema = z.object({
  vehicleId: z.uuid(),
  vehicleName: z.string(),
  systemVoltageV: z.number(),
  myRole: z.string(),
  scenarios: z.array(z.object({ id: z.uuid(), name: z.string() })),
  /** The scenario the plan was built from; null when the vehicle has none. */
  scenarioId: z.uuid().nullable(),
  /** The plan, for the browser to recompute with; null when something is missing (see `missing`). */
  plan: PlanSchema.nullable(),
  /** Plain words: what the vehicle still needs before a sheet can be made. */
  missing: z.array(z.string()),
  settings: BuildSheetSettingsRecordSchema,
  parts: z.array(PartRecordSchema),
  /** The computed sheet (same function the browser runs); null when `plan` is null. */
  sheet: z.unknown().nullable(),
})
export type BuildSheetResponse = z.infer<typeof BuildSheetResponseSchema>
