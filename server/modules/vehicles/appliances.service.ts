/** The appliance inventory of a vehicle: list, add, change, remove. CSV lives in appliances.csv.ts. */
import { and, asc, eq, sql } from 'drizzle-orm'
import { PLAN_LIMITS } from '../../../shared/schemas/plan'
import {
  ApplianceCreateSchema,
  type ApplianceCreate,
  type ApplianceFields,
  type AppliancePatch,
  type ApplianceRecord,
} from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import { appliances } from '../../db/schema/index'
import { HttpError, notFound } from '../../errors'
import { parseInput as parse } from './input'
import { isId, requireVehicleRole } from './access'
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
} from './records'

export type ApplianceRow = typeof appliances.$inferSelect

export async function presentAppliances(db: DbOrTx, rows: ApplianceRow[]): Promise<ApplianceRecord[]> {
  const refs = await userRefs(
    db,
    rows.map((r) => r.updatedBy),
  )
  return rows.map((r) => ({
    ...r.params,
    id: r.id,
    vehicleId: r.vehicleId,
    version: r.version,
    updatedAt: iso(r.updatedAt),
    updatedBy: refOf(refs, r.updatedBy),
  }))
}

export async function loadApplianceRows(db: DbOrTx, vehicleId: string): Promise<ApplianceRow[]> {
  return db.select().from(appliances).where(eq(appliances.vehicleId, vehicleId)).orderBy(asc(appliances.seq))
}

async function loadOne(db: DbOrTx, vehicleId: string, applianceId: string): Promise<ApplianceRow | null> {
  if (!isId(applianceId)) return null
  const [row] = await db
    .select()
    .from(appliances)
    .where(and(eq(appliances.id, applianceId), eq(appliances.vehicleId, vehicleId)))
    .limit(1)
  return row ?? null
}

const presentOne = async (db: DbOrTx, row: ApplianceRow | null) =>
  row ? (await presentAppliances(db, [row]))[0]! : null

export const tooManyAppliances = () =>
  new HttpError(
    409,
    'limit_reached',
    `A vehicle holds at most ${PLAN_LIMITS.appliancesMax} appliances. Remove some before adding more.`,
  )

export async function listAppliances(db: Db, actor: Actor, vehicleId: string): Promise<ApplianceRecord[]> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  return presentAppliances(db, await loadApplianceRows(db, vehicleId))
}

export async function createAppliance(
  db: Db,
  actor: Actor,
  vehicleId: string,
  input: ApplianceCreate,
): Promise<ApplianceRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  return db.transaction(async (tx) => {
    const [count] = await tx
      .select({ n: sql<number>`count(*)::int` })
      .from(appliances)
      .where(eq(appliances.vehicleId, vehicleId))
    if ((count?.n ?? 0) >= PLAN_LIMITS.appliancesMax) throw tooManyAppliances()
    const [row] = await tx
      .insert(appliances)
      .values({ vehicleId, params: input, updatedBy: actor.id })
      .returning()
    await recordHistory(tx, {
      vehicleId,
      entity: 'appliance',
      entityId: row!.id,
      action: 'create',
      summary: `Added appliance ${quoted(input.name)}`,
      version: row!.version,
      after: input,
      actorId: actor.id,
    })
    return (await presentOne(tx, row!))!
  })
}

export async function patchAppliance(
  db: Db,
  actor: Actor,
  vehicleId: string,
  applianceId: string,
  patch: AppliancePatch,
): Promise<ApplianceRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const { version, ...fields } = patch
  return db.transaction(async (tx) => {
    const before = await loadOne(tx, vehicleId, applianceId)
    if (!before) throw notFound('That appliance')
    if (before.version !== version) throw staleVersion('appliance', await presentOne(tx, before))
    // Validate the merged appliance, so a patch cannot leave a row the engine would refuse.
    const params: ApplianceFields = parse(ApplianceCreateSchema, { ...before.params, ...fields })
    const [after] = await tx
      .update(appliances)
      .set({ params, version: sql`${appliances.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id })
      .where(and(eq(appliances.id, before.id), eq(appliances.version, version)))
      .returning()
    if (!after)
      throw staleVersion('appliance', await presentOne(tx, await loadOne(tx, vehicleId, applianceId)))
    const changed = changedKeys(before.params, params)
    await recordHistory(tx, {
      vehicleId,
      entity: 'appliance',
      entityId: after.id,
      action: 'update',
      summary: `Changed appliance ${quoted(params.name)}${changed.length ? `: ${changed.join(', ')}` : ''}`,
      changedFields: changed,
      version: after.version,
      before: before.params,
      after: params,
      actorId: actor.id,
    })
    return (await presentOne(tx, after))!
  })
}

/** Removes the appliance and its usage in every scenario (foreign key cascade). */
export async function deleteAppliance(
  db: Db,
  actor: Actor,
  vehicleId: string,
  applianceId: string,
  version: number,
): Promise<void> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  await db.transaction(async (tx) => {
    const before = await loadOne(tx, vehicleId, applianceId)
    if (!before) throw notFound('That appliance')
    const gone = await tx
      .delete(appliances)
      .where(and(eq(appliances.id, before.id), eq(appliances.version, version)))
      .returning({ id: appliances.id })
    if (gone.length === 0)
      throw staleVersion('appliance', await presentOne(tx, await loadOne(tx, vehicleId, applianceId)))
    await recordHistory(tx, {
      vehicleId,
      entity: 'appliance',
      entityId: before.id,
      action: 'delete',
      summary: `Removed appliance ${quoted(before.params.name)}`,
      before: before.params,
      actorId: actor.id,
    })
  })
}
