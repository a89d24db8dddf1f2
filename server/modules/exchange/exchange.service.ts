/**
 * Plan files (issue 10): export a scenario's plan in our versioned file format, export its hourly results
 * as CSV, and import a plan file into a vehicle as a new scenario. Also the Outlook's "Save as a new
 * scenario" for a tried pack or array, which puts a whole plan on a copy of the vehicle
 * (saveChangeOnVehicleCopy).
 *
 * Equipment rule on import (docs/reports.md):
 * - a vehicle with no equipment yet (no battery bank, no inverter, no appliances, no charge sources) takes
 *   the file's equipment, so the new scenario runs exactly as the exported one did;
 * - a vehicle that already has equipment keeps it untouched; the new scenario takes the file's trip, and the
 *   file's per-appliance usage is carried over to the vehicle's appliances with the same name
 *   (case-insensitive). What was not carried over is listed in the answer's `notes`.
 */
import { eq, sql } from 'drizzle-orm'
import { makePlanFile, readPlanFile, type PlanFile } from '../../../shared/exchange/format'
import { hourlyCsv } from '../../../shared/exchange/hourly-csv'
import { parsePlan, type ApplianceUsage, type Plan } from '../../../shared/schemas/plan'
import {
  ApplianceCreateSchema,
  LIST_LIMITS,
  type Scenario,
  type VehicleCreate,
} from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import {
  appliances,
  batteryBanks,
  chargeSources,
  inverters,
  scenarioApplianceUsage,
  scenarios,
  vehicles,
} from '../../db/schema/index'
import { HttpError, notFound, validationFailed } from '../../errors'
import { requireVehicleRole, roleAllows } from '../vehicles/access'
import { insertVehicle } from '../vehicles/vehicles.service'
import { loadApplianceRows } from '../vehicles/appliances.service'
import { quoted, recordHistory, type Actor, type Tx } from '../vehicles/records'
import { buildPlanForScenario } from '../scenarios/plan'
import { getScenario, loadScenarioForUser } from '../scenarios/scenarios.service'
import { resultsForPlan } from '../results/results.service'

async function vehicleLabels(db: Db, vehicleId: string): Promise<PlanFile['vehicle']> {
  const [v] = await db
    .select({ name: vehicles.name, kind: vehicles.kind, systemVoltageV: vehicles.systemVoltageV })
    .from(vehicles)
    .where(eq(vehicles.id, vehicleId))
  if (!v) throw notFound('That vehicle')
  return {
    name: v.name,
    kind: v.kind,
    systemVoltageV: v.systemVoltageV as PlanFile['vehicle']['systemVoltageV'],
  }
}

/** The plan file of a scenario (read access). */
export async function exportPlanFile(
  db: Db,
  actor: Actor,
  scenarioId: string,
  now = new Date(),
): Promise<PlanFile> {
  const { row } = await loadScenarioForUser(db, actor.id, scenarioId, 'read')
  const plan = await buildPlanForScenario(db, row.id)
  const scenario: PlanFile['scenario'] = { name: row.name }
  if (row.notes) scenario.notes = row.notes
  if (row.placeName) scenario.placeName = row.placeName
  return makePlanFile(await vehicleLabels(db, row.vehicleId), scenario, plan, now.toISOString())
}

/** The hourly results of a scenario as CSV text (read access), with labels for the file name. */
export async function exportHourlyCsv(
  db: Db,
  actor: Actor,
  scenarioId: string,
): Promise<{ csv: string; vehicleName: string; scenarioName: string }> {
  const { row } = await loadScenarioForUser(db, actor.id, scenarioId, 'read')
  const plan = await buildPlanForScenario(db, row.id)
  const { results } = resultsForPlan(plan)
  const vehicle = await vehicleLabels(db, row.vehicleId)
  return { csv: hourlyCsv(results), vehicleName: vehicle.name, scenarioName: row.name }
}

