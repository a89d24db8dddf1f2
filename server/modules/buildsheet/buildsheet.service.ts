/**
 * Build sheet (issue 7): the computed sheet for a vehicle (its equipment with one scenario's plan), the
 * per-vehicle settings, and the parts list. The sheet itself is computed by shared/buildsheet, the same
 * code the browser runs.
 */
import { and, asc, eq, sql } from 'drizzle-orm'
import {
  checkThresholds,
  computeBuildSheet,
  EMPTY_SETTINGS,
  resolveThresholds,
  BuildSheetSettingsPutSchema,
  PartCreateSchema,
  PartPatchSchema,
  type BuildSheetResponse,
  type BuildSheetSettingsPut,
  type BuildSheetSettingsRecord,
  type PartCreate,
  type PartPatch,
  type PartRecord,
} from '../../../shared/buildsheet/index'
import { resolveBattery } from '../../../shared/engine/presets'
import type { Plan } from '../../../shared/schemas/plan'
import type { Db } from '../../db/client'
import { buildSheetSettings, parts, scenarios, vehicles } from '../../db/schema/index'
import { HttpError, notFound, validationFailed } from '../../errors'
import { isId, requireVehicleRole } from '../vehicles/access'
import { iso, refOf, staleVersion, userRefs, type Actor, type DbOrTx } from '../vehicles/records'
import { buildPlanForScenario } from '../scenarios/plan'
import { parse } from '../../validate'

// ---------------------------------------------------------------------------------------------
// Settings
// ---------------------------------------------------------------------------------------------

async function loadSettings(db: DbOrTx, vehicleId: string): Promise<BuildSheetSettingsRecord> {
  const [row] = await db
    .select()
    .from(buildSheetSettings)
    .where(eq(buildSheetSettings.vehicleId, vehicleId))
    .limit(1)
  if (!row) return { ...EMPTY_SETTINGS, version: 0, updatedAt: null, updatedBy: null }
  const refs = await userRefs(db, [row.updatedBy])
  return {
    scenarioId: row.scenarioId,
    protection: row.protection,
    checklist: row.checklist,
    cableRuns: row.cableRuns,
    version: row.version,
    updatedAt: iso(row.updatedAt),
    updatedBy: refOf(refs, row.updatedBy),
  }
}

async function vehicleScenarios(db: DbOrTx, vehicleId: string): Promise<{ id: string; name: string }[]> {
  return db
    .select({ id: scenarios.id, name: scenarios.name })
    .from(scenarios)
    .where(eq(scenarios.vehicleId, vehicleId))
    .orderBy(asc(scenarios.createdAt), asc(scenarios.id))
}

/** The plan for the chosen scenario, or the reasons there is none. */
async function planFor(
  db: DbOrTx,
  scenarioId: string | null,
): Promise<{ plan: Plan | null; missing: string[] }> {
  if (!scenarioId)
    return { plan: null, missing: ['Add a scenario (a trip) to this vehicle: the sheet is built from one.'] }
  try {
    return { plan: await buildPlanForScenario(db as Db, scenarioId), missing: [] }
  } catch (err) {
    if (err instanceof HttpError && err.status === 422) {
      const details = Object.entries(err.fields ?? {}).map(([k, v]) => `${k}: ${v.join(', ')}`)
      return { plan: null, missing: [err.message, ...details] }
    }
    throw err
  }
}

export async function getBuildSheet(
  db: Db,
  actor: Actor,
  vehicleId: string,
  requestedScenarioId?: string,
): Promise<BuildSheetResponse> {
  const role = await requireVehicleRole(db, actor.id, vehicleId, 'read')
  const [vehicle] = await db
    .select({ name: vehicles.name, systemVoltageV: vehicles.systemVoltageV })
    .from(vehicles)
    .where(eq(vehicles.id, vehicleId))
  if (!vehicle) throw notFound('That vehicle')
  const [list, settings, partRows] = await Promise.all([
    vehicleScenarios(db, vehicleId),
    loadSettings(db, vehicleId),
    listPartRecords(db, vehicleId),
  ])
  if (requestedScenarioId !== undefined && !list.some((s) => s.id === requestedScenarioId)) {
    throw validationFailed({ scenarioId: ['is not a scenario of this vehicle'] })
  }
  const chosen =
    requestedScenarioId ??
    (settings.scenarioId && list.some((s) => s.id === settings.scenarioId) ? settings.scenarioId : null) ??
    list[0]?.id ??
    null
  const { plan, missing } = await planFor(db, chosen)
  const sheet = plan
    ? computeBuildSheet({
        plan,
        protection: settings.protection,
        cableRuns: settings.cableRuns,
        parts: partRows.map((p) => ({ ...p })),
      })
    : null
  return {
    vehicleId,
    vehicleName: vehicle.name,
    systemVoltageV: vehicle.systemVoltageV,
    myRole: role,
    scenarios: list,
    scenarioId: chosen,
    plan,
    missing,
    settings,
    parts: partRows,
    sheet,
  }
}

/**
 * Replace the settings fields that were sent (the body is checked after the role, so a viewer gets 403). `version` must match the stored one (0 = never saved);
 * otherwise 409 with the current settings. Protection overrides that contradict each other are refused
 * with the threshold named (`protection.cellChargeReconnectV`), and nothing is saved.
 */
