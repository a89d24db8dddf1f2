/** Scenarios: a trip for one vehicle, with per-appliance usage. */
import { and, desc, eq, inArray, sql, type SQL } from 'drizzle-orm'
import type { ApplianceUsage } from '../../../shared/schemas/plan'
import type {
  Page,
  Scenario,
  ScenarioCreate,
  ScenarioDuplicate,
  ScenarioListQuery,
  ScenarioPatch,
  ScenarioSummary,
  ScenarioUsage,
  VehicleRole,
} from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import {
  appliances,
  scenarioApplianceUsage,
  scenarios,
  users,
  vehicleMemberships,
  vehicles,
} from '../../db/schema/index'
import { preparedFor } from '../../db/prepared'
import { notFound, validationFailed } from '../../errors'
import { isId, requireVehicleRole, type VehicleNeed } from '../vehicles/access'
import {
  changedKeys,
  iso,
  quoted,
  recordHistory,
  refOf,
  staleVersion,
  userRefs,
  type Actor,
  type DbOrTx,
} from '../vehicles/records'

type ScenarioRow = typeof scenarios.$inferSelect

/**
 * The scenario and the user's role on its vehicle, if the role allows `need`.
 * Non-members get 404, like a scenario that does not exist.
 */
export async function loadScenarioForUser(
  db: DbOrTx,
  userId: string,
  scenarioId: string,
  need: VehicleNeed,
): Promise<{ row: ScenarioRow; role: VehicleRole }> {
  const row = await loadRow(db, scenarioId)
  if (!row) throw notFound('That scenario')
  try {
    return { row, role: await requireVehicleRole(db, userId, row.vehicleId, need) }
  } catch (err) {
    if ((err as { status?: number }).status === 404) throw notFound('That scenario')
    throw err
  }
}

async function loadRow(db: DbOrTx, scenarioId: string): Promise<ScenarioRow | null> {
  if (!isId(scenarioId)) return null
  const [row] = await db.select().from(scenarios).where(eq(scenarios.id, scenarioId)).limit(1)
  return row ?? null
}

export async function loadUsage(db: DbOrTx, scenarioId: string): Promise<ScenarioUsage> {
  const rows = await db
    .select({ applianceId: scenarioApplianceUsage.applianceId, usage: scenarioApplianceUsage.usage })
    .from(scenarioApplianceUsage)
    .where(eq(scenarioApplianceUsage.scenarioId, scenarioId))
  return Object.fromEntries(rows.map((r) => [r.applianceId, r.usage]))
}

async function present(db: DbOrTx, row: ScenarioRow, myRole: VehicleRole): Promise<Scenario> {
  const [vehicle] = await db
    .select({ name: vehicles.name })
    .from(vehicles)
    .where(eq(vehicles.id, row.vehicleId))
  const refs = await userRefs(db, [row.updatedBy])
  return {
    id: row.id,
    vehicleId: row.vehicleId,
    vehicleName: vehicle?.name ?? '',
    myRole,
    name: row.name,
    placeName: row.placeName,
    createdAt: iso(row.createdAt),
    notes: row.notes,
    trip: row.trip,
    usage: await loadUsage(db, row.id),
    version: row.version,
    updatedAt: iso(row.updatedAt),
    updatedBy: refOf(refs, row.updatedBy),
  }
}

/** Usage keys must be appliances of the same vehicle; each wrong one is named. */
async function checkUsageKeys(db: DbOrTx, vehicleId: string, usage: ScenarioUsage): Promise<void> {
  const ids = Object.keys(usage)
  if (ids.length === 0) return
  const found = await db
    .select({ id: appliances.id })
    .from(appliances)
    .where(and(eq(appliances.vehicleId, vehicleId), inArray(appliances.id, ids)))
  const known = new Set(found.map((r) => r.id))
  const fields: Record<string, string[]> = {}
  for (const id of ids) if (!known.has(id)) fields[`usage.${id}`] = ['is not an appliance of this vehicle']
  if (Object.keys(fields).length > 0) throw validationFailed(fields)
}

async function writeUsage(
  tx: DbOrTx,
  scenarioId: string,
  usage: ScenarioUsage,
  actorId: string,
): Promise<void> {
  await tx.delete(scenarioApplianceUsage).where(eq(scenarioApplianceUsage.scenarioId, scenarioId))
  const entries = Object.entries(usage) as [string, ApplianceUsage][]
  if (entries.length === 0) return
  await tx
    .insert(scenarioApplianceUsage)
    .values(entries.map(([applianceId, u]) => ({ scenarioId, applianceId, usage: u, updatedBy: actorId })))
}

