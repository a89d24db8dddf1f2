/** Charge sources of a vehicle: solar arrays, DC-DC, shore and generator chargers. */
import { and, asc, eq, sql } from 'drizzle-orm'
import { PLAN_LIMITS } from '../../../shared/schemas/plan'
import {
  ChargeSourceCreateSchema,
  type ChargeSourceCreate,
  type ChargeSourcePatch,
  type ChargeSourceRecord,
} from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import { chargeSources } from '../../db/schema/index'
import { HttpError, notFound, validationFailed } from '../../errors'
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

export type SourceRow = typeof chargeSources.$inferSelect

export async function presentSources(db: DbOrTx, rows: SourceRow[]): Promise<ChargeSourceRecord[]> {
  const refs = await userRefs(
    db,
    rows.map((r) => r.updatedBy),
  )
  return rows.map(
    (r) =>
      ({
        ...r.params,
        id: r.id,
        vehicleId: r.vehicleId,
        version: r.version,
        updatedAt: iso(r.updatedAt),
        updatedBy: refOf(refs, r.updatedBy),
      }) as ChargeSourceRecord,
  )
}

export async function loadSourceRows(db: DbOrTx, vehicleId: string): Promise<SourceRow[]> {
  return db
    .select()
    .from(chargeSources)
    .where(eq(chargeSources.vehicleId, vehicleId))
    .orderBy(asc(chargeSources.seq))
}

async function loadOne(db: DbOrTx, vehicleId: string, sourceId: string): Promise<SourceRow | null> {
  if (!isId(sourceId)) return null
  const [row] = await db
    .select()
    .from(chargeSources)
    .where(and(eq(chargeSources.id, sourceId), eq(chargeSources.vehicleId, vehicleId)))
    .limit(1)
  return row ?? null
}

const presentOne = async (db: DbOrTx, row: SourceRow | null) =>
  row ? (await presentSources(db, [row]))[0]! : null

export async function listSources(db: Db, actor: Actor, vehicleId: string): Promise<ChargeSourceRecord[]> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  return presentSources(db, await loadSourceRows(db, vehicleId))
}

export async function createSource(
  db: Db,
  actor: Actor,
  vehicleId: string,
  input: ChargeSourceCreate,
): Promise<ChargeSourceRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  return db.transaction(async (tx) => {
    const [count] = await tx
      .select({ n: sql<number>`count(*)::int` })
      .from(chargeSources)
      .where(eq(chargeSources.vehicleId, vehicleId))
    if ((count?.n ?? 0) >= PLAN_LIMITS.sourcesMax) {
      throw new HttpError(
        409,
        'limit_reached',
        `A vehicle holds at most ${PLAN_LIMITS.sourcesMax} charge sources.`,
      )
    }
    const [row] = await tx
      .insert(chargeSources)
      .values({ vehicleId, kind: input.kind, params: input, updatedBy: actor.id })
      .returning()
    await recordHistory(tx, {
      vehicleId,
      entity: 'source',
      entityId: row!.id,
      action: 'create',
      summary: `Added charge source ${quoted(input.name)}`,
      version: row!.version,
      after: input,
      actorId: actor.id,
    })
    return (await presentOne(tx, row!))!
  })
}

export async function patchSource(
  db: Db,
  actor: Actor,
  vehicleId: string,
  sourceId: string,
  patch: ChargeSourcePatch,
): Promise<ChargeSourceRecord> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const { version, kind, ...fields } = patch
  return db.transaction(async (tx) => {
    const before = await loadOne(tx, vehicleId, sourceId)
    if (!before) throw notFound('That charge source')
    if (before.version !== version) throw staleVersion('charge source', await presentOne(tx, before))
    if (kind !== undefined && kind !== before.kind) {
      throw validationFailed({ kind: ['cannot change: remove this source and add one of the other kind'] })
    }
    // The merged source is checked with its kind's schema: unknown or wrong fields are named.
    const params = parse(ChargeSourceCreateSchema, { ...before.params, ...fields, kind: before.kind })
    const [after] = await tx
      .update(chargeSources)
      .set({ params, version: sql`${chargeSources.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id })
      .where(and(eq(chargeSources.id, before.id), eq(chargeSources.version, version)))
      .returning()
    if (!after)
      throw staleVersion('charge source', await presentOne(tx, await loadOne(tx, vehicleId, sourceId)))
    const changed = changedKeys(before.params, params)
    await recordHistory(tx, {
      vehicleId,
      entity: 'source',
      entityId: after.id,
      action: 'update',
      summary: `Changed charge source ${quoted(params.name)}${changed.length ? `: ${changed.join(', ')}` : ''}`,
      changedFields: changed,
      version: after.version,
      before: before.params,
      after: params,
      actorId: actor.id,
    })
    return (await presentOne(tx, after))!
  })
}

export async function deleteSource(
  db: Db,
  actor: Actor,
  vehicleId: string,
  sourceId: string,
  version: number,
): Promise<void> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  await db.transaction(async (tx) => {
    const before = await loadOne(tx, vehicleId, sourceId)
    if (!before) throw notFound('That charge source')
    const gone = await tx
      .delete(chargeSources)
      .where(and(eq(chargeSources.id, before.id), eq(chargeSources.version, version)))
      .returning({ id: chargeSources.id })
    if (gone.length === 0) {
      throw staleVersion('charge source', await presentOne(tx, await loadOne(tx, vehicleId, sourceId)))
    }
    await recordHistory(tx, {
      vehicleId,
      entity: 'source',
      entityId: before.id,
      action: 'delete',
      summary: `Removed charge source ${quoted(before.params.name)}`,
      before: before.params,
      actorId: actor.id,
    })
  })
}