export async function putSettings(
  db: Db,
  actor: Actor,
  vehicleId: string,
  body: unknown,
): Promise<BuildSheetSettingsRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const input: BuildSheetSettingsPut = parse(BuildSheetSettingsPutSchema, body)
  return db.transaction(async (tx) => {
    await tx.execute(sql`SELECT 1 FROM ${vehicles} WHERE ${vehicles.id} = ${vehicleId} FOR UPDATE`)
    const before = await loadSettings(tx, vehicleId)
    if (before.version !== input.version) throw staleVersion('build sheet', before)
    const next = {
      scenarioId: input.scenarioId !== undefined ? input.scenarioId : before.scenarioId,
      protection: input.protection ?? before.protection,
      checklist: input.checklist ?? before.checklist,
      cableRuns: input.cableRuns ?? before.cableRuns,
    }
    const list = await vehicleScenarios(tx, vehicleId)
    if (next.scenarioId && !list.some((s) => s.id === next.scenarioId)) {
      throw validationFailed({ scenarioId: ['is not a scenario of this vehicle'] })
    }
    if (input.protection) {
      // Read through the pool: the plan assembly runs its queries in parallel, which one transaction client cannot.
      const { plan } = await planFor(db, next.scenarioId ?? list[0]?.id ?? null)
      if (plan) {
        const battery = resolveBattery(plan.battery)
        const issues = checkThresholds(resolveThresholds(battery, next.protection), battery.heater !== null)
        const fields = Object.fromEntries(Object.entries(issues).map(([k, m]) => [`protection.${k}`, [m]]))
        if (Object.keys(fields).length > 0)
          throw validationFailed(fields, 'Some protection settings contradict each other.')
      }
    }
    if (before.version === 0) {
      await tx.insert(buildSheetSettings).values({ vehicleId, ...next, updatedBy: actor.id })
    } else {
      await tx
        .update(buildSheetSettings)
        .set({
          ...next,
          version: sql`${buildSheetSettings.version} + 1`,
          updatedAt: new Date(),
          updatedBy: actor.id,
        })
        .where(eq(buildSheetSettings.vehicleId, vehicleId))
    }
    return loadSettings(tx, vehicleId)
  })
}

// ---------------------------------------------------------------------------------------------
// Parts
// ---------------------------------------------------------------------------------------------

type PartRow = typeof parts.$inferSelect

function present(row: PartRow, refs: Awaited<ReturnType<typeof userRefs>>): PartRecord {
  return {
    id: row.id,
    vehicleId: row.vehicleId,
    name: row.name,
    // numeric comes back as a string; normalise "2.000" → "2", keep money at 2 decimals.
    quantity: normaliseQuantity(row.quantity),
    unitPrice: row.unitPrice,
    currency: row.currency,
    massKg: row.massKg,
    note: row.note,
    position: row.position,
    version: row.version,
    updatedAt: iso(row.updatedAt),
    updatedBy: refOf(refs, row.updatedBy),
  }
}

function normaliseQuantity(q: string): string {
  return q.includes('.') ? q.replace(/0+$/, '').replace(/\.$/, '') : q
}

async function listPartRecords(db: DbOrTx, vehicleId: string): Promise<PartRecord[]> {
  const rows = await db
    .select()
    .from(parts)
    .where(eq(parts.vehicleId, vehicleId))
    .orderBy(asc(parts.position))
  const refs = await userRefs(
    db,
    rows.map((r) => r.updatedBy),
  )
  return rows.map((r) => present(r, refs))
}

async function loadPart(db: DbOrTx, vehicleId: string, partId: string): Promise<PartRecord | null> {
  if (!isId(partId)) return null
  const [row] = await db
    .select()
    .from(parts)
    .where(and(eq(parts.vehicleId, vehicleId), eq(parts.id, partId)))
    .limit(1)
  if (!row) return null
  return present(row, await userRefs(db, [row.updatedBy]))
}

export async function listParts(db: Db, actor: Actor, vehicleId: string): Promise<{ items: PartRecord[] }> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  return { items: await listPartRecords(db, vehicleId) }
}

export async function createPart(
  db: Db,
  actor: Actor,
  vehicleId: string,
  body: unknown,
): Promise<PartRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const input: PartCreate = parse(PartCreateSchema, body)
  const [row] = await db
    .insert(parts)
    .values({
      vehicleId,
      name: input.name,
      quantity: input.quantity,
      unitPrice: input.unitPrice,
      currency: input.currency,
      massKg: input.massKg,
      note: input.note ?? '',
      updatedBy: actor.id,
    })
    .returning()
  return present(row!, await userRefs(db, [actor.id]))
}

export async function patchPart(
  db: Db,
  actor: Actor,
  vehicleId: string,
  partId: string,
  body: unknown,
): Promise<PartRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const { version, ...fields }: PartPatch = parse(PartPatchSchema, body)
  return db.transaction(async (tx) => {
    const before = await loadPart(tx, vehicleId, partId)
    if (!before) throw notFound('That part')
    if (before.version !== version) throw staleVersion('part', before)
    const [row] = await tx
      .update(parts)
      .set({ ...fields, version: sql`${parts.version} + 1`, updatedAt: new Date(), updatedBy: actor.id })
      .where(and(eq(parts.id, partId), eq(parts.version, version)))
      .returning()
    if (!row) throw staleVersion('part', await loadPart(tx, vehicleId, partId))
    return present(row, await userRefs(tx, [actor.id]))
  })
}

export async function deletePart(
  db: Db,
  actor: Actor,
  vehicleId: string,
  partId: string,
  version: number,
): Promise<void> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  await db.transaction(async (tx) => {
    const before = await loadPart(tx, vehicleId, partId)
    if (!before) throw notFound('That part')
    if (before.version !== version) throw staleVersion('part', before)
    await tx.delete(parts).where(and(eq(parts.id, partId), eq(parts.version, version)))
  })
}
