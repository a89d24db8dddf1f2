import { and, eq, inArray } from 'drizzle-orm'
import type { Response } from 'express'
import type { Db } from '../../db/client'
import { reviews, vehicleMemberships } from '../../db/schema/index'
import { forbidden, notFound, unauthorized } from '../../errors'
import { OPEN_REVIEW_STATES, type ReviewState } from '../../../shared/schemas/reviews'
import type { CrewRole } from '../../../shared/schemas/crew'

/** Either the database or a transaction on it. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]
export type DbOrTx = Db | Tx

/** The user's membership role on the vehicle, or null. */
export async function memberRole(db: DbOrTx, userId: string, vehicleId: string): Promise<CrewRole | null> {
  const [m] = await db
    .select({ role: vehicleMemberships.role })
    .from(vehicleMemberships)
    .where(and(eq(vehicleMemberships.vehicleId, vehicleId), eq(vehicleMemberships.userId, userId)))
  return m?.role ?? null
}

/**
 * 'advisor' when the user is the advisor of a review of this vehicle that is open (requested, in progress or
 * answered), else null. The vehicles access helper calls this for users without a membership, so an advisor
 * reads the vehicle and its scenarios while a review is open, and loses access when it closes.
 */
export async function reviewAdvisorRole(
  db: DbOrTx,
  userId: string,
  vehicleId: string,
): Promise<'advisor' | null> {
  const [r] = await db
    .select({ id: reviews.id })
    .from(reviews)
    .where(
      and(
        eq(reviews.vehicleId, vehicleId),
        eq(reviews.advisorId, userId),
        inArray(reviews.state, OPEN_REVIEW_STATES as ReviewState[]),
      ),
    )
    .limit(1)
  return r ? 'advisor' : null
}

/** Membership role, else the advisor role of an open review, else null. */
export async function effectiveRole(db: DbOrTx, userId: string, vehicleId: string): Promise<CrewRole | null> {
  return (await memberRole(db, userId, vehicleId)) ?? (await reviewAdvisorRole(db, userId, vehicleId))
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

/**
 * The vehicle checks of this module: 401 signed out, 404 for non-members (the vehicle's existence is not
 * revealed), 403 when the role is not allowed. Returns the user id and role.
 */
export async function requireVehicleRole(
  db: Db,
  res: Response,
  vehicleId: string,
  roles: readonly CrewRole[],
  what = 'That vehicle',
): Promise<{ userId: string; role: CrewRole }> {
  const user = res.locals.user
  if (!user) throw unauthorized()
  if (!UUID.test(vehicleId)) throw notFound(what)
  const role = await effectiveRole(db, user.id, vehicleId)
  if (!role) throw notFound(what)
  if (!roles.includes(role)) throw forbidden(`Your role on this vehicle (${role}) does not allow this.`)
  return { userId: user.id, role }
}
