/** Vehicles and their members: list, create, read, change, delete. */
import { and, desc, eq, inArray, ne, sql } from 'drizzle-orm'
import type {
  Member,
  Page,
  PageQuery,
  UserRef,
  Vehicle,
  VehicleCreate,
  VehicleDetail,
  VehiclePatch,
  VehicleRole,
} from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import { users, vehicleMemberships, vehicles } from '../../db/schema/index'
import { notFound, validationFailed } from '../../errors'
import { preparedFor } from '../../db/prepared'
import { loadMembership, requireVehicleRole, roleAllows } from './access'
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
  type Tx,
} from './records'

type VehicleRow = typeof vehicles.$inferSelect

const counts = {
  scenarioCount: sql<number>`(SELECT count(*)::int FROM scenarios s WHERE s.vehicle_id = ${vehicles.id})`,
  applianceCount: sql<number>`(SELECT count(*)::int FROM appliances a WHERE a.vehicle_id = ${vehicles.id})`,
}

/** The fields a history entry compares. */
const editableFields = (v: VehicleRow) => ({
  name: v.name,
  kind: v.kind,
  systemVoltageV: v.systemVoltageV,
  notes: v.notes,
})

interface VehicleListRow {
  vehicle: VehicleRow
  myRole: VehicleRole
  scenarioCount: number
  applianceCount: number
}

/** The API form of a vehicle row; `updatedBy` is who changed it last (looked up by the caller). */
function presentOne(
  { vehicle: v, myRole, scenarioCount, applianceCount }: VehicleListRow,
  updatedBy: UserRef | null,
): Vehicle {
  return {
    id: v.id,
    ...editableFields(v),
    myRole,
    createdAt: iso(v.createdAt),
    scenarioCount,
    applianceCount,
    version: v.version,
    updatedAt: iso(v.updatedAt),
    updatedBy,
  }
}

async function presentMany(db: DbOrTx, rows: VehicleListRow[]): Promise<Vehicle[]> {
  const refs = await userRefs(
    db,
    rows.map((r) => r.vehicle.updatedBy),
  )
  return rows.map((r) => presentOne(r, refOf(refs, r.vehicle.updatedBy)))
}

export async function listMembers(db: DbOrTx, vehicleId: string): Promise<Member[]> {
  const rows = await db
    .select({
      userId: vehicleMemberships.userId,
      displayName: users.displayName,
      role: vehicleMemberships.role,
      since: vehicleMemberships.createdAt,
    })
    .from(vehicleMemberships)
    .innerJoin(users, eq(users.id, vehicleMemberships.userId))
    .where(eq(vehicleMemberships.vehicleId, vehicleId))
    .orderBy(vehicleMemberships.createdAt)
  const order: Record<VehicleRole, number> = { owner: 0, editor: 1, viewer: 2, advisor: 3 }
  return rows.map((r) => ({ ...r, since: iso(r.since) })).sort((a, b) => order[a.role] - order[b.role])
}

/** The vehicle as the given member sees it, or null when it does not exist. */
async function loadDetail(db: DbOrTx, vehicleId: string, myRole: VehicleRole): Promise<VehicleDetail | null> {
  const [row] = await db
    .select({ vehicle: vehicles, ...counts })
    .from(vehicles)
    .where(eq(vehicles.id, vehicleId))
    .limit(1)
  if (!row) return null
  const [vehicle] = await presentMany(db, [{ ...row, myRole }])
  return { ...vehicle!, members: await listMembers(db, vehicleId) }
}

/** The list page in one prepared query: rows, their counts, who changed them last and the total. */
const vehiclePage = preparedFor((db) =>
  db
    .select({
      vehicle: vehicles,
      myRole: vehicleMemberships.role,
      ...counts,
      updatedByName: users.displayName,
      total: sql<number>`(count(*) OVER ())::int`,
    })
    .from(vehicleMemberships)
    .innerJoin(vehicles, eq(vehicles.id, vehicleMemberships.vehicleId))
    .leftJoin(users, eq(users.id, vehicles.updatedBy))
    .where(eq(vehicleMemberships.userId, sql.placeholder('userId')))
    .orderBy(desc(vehicles.updatedAt), vehicles.id)
    .limit(sql.placeholder('limit'))
    .offset(sql.placeholder('offset'))
    .prepare('ohmward_vehicle_page'),
)

export async function listVehicles(db: Db, actor: Actor, page: PageQuery): Promise<Page<Vehicle>> {
  const rows = await vehiclePage(db).execute({ userId: actor.id, limit: page.limit, offset: page.offset })
  // Past the last page there is no row to carry the total: count separately (rare).
  const total =
    rows[0]?.total ??
    (page.offset > 0
      ? ((
          await db
            .select({ n: sql<number>`count(*)::int` })
            .from(vehicleMemberships)
            .where(eq(vehicleMemberships.userId, actor.id))
        )[0]?.n ?? 0)
      : 0)
  const items = rows.map((r) =>
    presentOne(
      r,
      r.vehicle.updatedBy && r.updatedByName !== null
        ? { id: r.vehicle.updatedBy, displayName: r.updatedByName }
        : null,
    ),
  )
  return { items, total, limit: page.limit, offset: page.offset }
}

