/**
 * Small pieces every vehicle/scenario service uses: the transaction type, who-changed lookups,
 * the stale-version answer and history rows.
 */
import { inArray } from 'drizzle-orm'
import type { HistoryAction, HistoryEntity, UserRef } from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import { users, vehicleHistory } from '../../db/schema/index'
import { conflict } from '../../errors'

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]
export type DbOrTx = Db | Tx

/** The signed-in person making a change. */
export interface Actor {
  id: string
  displayName: string
}

export const iso = (d: Date): string => d.toISOString()

/** Display names for the given user ids (missing ids are simply absent). */
export async function userRefs(db: DbOrTx, ids: readonly (string | null)[]): Promise<Map<string, UserRef>> {
  const wanted = [...new Set(ids.filter((id): id is string => !!id))]
  if (wanted.length === 0) return new Map()
  const rows = await db
    .select({ id: users.id, displayName: users.displayName })
    .from(users)
    .where(inArray(users.id, wanted))
  return new Map(rows.map((r) => [r.id, r]))
}

export const refOf = (refs: Map<string, UserRef>, id: string | null): UserRef | null =>
  (id && refs.get(id)) || null

/** 409 with the record as it is now (null when it was deleted meanwhile). */
export function staleVersion(what: string, current: unknown) {
  return conflict(
    current === null
      ? `This ${what} was deleted by someone else meanwhile.`
      : `This ${what} was changed by someone else meanwhile. Nothing was saved; here is the current version.`,
    { current },
  )
}

/** Top-level keys whose values differ (by JSON value). */
export function changedKeys(before: object | null, after: object | null): string[] {
  const a = (before ?? {}) as Record<string, unknown>
  const b = (after ?? {}) as Record<string, unknown>
  const keys = new Set([...Object.keys(a), ...Object.keys(b)])
  return [...keys].filter((k) => JSON.stringify(a[k]) !== JSON.stringify(b[k])).sort()
}

export interface HistoryInput {
  vehicleId: string
  entity: HistoryEntity
  entityId: string | null
  action: HistoryAction
  summary: string
  changedFields?: string[]
  version?: number | null
  before?: unknown
  after?: unknown
  actorId: string
}

/** One history row; call inside the transaction that makes the change. */
export async function recordHistory(tx: DbOrTx, h: HistoryInput): Promise<void> {
  await tx.insert(vehicleHistory).values({
    vehicleId: h.vehicleId,
    entity: h.entity,
    entityId: h.entityId,
    action: h.action,
    summary: h.summary,
    changedFields: h.changedFields ?? [],
    version: h.version ?? null,
    before: h.before ?? null,
    after: h.after ?? null,
    actorId: h.actorId,
  })
}

/** “Fridge” in history summaries. */
export const quoted = (name: string) => `“${name}”`
