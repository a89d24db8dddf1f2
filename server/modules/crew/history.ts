import { vehicleHistory } from '../../db/schema/index'
import type { DbOrTx } from './access'

/**
 * One line in the vehicle's history (the table of the vehicles issue), written in the caller's transaction.
 * Crew changes use entity 'membership': create = joined, update = role or ownership changed, delete = left
 * or removed; invitations are written as membership lines too, with the invitation's id.
 */
export async function recordCrewHistory(
  db: DbOrTx,
  row: {
    vehicleId: string
    actorId: string | null
    action: 'create' | 'update' | 'delete'
    entityId: string
    summary: string
    changedFields?: string[]
    before?: unknown
    after?: unknown
  },
): Promise<void> {
  await db.insert(vehicleHistory).values({
    vehicleId: row.vehicleId,
    entity: 'membership',
    entityId: row.entityId,
    action: row.action,
    summary: row.summary,
    changedFields: row.changedFields ?? [],
    version: null,
    before: row.before ?? null,
    after: row.after ?? null,
    actorId: row.actorId,
  })
}
