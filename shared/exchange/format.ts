/**
 * The plan file: Ohmward's own versioned format for moving one vehicle's plan (equipment + one scenario)
 * between accounts. Pure: used by the server's export/import and by the browser to check a file before
 * sending it.
 *
 * Versions
 * - 1: a bare plan document (shared/schemas/plan.ts, `formatVersion: 1` or absent): what
 *      `GET /api/scenarios/:id/plan` answers, `npm run simulate` reads and data/examples/ holds.
 * - 2: `{ format: 'ohmward-plan', formatVersion: 2, exportedAt, vehicle, scenario, plan }` (current).
 *
 * Import runs the file through a chain of pure upgrade functions (1 → 2 → …) and then validates the result
 * against the current schema, so every error names a field of the current format by its dotted path.
 */
import { z } from 'zod'
import { parsePlan, type Plan } from '../schemas/plan.ts'
import {
  SYSTEM_VOLTAGES_V,
  VEHICLE_KINDS,
  type SystemVoltageV,
  type VehicleKind,
} from '../schemas/vehicles.ts'

export const PLAN_FILE_FORMAT = 'ohmward-plan'
export const PLAN_FILE_VERSION = 2

export const PlanFileHeaderSchema = z.strictObject({
  format: z.literal(PLAN_FILE_FORMAT, { error: `must be "${PLAN_FILE_FORMAT}"` }),
  formatVersion: z.literal(PLAN_FILE_VERSION, { error: `must be ${PLAN_FILE_VERSION}` }),
  exportedAt: z.string().max(40, 'must be at most 40 characters'),
  vehicle: z.strictObject({
    name: z.string().trim().min(1, 'must not be empty').max(100, 'must be at most 100 characters'),
    kind: z.enum(VEHICLE_KINDS, { error: `must be one of ${VEHICLE_KINDS.join(', ')}` }),
    systemVoltageV: z.literal(SYSTEM_VOLTAGES_V, { error: 'must be 12, 24 or 48' }),
  }),
  scenario: z.strictObject({
    name: z.string().trim().min(1, 'must not be empty').max(100, 'must be at most 100 characters'),
    notes: z.string().max(5000, 'must be at most 5000 characters').optional(),
    placeName: z.string().max(200, 'must be at most 200 characters').optional(),
  }),
  /** Checked separately with parsePlan, so its errors read like the plan format's own. */
  plan: z.unknown(),
})

export interface PlanFile {
  format: typeof PLAN_FILE_FORMAT
  formatVersion: typeof PLAN_FILE_VERSION
  exportedAt: string
  vehicle: { name: string; kind: VehicleKind; systemVoltageV: SystemVoltageV }
  scenario: { name: string; notes?: string; placeName?: string }
  plan: Plan
}

export type PlanFileErrors = Record<string, string[]>
export type ReadPlanFileResult =
  | { ok: true; file: PlanFile; upgradedFrom: number | null }
  | { ok: false; message: string; fields: PlanFileErrors }

/** The system voltage a bank's nominal voltage belongs to (12.8 V LFP → 12, 25.6 V → 24, …). */
export function systemVoltageFor(nominalV: number): SystemVoltageV {
  let best: SystemVoltageV = 12
  for (const v of SYSTEM_VOLTAGES_V) if (Math.abs(v - nominalV) < Math.abs(best - nominalV)) best = v
  return best
}

type Doc = Record<string, unknown>
const isObject = (x: unknown): x is Doc => typeof x === 'object' && x !== null && !Array.isArray(x)

/** 1 → 2: wrap a bare plan with the vehicle and scenario labels the import needs. */
function upgrade1to2(doc: Doc): Doc {
  const battery = isObject(doc.battery) ? doc.battery : {}
  const series = typeof battery.cellsSeries === 'number' ? battery.cellsSeries : 4
  const perCellV = battery.chemistry === 'lfp' || battery.chemistry === undefined ? 3.2 : 2
  const nominalV = typeof battery.nominalVoltageV === 'number' ? battery.nominalVoltageV : series * perCellV
  const label = typeof doc.name === 'string' && doc.name.trim() ? doc.name.trim().slice(0, 100) : ''
  return {
    format: PLAN_FILE_FORMAT,
    formatVersion: 2,
    exportedAt: '',
    vehicle: { name: label || 'Imported vehicle', kind: 'van', systemVoltageV: systemVoltageFor(nominalV) },
    scenario: { name: label || 'Imported plan' },
    plan: { ...doc, formatVersion: 1 },
  }
}

