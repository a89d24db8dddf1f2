import { and, eq } from 'drizzle-orm'
import type { VehicleRole } from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import { vehicleMemberships } from '../../db/schema/index'
import { forbidden, notFound } from '../../errors'
import type { DbOrTx } from './records'
import { reviewAdvisorRole } from '../crew/access'

/** What an action needs: read (every member), write (owner, editor), owner (owner only). */
export type VehicleNeed = 'read' | 'write' | 'owner'

const UUID_RE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

/** Whether a string can be a record id; anything else is answered like a missing record. */
export const isId = (value: unknown): value is string => typeof value === 'string' && UUID_RE.test(value)

export interface Membership {
  vehicleId: string
  userId: string
  role: VehicleRole
}

/** The user's membership of the vehicle, or null. */
export async function loadMembership(
  db: DbOrTx,
  userId: string,
  vehicleId: string,
): Promise<Membership | null> {
  if (!isId(vehicleId)) return null
  const [row] = await db
    .select({
      vehicleId: vehicleMemberships.vehicleId,
      userId: vehicleMemberships.userId,
      role: vehicleMemberships.role,
    })
    .from(vehicleMemberships)
    .where(and(eq(vehicleMemberships.vehicleId, vehicleId), eq(vehicleMemberships.userId, userId)))
    .limit(1)
  if (row) return row
  // An advisor with an open review on this vehicle reads it (read-only) until the review is closed.
  return (await reviewAdvisorRole(db, userId, vehicleId)) ? { vehicleId, userId, role: 'advisor' } : null
}

export function roleAllows(role: VehicleRole, need: VehicleNeed): boolean {
  if (need === 'read') return true
  if (need === 'write') return role === 'owner' || role === 'editor'
  return role === 'owner'
}

/**
 * The user's role on the vehicle, if it allows `need`.
 * Non-members get 404 (the vehicle's existence does not leak); members without the right get 403.
 */
export async function requireVehicleRole(
  db: Db | DbOrTx,
  userId: string,
  vehicleId: string,
  need: VehicleNeed,
): Promise<VehicleRole> {
  const membership = await loadMembership(db, userId, vehicleId)
  if (!membership) throw notFound('That vehicle')
  if (!roleAllows(membership.role, need)) {
    throw forbidden(
      need === 'owner'
        ? 'Only the owner of this vehicle can do this.'
        : `As ${membership.role === 'advisor' ? 'an advisor' : 'a viewer'} you can read this vehicle but not change it.`,
    )
  }
  return membership.role
}