export interface PlanImportResult {
  scenario: Scenario
  /** true when the vehicle had no equipment and took the file's. */
  equipmentCreated: boolean
  /** The file's format version when it was upgraded on the way in; null when it was current. */
  upgradedFrom: number | null
  /** Plain-words notes on what was and was not carried over. */
  notes: string[]
}

const norm = (s: string) => s.trim().toLocaleLowerCase('en')

/**
 * The plan's appliances checked as the appliance endpoint checks a new row (ApplianceCreateSchema: e.g. the
 * hours a day must fit the appliance's own window). The plan schema checks the hours against a scenario's
 * usage instead, so a plan can pass with rows the vehicle's own list would refuse. Errors keyed
 * `appliances.N.field`; empty when every row is fine.
 */
function applianceRowIssues(plan: Plan): Record<string, string[]> {
  const fields: Record<string, string[]> = {}
  plan.appliances.forEach((a, i) => {
    const { id: _id, usage: _usage, ...row } = a
    const r = ApplianceCreateSchema.safeParse(row)
    if (r.success) return
    for (const issue of r.error.issues)
      (fields[['appliances', i, ...issue.path].join('.')] ??= []).push(issue.message)
  })
  return fields
}

/**
 * Inside a transaction: a plan's battery bank, inverter, appliances (in the plan's order) and charge sources
 * on a vehicle that has none, with one history entry. Returns the plan's per-appliance usage keyed by the
 * new appliances' ids.
 */
async function insertPlanEquipment(
  tx: Tx,
  actor: Actor,
  vehicleId: string,
  plan: Plan,
  summary: string,
  action: 'import' | 'duplicate',
): Promise<Record<string, ApplianceUsage>> {
  const usage: Record<string, ApplianceUsage> = {}
  await tx.insert(batteryBanks).values({ vehicleId, params: plan.battery, updatedBy: actor.id })
  if (plan.inverter)
    await tx.insert(inverters).values({ vehicleId, params: plan.inverter, updatedBy: actor.id })
  // One by one, so the sequence numbers keep the plan's order.
  for (const a of plan.appliances) {
    const { id: _id, usage: u, ...params } = a
    const [row] = await tx
      .insert(appliances)
      .values({ vehicleId, params, updatedBy: actor.id })
      .returning({ id: appliances.id })
    if (u) usage[row!.id] = u
  }
  for (const s of plan.sources) {
    const { id: _id, ...params } = s
    await tx.insert(chargeSources).values({ vehicleId, kind: s.kind, params, updatedBy: actor.id })
  }
  await recordHistory(tx, {
    vehicleId,
    entity: 'vehicle',
    entityId: vehicleId,
    action,
    summary: `${summary}: battery bank, ${plan.appliances.length} appliances, ${plan.sources.length} charge sources${plan.inverter ? ', inverter' : ''}`,
    after: {
      battery: plan.battery,
      inverter: plan.inverter ?? null,
      appliances: plan.appliances,
      sources: plan.sources,
    },
    actorId: actor.id,
  })
  return usage
}

/** Inside a transaction: a new scenario with its usage, and its history entry. Returns its id. */
async function insertPlanScenario(
  tx: Tx,
  actor: Actor,
  vehicleId: string,
  s: {
    name: string
    notes: string
    placeName: string
    trip: Plan['trip']
    usage: Record<string, ApplianceUsage>
  },
  summary: (quotedName: string) => string,
  action: 'import' | 'duplicate',
): Promise<string> {
  const [row] = await tx
    .insert(scenarios)
    .values({
      vehicleId,
      name: s.name,
      notes: s.notes,
      placeName: s.placeName,
      trip: s.trip,
      createdBy: actor.id,
      updatedBy: actor.id,
    })
    .returning()
  const entries = Object.entries(s.usage)
  if (entries.length > 0) {
    await tx.insert(scenarioApplianceUsage).values(
      entries.map(([applianceId, u]) => ({
        scenarioId: row!.id,
        applianceId,
        usage: u,
        updatedBy: actor.id,
      })),
    )
  }
  await recordHistory(tx, {
    vehicleId,
    entity: 'scenario',
    entityId: row!.id,
    action,
    summary: summary(quoted(row!.name)),
    version: row!.version,
    after: { name: row!.name, notes: row!.notes, placeName: row!.placeName, trip: row!.trip, usage: s.usage },
    actorId: actor.id,
  })
  return row!.id
}

