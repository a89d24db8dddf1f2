/** The one-per-vehicle equipment: battery bank and inverter. Version 0 means "never saved". */
import { and, eq, sql } from 'drizzle-orm'
import type { BatteryBank, Inverter } from '../../../shared/schemas/plan'
import type { BatteryPut, BatteryRecord, InverterPut, InverterRecord } from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import { batteryBanks, inverters } from '../../db/schema/index'
import { requireVehicleRole } from './access'
import {
  changedKeys,
  iso,
  recordHistory,
  refOf,
  staleVersion,
  userRefs,
  type Actor,
  type DbOrTx,
} from './records'

// ---------------------------------------------------------------------------------------------
// Battery bank
// ---------------------------------------------------------------------------------------------

async function loadBattery(db: DbOrTx, vehicleId: string): Promise<BatteryRecord> {
  const [row] = await db.select().from(batteryBanks).where(eq(batteryBanks.vehicleId, vehicleId)).limit(1)
  if (!row) return { vehicleId, battery: null, version: 0, updatedAt: null, updatedBy: null }
  const refs = await userRefs(db, [row.updatedBy])
  return {
    vehicleId,
    battery: row.params,
    version: row.version,
    updatedAt: iso(row.updatedAt),
    updatedBy: refOf(refs, row.updatedBy),
  }
}

export async function getBattery(db: Db, actor: Actor, vehicleId: string): Promise<BatteryRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  return loadBattery(db, vehicleId)
}

export async function putBattery(
  db: Db,
  actor: Actor,
  vehicleId: string,
  input: BatteryPut,
): Promise<BatteryRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  return db.transaction(async (tx) => {
    const before = await loadBattery(tx, vehicleId)
    const params: BatteryBank = input.battery
    const saved =
      input.version === 0
        ? await tx
            .insert(batteryBanks)
            .values({ vehicleId, params, updatedBy: actor.id })
            .onConflictDoNothing()
            .returning({ version: batteryBanks.version })
        : await tx
            .update(batteryBanks)
            .set({
              params,
              version: sql`${batteryBanks.version} + 1`,
              updatedAt: sql`now()`,
              updatedBy: actor.id,
            })
            .where(and(eq(batteryBanks.vehicleId, vehicleId), eq(batteryBanks.version, input.version)))
            .returning({ version: batteryBanks.version })
    if (saved.length === 0) throw staleVersion('battery bank', await loadBattery(tx, vehicleId))
    await recordHistory(tx, {
      vehicleId,
      entity: 'battery',
      entityId: vehicleId,
      action: input.version === 0 ? 'create' : 'update',
      summary: input.version === 0 ? 'Added the battery bank' : 'Changed the battery bank',
      changedFields: input.version === 0 ? [] : changedKeys(before.battery, params),
      version: saved[0]!.version,
      before: before.battery,
      after: params,
      actorId: actor.id,
    })
    return loadBattery(tx, vehicleId)
  })
}

// ---------------------------------------------------------------------------------------------
// Inverter
// ---------------------------------------------------------------------------------------------

async function loadInverter(db: DbOrTx, vehicleId: string): Promise<InverterRecord> {
  const [row] = await db.select().from(inverters).where(eq(inverters.vehicleId, vehicleId)).limit(1)
  if (!row) return { vehicleId, inverter: null, version: 0, updatedAt: null, updatedBy: null }
  const refs = await userRefs(db, [row.updatedBy])
  return {
    vehicleId,
    inverter: row.params ?? null,
    version: row.version,
    updatedAt: iso(row.updatedAt),
    updatedBy: refOf(refs, row.updatedBy),
  }
}

export async function getInverter(db: Db, actor: Actor, vehicleId: string): Promise<InverterRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  return loadInverter(db, vehicleId)
}

export async function putInverter(
  db: Db,
  actor: Actor,
  vehicleId: string,
  input: InverterPut,
): Promise<InverterRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  return db.transaction(async (tx) => {
    const before = await loadInverter(tx, vehicleId)
    const params: Inverter | null = input.inverter
    const saved =
      input.version === 0
        ? await tx
            .insert(inverters)
            .values({ vehicleId, params, updatedBy: actor.id })
            .onConflictDoNothing()
            .returning({ version: inverters.version })
        : await tx
            .update(inverters)
            .set({
              params,
              version: sql`${inverters.version} + 1`,
              updatedAt: sql`now()`,
              updatedBy: actor.id,
            })
            .where(and(eq(inverters.vehicleId, vehicleId), eq(inverters.version, input.version)))
            .returning({ version: inverters.version })
    if (saved.length === 0) throw staleVersion('inverter', await loadInverter(tx, vehicleId))
    const summary =
      params === null
        ? 'Removed the inverter'
        : before.inverter
          ? 'Changed the inverter'
          : 'Added the inverter'
    await recordHistory(tx, {
      vehicleId,
      entity: 'inverter',
      entityId: vehicleId,
      action: before.inverter && params ? 'update' : params ? 'create' : 'delete',
      summary,
      changedFields: before.inverter && params ? changedKeys(before.inverter, params) : [],
      version: saved[0]!.version,
      before: before.inverter,
      after: params,
      actorId: actor.id,
    })
    return loadInverter(tx, vehicleId)
  })
}