const historyFields = (row: ScenarioRow, usage: ScenarioUsage) => ({
  name: row.name,
  notes: row.notes,
  placeName: row.placeName,
  trip: row.trip,
  usage,
})

// ---------------------------------------------------------------------------------------------
// Lists
// ---------------------------------------------------------------------------------------------

/** One page of the scenarios a user can read, with who changed each last and the total, in one query. */
const scenarioPage = preparedFor((db) =>
  db
    .select({
      s: scenarios,
      vehicleName: vehicles.name,
      myRole: vehicleMemberships.role,
      updatedByName: users.displayName,
      total: sql<number>`(count(*) OVER ())::int`,
    })
    .from(scenarios)
    .innerJoin(vehicleMemberships, eq(vehicleMemberships.vehicleId, scenarios.vehicleId))
    .innerJoin(vehicles, eq(vehicles.id, scenarios.vehicleId))
    .leftJoin(users, eq(users.id, scenarios.updatedBy))
    .where(
      and(
        eq(vehicleMemberships.userId, sql.placeholder('userId')),
        sql`(${sql.placeholder('vehicleId')}::uuid IS NULL OR ${scenarios.vehicleId} = ${sql.placeholder('vehicleId')}::uuid)`,
      ),
    )
    .orderBy(desc(scenarios.updatedAt), scenarios.id)
    .limit(sql.placeholder('limit'))
    .offset(sql.placeholder('offset'))
    .prepare('ohmward_scenario_page'),
)

/** Every scenario the user can read (optionally of one vehicle), most recently changed first. */
export async function listScenarios(
  db: Db,
  actor: Actor,
  q: ScenarioListQuery,
): Promise<Page<ScenarioSummary>> {
  const rows = await scenarioPage(db).execute({
    userId: actor.id,
    vehicleId: q.vehicleId ?? null,
    limit: q.limit,
    offset: q.offset,
  })
  // Past the last page there is no row to carry the total: count separately (rare).
  const total = rows[0]?.total ?? (q.offset > 0 ? await countScenarios(db, actor.id, q.vehicleId) : 0)
  const items = rows.map(({ s, vehicleName, myRole, updatedByName }) => ({
    id: s.id,
    vehicleId: s.vehicleId,
    vehicleName,
    myRole,
    name: s.name,
    placeName: s.placeName,
    createdAt: iso(s.createdAt),
    startDate: s.trip.startDate,
    days: s.trip.days,
    latitudeDeg: s.trip.latitudeDeg,
    longitudeDeg: s.trip.longitudeDeg,
    timeZone: s.trip.timeZone,
    nightLowC: s.trip.nightLowC,
    dayHighC: s.trip.dayHighC,
    version: s.version,
    updatedAt: iso(s.updatedAt),
    updatedBy: s.updatedBy && updatedByName !== null ? { id: s.updatedBy, displayName: updatedByName } : null,
  }))
  return { items, total, limit: q.limit, offset: q.offset }
}

async function countScenarios(db: Db, userId: string, vehicleId: string | undefined): Promise<number> {
  const conditions: SQL[] = [eq(vehicleMemberships.userId, userId)]
  if (vehicleId) conditions.push(eq(scenarios.vehicleId, vehicleId))
  const [row] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(scenarios)
    .innerJoin(vehicleMemberships, eq(vehicleMemberships.vehicleId, scenarios.vehicleId))
    .where(and(...conditions))
  return row?.n ?? 0
}

/** The scenarios of one vehicle (404 for non-members). */
export async function listVehicleScenarios(
  db: Db,
  actor: Actor,
  vehicleId: string,
  q: ScenarioListQuery,
): Promise<Page<ScenarioSummary>> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  return listScenarios(db, actor, { ...q, vehicleId })
}

// ---------------------------------------------------------------------------------------------
// One scenario
// ---------------------------------------------------------------------------------------------

export async function createScenario(
  db: Db,
  actor: Actor,
  vehicleId: string,
  input: ScenarioCreate,
): Promise<Scenario> {
  const role = await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const usage = input.usage ?? {}
  return db.transaction(async (tx) => {
    await checkUsageKeys(tx, vehicleId, usage)
    const [row] = await tx
      .insert(scenarios)
      .values({
        vehicleId,
        name: input.name,
        notes: input.notes ?? '',
        placeName: input.placeName ?? '',
        trip: input.trip,
        createdBy: actor.id,
        updatedBy: actor.id,
      })
      .returning()
    await writeUsage(tx, row!.id, usage, actor.id)
    await recordHistory(tx, {
      vehicleId,
      entity: 'scenario',
      entityId: row!.id,
      action: 'create',
      summary: `Added scenario ${quoted(row!.name)}`,
      version: row!.version,
      after: historyFields(row!, usage),
      actorId: actor.id,
    })
    return present(tx, row!, role)
  })
}