/** Upgrade steps by the version they start from. Each is pure and takes the next version's shape. */
export const PLAN_FILE_UPGRADES: Readonly<Record<number, (doc: Doc) => Doc>> = { 1: upgrade1to2 }

/** Which version a parsed document claims to be (a bare plan counts as 1), or an error message. */
export function detectVersion(doc: unknown): number | string {
  if (!isObject(doc)) return 'The file does not hold a JSON object.'
  if (doc.format === undefined) {
    if ('battery' in doc || 'trip' in doc || 'appliances' in doc) return 1
    return 'This is not an Ohmward plan file: it has no "format" field and no plan in it.'
  }
  if (doc.format !== PLAN_FILE_FORMAT)
    return `This is not an Ohmward plan file ("format" is not "${PLAN_FILE_FORMAT}").`
  const v = doc.formatVersion
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 1)
    return '"formatVersion" must be a whole number from 1.'
  if (v > PLAN_FILE_VERSION)
    return `This file was written by a newer Ohmward (format version ${v}; this one reads up to ${PLAN_FILE_VERSION}).`
  return v
}

/**
 * Read a parsed plan file of any known version: upgrade it step by step, then validate it.
 * Never throws. Errors are keyed by dotted path in the current format (`plan.battery.capacityAh`).
 */
export function readPlanFile(input: unknown): ReadPlanFileResult {
  const version = detectVersion(input)
  if (typeof version === 'string') return { ok: false, message: version, fields: { '(root)': [version] } }
  let doc = input as Doc
  for (let v = version; v < PLAN_FILE_VERSION; v++) {
    const step = PLAN_FILE_UPGRADES[v]
    if (!step) {
      const message = `No upgrade from format version ${v} is known.`
      return { ok: false, message, fields: { formatVersion: [message] } }
    }
    doc = step(doc)
  }
  const fields: PlanFileErrors = {}
  const header = PlanFileHeaderSchema.safeParse(doc)
  if (!header.success) {
    for (const issue of header.error.issues) {
      if (issue.code === 'unrecognized_keys') {
        for (const key of issue.keys)
          (fields[[...issue.path, key].join('.')] ??= []).push('is not a known field')
      } else {
        const key = issue.path.length ? issue.path.map(String).join('.') : '(root)'
        const msg = issue.code === 'invalid_type' && issue.input === undefined ? 'is required' : issue.message
        ;(fields[key] ??= []).push(msg)
      }
    }
  }
  const plan = parsePlan(doc.plan)
  if (!plan.ok)
    for (const [k, v] of Object.entries(plan.fields))
      (fields[k === '(root)' ? 'plan' : `plan.${k}`] ??= []).push(...v)
  if (!header.success || !plan.ok) {
    const n = Object.keys(fields).length
    return {
      ok: false,
      message: `The plan file has ${n} problem${n === 1 ? '' : 's'}; nothing was imported.`,
      fields,
    }
  }
  return {
    ok: true,
    file: { ...(header.data as Omit<PlanFile, 'plan'>), plan: plan.plan },
    upgradedFrom: version === PLAN_FILE_VERSION ? null : version,
  }
}

/** A plan file for the current version. `exportedAt` is passed in (shared code reads no clock). */
export function makePlanFile(
  vehicle: PlanFile['vehicle'],
  scenario: PlanFile['scenario'],
  plan: Plan,
  exportedAt: string,
): PlanFile {
  return { format: PLAN_FILE_FORMAT, formatVersion: PLAN_FILE_VERSION, exportedAt, vehicle, scenario, plan }
}

/** A safe file name from labels: "Lingon van - Winter week.ohmward.json". */
export function fileNameFor(parts: readonly string[], ext: string): string {
  const base = parts
    .map((p) =>
      p
        .replace(/[^\p{L}\p{N} ._-]+/gu, ' ')
        .replace(/\s+/g, ' ')
        .trim(),
    )
    .filter(Boolean)
    .join(' - ')
    .slice(0, 120)
  return `${base || 'ohmward'}.${ext}`
}