/**
 * `crewFrom` must be a vehicle the actor can change (its crew is shared with a new vehicle); throws a 400
 * naming the field otherwise.
 */
export async function checkCrewFrom(db: DbOrTx, actor: Actor, crewFrom: string | undefined): Promise<void> {
  if (!crewFrom) return
  const role = await loadMembership(db, actor.id, crewFrom)
  if (!role || !roleAllows(role.role, 'write'))
    throw validationFailed({
      crewFrom: ['must be a vehicle you can change (its crew is shared with the new vehicle)'],
    })
}

/**
 * Inside a transaction: a new vehicle, its creator as owner and, with `crewFrom` (a vehicle the caller has
 * checked the actor can change: checkCrewFrom, or the role already loaded),
 * that vehicle's owner and editors as editors and its viewers as viewers (advisors are not carried over);
 * the creation goes into the vehicle's history. Returns the new vehicle's row.
 */
export async function insertVehicle(
  tx: Tx,
  actor: Actor,
  fields: Omit<VehicleCreate, 'crewFrom'>,
  crewFrom?: string,
): Promise<typeof vehicles.$inferSelect> {
  const [v] = await tx
    .insert(vehicles)
    .values({ ...fields, notes: fields.notes ?? '', createdBy: actor.id, updatedBy: actor.id })
    .returning()
  await tx
    .insert(vehicleMemberships)
    .values({ vehicleId: v!.id, userId: actor.id, role: 'owner', updatedBy: actor.id })
  if (crewFrom) {
    const crew = await tx
      .select({ userId: vehicleMemberships.userId, role: vehicleMemberships.role })
      .from(vehicleMemberships)
      .where(
        and(
          eq(vehicleMemberships.vehicleId, crewFrom),
          ne(vehicleMemberships.userId, actor.id),
          inArray(vehicleMemberships.role, ['owner', 'editor', 'viewer']),
        ),
      )
    if (crew.length)
      await tx.insert(vehicleMemberships).values(
        crew.map((m) => ({
          vehicleId: v!.id,
          userId: m.userId,
          role: m.role === 'viewer' ? ('viewer' as const) : ('editor' as const),
          updatedBy: actor.id,
        })),
      )
  }
  await recordHistory(tx, {
    vehicleId: v!.id,
    entity: 'vehicle',
    entityId: v!.id,
    action: 'create',
    summary: `Created vehicle ${quoted(v!.name)}`,
    version: v!.version,
    after: editableFields(v!),
    actorId: actor.id,
  })
  return v!
}

/** Create a vehicle; the creator becomes its owner. */
export async function createVehicle(db: Db, actor: Actor, input: VehicleCreate): Promise<VehicleDetail> {
  const { crewFrom, ...fields } = input
  await checkCrewFrom(db, actor, crewFrom)
  return db.transaction(async (tx) => {
    const v = await insertVehicle(tx, actor, fields, crewFrom)
    return (await loadDetail(tx, v.id, 'owner'))!
  })
}

export async function getVehicle(db: Db, actor: Actor, vehicleId: string): Promise<VehicleDetail> {
  const role = await requireVehicleRole(db, actor.id, vehicleId, 'read')
  const detail = await loadDetail(db, vehicleId, role)
  if (!detail) throw notFound('That vehicle')
  return detail
}

export async function patchVehicle(
  db: Db,
  actor: Actor,
  vehicleId: string,
  patch: VehiclePatch,
): Promise<VehicleDetail> {
  const role = await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const { version, ...fields } = patch
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(vehicles).where(eq(vehicles.id, vehicleId)).limit(1)
    if (!before) throw notFound('That vehicle')
    const [after] = await tx
      .update(vehicles)
      .set({ ...fields, version: sql`${vehicles.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id })
      .where(and(eq(vehicles.id, vehicleId), eq(vehicles.version, version)))
      .returning()
    if (!after) throw staleVersion('vehicle', await loadDetail(tx, vehicleId, role))
    await recordHistory(tx, {
      vehicleId,
      entity: 'vehicle',
      entityId: vehicleId,
      action: 'update',
      summary: `Changed vehicle ${quoted(after.name)}`,
      changedFields: changedKeys(editableFields(before), editableFields(after)),
      version: after.version,
      before: editableFields(before),
      after: editableFields(after),
      actorId: actor.id,
    })
    return (await loadDetail(tx, vehicleId, role))!
  })
}

/** Owner only. Removes equipment, scenarios and history with it (foreign keys cascade). */
export async function deleteVehicle(db: Db, actor: Actor, vehicleId: string, version: number): Promise<void> {
  const role = await requireVehicleRole(db, actor.id, vehicleId, 'owner')
  await db.transaction(async (tx) => {
    const gone = await tx
      .delete(vehicles)
      .where(and(eq(vehicles.id, vehicleId), eq(vehicles.version, version)))
      .returning({ id: vehicles.id })
    if (gone.length === 0) throw staleVersion('vehicle', await loadDetail(tx, vehicleId, role))
  })
}
