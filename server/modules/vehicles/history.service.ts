/** Who changed what and when on a vehicle, newest first. */
import { desc, eq, sql } from 'drizzle-orm'
import type { HistoryEntry, Page, PageQuery } from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import { users, vehicleHistory } from '../../db/schema/index'
import { requireVehicleRole } from './access'
import { iso, type Actor } from './records'

export async function listHistory(
  db: Db,
  actor: Actor,
  vehicleId: string,
  page: PageQuery,
): Promise<Page<HistoryEntry>> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  const where = eq(vehicleHistory.vehicleId, vehicleId)
  const [total] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(vehicleHistory)
    .where(where)
  const rows = await db
    .select({ h: vehicleHistory, actorName: users.displayName })
    .from(vehicleHistory)
    .leftJoin(users, eq(users.id, vehicleHistory.actorId))
    .where(where)
    .orderBy(desc(vehicleHistory.seq))
    .limit(page.limit)
    .offset(page.offset)
  const items = rows.map(({ h, actorName }) => ({
    id: h.id,
    vehicleId: h.vehicleId,
    entity: h.entity as HistoryEntry['entity'],
    entityId: h.entityId,
    action: h.action as HistoryEntry['action'],
    summary: h.summary,
    changedFields: h.changedFields,
    version: h.version,
    actor: h.actorId && actorName !== null ? { id: h.actorId, displayName: actorName } : null,
    at: iso(h.at),
  }))
  return { items, total: total?.n ?? 0, limit: page.limit, offset: page.offset }
}