/** Import a plan file (already parsed JSON) into a vehicle as a new scenario. Write access. */
export async function importPlanFile(
  db: Db,
  actor: Actor,
  vehicleId: string,
  input: unknown,
  nameOverride?: string,
): Promise<PlanImportResult> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const read = readPlanFile(input)
  if (!read.ok) throw new HttpError(400, 'import_invalid', read.message, read.fields)
  const file = read.file
  const plan: Plan = file.plan
  const rowIssues = applianceRowIssues(plan)
  if (Object.keys(rowIssues).length > 0)
    throw new HttpError(
      400,
      'import_invalid',
      'Some appliances in the file do not fit their own hours.',
      Object.fromEntries(Object.entries(rowIssues).map(([k, v]) => [`plan.${k}`, v])),
    )
  const name = (nameOverride?.trim() || file.scenario.name).slice(0, 100)

  const { scenarioId, equipmentCreated, notes } = await db.transaction(async (tx) => {
    // One import at a time per vehicle: two simultaneous imports into an empty vehicle must not both add equipment.
    await tx.execute(sql`SELECT 1 FROM ${vehicles} WHERE ${vehicles.id} = ${vehicleId} FOR UPDATE`)
    // In turn: one transaction client runs one query at a time.
    const [battery] = await tx
      .select({ v: batteryBanks.vehicleId })
      .from(batteryBanks)
      .where(eq(batteryBanks.vehicleId, vehicleId))
    const [inverter] = await tx
      .select({ v: inverters.vehicleId })
      .from(inverters)
      .where(eq(inverters.vehicleId, vehicleId))
    const existing = await loadApplianceRows(tx, vehicleId)
    const [sourceCount] = await tx
      .select({ n: sql<number>`count(*)::int` })
      .from(chargeSources)
      .where(eq(chargeSources.vehicleId, vehicleId))
    const empty = !battery && !inverter && existing.length === 0 && (sourceCount?.n ?? 0) === 0
    const notes: string[] = []
    const usage: Record<string, ApplianceUsage> = {}
    if (empty) {
      Object.assign(
        usage,
        await insertPlanEquipment(
          tx,
          actor,
          vehicleId,
          plan,
          `Took the equipment from the plan file of ${quoted(file.vehicle.name)}`,
          'import',
        ),
      )
      notes.push(
        'This vehicle had no equipment yet, so it took the battery bank, appliances, charge sources and inverter from the file.',
      )
    } else {
      const byName = new Map(existing.map((r) => [norm(r.params.name), r.id]))
      const unmatched: string[] = []
      for (const a of plan.appliances) {
        if (!a.usage) continue
        const id = byName.get(norm(a.name))
        if (id) usage[id] = a.usage
        else unmatched.push(a.name)
      }
      notes.push(
        'This vehicle already has equipment, so it was kept as it is: the new scenario uses the trip from the file with this vehicle’s battery bank, appliances and charge sources.',
      )
      if (unmatched.length > 0)
        notes.push(
          `No appliance here has the name of ${unmatched.map(quoted).join(', ')}: their usage in the file was not carried over.`,
        )
    }
    const scenarioId = await insertPlanScenario(
      tx,
      actor,
      vehicleId,
      {
        name,
        notes: file.scenario.notes ?? '',
        placeName: file.scenario.placeName ?? '',
        trip: plan.trip,
        usage,
      },
      (n) => `Imported scenario ${n} from a plan file`,
      'import',
    )
    return { scenarioId, equipmentCreated: empty, notes }
  })
  if (read.upgradedFrom !== null)
    notes.push(`The file was in format version ${read.upgradedFrom} and was upgraded to the current version.`)
  return {
    scenario: await getScenario(db, actor, scenarioId),
    equipmentCreated,
    upgradedFrom: read.upgradedFrom,
    notes,
  }
}