export async function getScenario(db: Db, actor: Actor, scenarioId: string): Promise<Scenario> {
  const { row, role } = await loadScenarioForUser(db, actor.id, scenarioId, 'read')
  return present(db, row, role)
}

export async function patchScenario(
  db: Db,
  actor: Actor,
  scenarioId: string,
  patch: ScenarioPatch,
): Promise<Scenario> {
  const { row: found, role } = await loadScenarioForUser(db, actor.id, scenarioId, 'write')
  const { version, usage, ...fields } = patch
  return db.transaction(async (tx) => {
    const before = await loadRow(tx, found.id)
    if (!before) throw notFound('That scenario')
    if (before.version !== version) throw staleVersion('scenario', await present(tx, before, role))
    if (usage) await checkUsageKeys(tx, before.vehicleId, usage)
    const usageBefore = await loadUsage(tx, before.id)
    const [after] = await tx
      .update(scenarios)
      .set({ ...fields, version: sql`${scenarios.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id })
      .where(and(eq(scenarios.id, before.id), eq(scenarios.version, version)))
      .returning()
    if (!after) {
      const now = await loadRow(tx, before.id)
      throw staleVersion('scenario', now ? await present(tx, now, role) : null)
    }
    if (usage) await writeUsage(tx, after.id, usage, actor.id)
    const changed = changedKeys(
      historyFields(before, usageBefore),
      historyFields(after, usage ?? usageBefore),
    )
    await recordHistory(tx, {
      vehicleId: after.vehicleId,
      entity: 'scenario',
      entityId: after.id,
      action: 'update',
      summary: `Changed scenario ${quoted(after.name)}${changed.length ? `: ${changed.join(', ')}` : ''}`,
      changedFields: changed,
      version: after.version,
      before: historyFields(before, usageBefore),
      after: historyFields(after, usage ?? usageBefore),
      actorId: actor.id,
    })
    return present(tx, after, role)
  })
}

export async function deleteScenario(
  db: Db,
  actor: Actor,
  scenarioId: string,
  version: number,
): Promise<void> {
  const { row: found, role } = await loadScenarioForUser(db, actor.id, scenarioId, 'write')
  await db.transaction(async (tx) => {
    const gone = await tx
      .delete(scenarios)
      .where(and(eq(scenarios.id, found.id), eq(scenarios.version, version)))
      .returning({ id: scenarios.id })
    if (gone.length === 0) {
      const now = await loadRow(tx, found.id)
      throw staleVersion('scenario', now ? await present(tx, now, role) : null)
    }
    await recordHistory(tx, {
      vehicleId: found.vehicleId,
      entity: 'scenario',
      entityId: found.id,
      action: 'delete',
      summary: `Removed scenario ${quoted(found.name)}`,
      before: { name: found.name, trip: found.trip },
      actorId: actor.id,
    })
  })
}

/** A copy in the same vehicle under a new name, usage included ("winter copy of summer"). */
export async function duplicateScenario(
  db: Db,
  actor: Actor,
  scenarioId: string,
  input: ScenarioDuplicate,
): Promise<Scenario> {
  const { row: source, role } = await loadScenarioForUser(db, actor.id, scenarioId, 'write')
  return db.transaction(async (tx) => {
    const usage = await loadUsage(tx, source.id)
    const [row] = await tx
      .insert(scenarios)
      .values({
        vehicleId: source.vehicleId,
        name: input.name,
        notes: source.notes,
        placeName: source.placeName,
        trip: input.trip ?? source.trip,
        createdBy: actor.id,
        updatedBy: actor.id,
      })
      .returning()
    await writeUsage(tx, row!.id, usage, actor.id)
    await recordHistory(tx, {
      vehicleId: source.vehicleId,
      entity: 'scenario',
      entityId: row!.id,
      action: 'duplicate',
      summary: `Copied scenario ${quoted(source.name)} as ${quoted(row!.name)}`,
      version: row!.version,
      after: historyFields(row!, usage),
      actorId: actor.id,
    })
    return present(tx, row!, role)
  })
}