/**
 * "Blue van (Winter · 330 Ah)", within the name limit: the original's name is shortened (by characters, not
 * UTF-16 units, so an emoji is never cut in half), the tried scenario's name kept whole where it fits.
 */
export function copyName(vehicle: string, scenario: string): string {
  const max = LIST_LIMITS.nameMaxLength
  const tail = [...` (${scenario})`]
  if (tail.length >= max - 8)
    return (
      [...`${vehicle} (${scenario}`]
        .slice(0, max - 1)
        .join('')
        .trim() + ')'
    )
  const head = [...vehicle]
    .slice(0, max - tail.length)
    .join('')
    .trim()
  return head + tail.join('')
}

export interface SavedChange {
  scenario: Scenario
  vehicleId: string
}

/**
 * "Save as a new scenario" for a change that touches the vehicle's equipment (a tried pack or array), or
 * from a vehicle the actor can only read: one transaction makes a copy of the scenario's vehicle with the
 * tried plan's equipment and puts the new scenario (the plan's trip and usage) on it, so a failure leaves
 * nothing behind. Read access to the scenario. When the actor can change the original vehicle, its crew
 * shares the copy (createVehicle's `crewFrom`); otherwise the copy is the actor's own.
 */
export async function saveChangeOnVehicleCopy(
  db: Db,
  actor: Actor,
  scenarioId: string,
  input: { name: string; plan: unknown },
): Promise<SavedChange> {
  const { row, role } = await loadScenarioForUser(db, actor.id, scenarioId, 'read')
  const read = parsePlan(input.plan)
  if (!read.ok)
    throw validationFailed(
      Object.fromEntries(
        Object.entries(read.fields).map(([k, v]) => [k === '(root)' ? 'plan' : `plan.${k}`, v]),
      ),
      'The tried plan is not valid.',
    )
  const plan = read.plan
  const rowIssues = applianceRowIssues(plan)
  if (Object.keys(rowIssues).length > 0)
    throw validationFailed(
      Object.fromEntries(Object.entries(rowIssues).map(([k, v]) => [`plan.${k}`, v])),
      'The tried plan is not valid.',
    )
  const [original] = await db.select().from(vehicles).where(eq(vehicles.id, row.vehicleId)).limit(1)
  if (!original) throw notFound('That scenario')
  const crewFrom = roleAllows(role, 'write') ? original.id : undefined
  const { vehicleId, newScenarioId } = await db.transaction(async (tx) => {
    const v = await insertVehicle(
      tx,
      actor,
      {
        name: copyName(original.name, input.name),
        kind: original.kind,
        systemVoltageV: original.systemVoltageV as VehicleCreate['systemVoltageV'],
        notes: `Copied from ${quoted(original.name)} to keep a tried change from the Outlook of ${quoted(row.name)}.`,
      },
      crewFrom,
    )
    const usage = await insertPlanEquipment(
      tx,
      actor,
      v.id,
      plan,
      `Took the tried equipment from the Outlook of ${quoted(row.name)}`,
      'duplicate',
    )
    const id = await insertPlanScenario(
      tx,
      actor,
      v.id,
      { name: input.name, notes: row.notes, placeName: row.placeName, trip: plan.trip, usage },
      (n) => `Saved scenario ${n} from a tried change`,
      'duplicate',
    )
    return { vehicleId: v.id, newScenarioId: id }
  })
  return { scenario: await getScenario(db, actor, newScenarioId), vehicleId }
}
