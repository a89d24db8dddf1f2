import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm'
import { encodeBase32LowerCaseNoPadding } from '@oslojs/encoding'
import type { AppContext } from '../../context'
import type { Db } from '../../db/client'
import { reviews, users, vehicleInvitations, vehicleMemberships, vehicles } from '../../db/schema/index'
import { hashToken } from '../../auth/tokens'
import { badRequest, conflict, forbidden, HttpError, notFound } from '../../errors'
import { enqueueMail } from '../../services/mail'
import {
  INVITATION_LIFETIME_DAYS,
  type Crew,
  type CrewRole,
  type Invitation,
  type InvitationAccepted,
  type InvitationCreate,
  type InvitationPreview,
  type InvitationStatus,
  type InviteRole,
} from '../../../shared/schemas/crew'
import { OPEN_REVIEW_STATES, type ReviewState } from '../../../shared/schemas/reviews'
import type { Tx } from './access'
import { isId } from '../vehicles/access'
import { recordCrewHistory } from './history'
import { invitationMail, joinedMail, ownershipMail, removedMail, roleChangedMail } from './mails'

type InvitationRow = typeof vehicleInvitations.$inferSelect
const asDb = (tx: Tx) => tx as unknown as Db

export const appUrl = (ctx: AppContext) =>
  (ctx.env.APP_URL ?? `http://127.0.0.1:${ctx.env.PORT}`).replace(/\/$/, '')

function invitationStatus(i: InvitationRow, now = new Date()): InvitationStatus {
  if (i.acceptedAt) return 'accepted'
  if (i.revokedAt) return 'revoked'
  if (i.expiresAt <= now) return 'expired'
  return 'pending'
}

function toInvitation(i: InvitationRow, invitedBy: string | null): Invitation {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    status: invitationStatus(i),
    invitedBy,
    expiresAt: i.expiresAt.toISOString(),
    createdAt: i.createdAt.toISOString(),
  }
}

async function vehicleName(db: Db | Tx, vehicleId: string): Promise<string> {
  const [v] = await db.select({ name: vehicles.name }).from(vehicles).where(eq(vehicles.id, vehicleId))
  if (!v) throw notFound('That vehicle')
  return v.name
}

async function userById(db: Db | Tx, id: string) {
  const [u] = await db.select().from(users).where(eq(users.id, id))
  return u ?? null
}

/** The crew page: members, (for the owner) invitations, and advisors reading through an open review. */
export async function getCrew(
  ctx: AppContext,
  vehicleId: string,
  userId: string,
  myRole: CrewRole,
): Promise<Crew> {
  const name = await vehicleName(ctx.db, vehicleId)
  const rows = await ctx.db
    .select({
      userId: vehicleMemberships.userId,
      role: vehicleMemberships.role,
      since: vehicleMemberships.createdAt,
      displayName: users.displayName,
      email: users.email,
    })
    .from(vehicleMemberships)
    .innerJoin(users, eq(users.id, vehicleMemberships.userId))
    .where(eq(vehicleMemberships.vehicleId, vehicleId))
    .orderBy(
      sql`case ${vehicleMemberships.role} when 'owner' then 0 when 'editor' then 1 when 'viewer' then 2 else 3 end`,
      asc(vehicleMemberships.createdAt),
    )
  const isOwner = myRole === 'owner'
  let invitations: Invitation[] = []
  if (isOwner) {
    const inv = await ctx.db
      .select({ i: vehicleInvitations, by: users.displayName })
      .from(vehicleInvitations)
      .leftJoin(users, eq(users.id, vehicleInvitations.invitedBy))
      .where(
        and(
          eq(vehicleInvitations.vehicleId, vehicleId),
          sql`${vehicleInvitations.createdAt} > now() - interval '30 days'`,
        ),
      )
      .orderBy(desc(vehicleInvitations.createdAt))
      .limit(50)
    invitations = inv.map((r) => toInvitation(r.i, r.by))
  }
  const advisors = await ctx.db
    .select({
      userId: reviews.advisorId,
      displayName: users.displayName,
      reviewId: reviews.id,
      state: reviews.state,
    })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.advisorId))
    .where(and(eq(reviews.vehicleId, vehicleId), inArray(reviews.state, OPEN_REVIEW_STATES as ReviewState[])))
  return {
    vehicleId,
    vehicleName: name,
    myRole,
    members: rows.map((m) => ({
      userId: m.userId,
      displayName: m.displayName,
      email: isOwner || m.userId === userId ? m.email : null,
      role: m.role,
      since: m.since.toISOString(),
      isMe: m.userId === userId,
    })),
    invitations,
    reviewingAdvisors: myRole === 'advisor' && !rows.some((r) => r.userId === userId) ? [] : advisors,
  }
}

/** Owner invites by e-mail: stores the token's hash, mails the link, writes history. */
export async function createInvitation(
  ctx: AppContext,
  vehicleId: string,
  ownerId: string,
  input: Required<Pick<InvitationCreate, 'email' | 'role'>>,
  now = new Date(),
): Promise<Invitation> {
  const email = input.email.toLowerCase()
  const role = input.role as InviteRole
  const owner = await userById(ctx.db, ownerId)
  return ctx.db.transaction(async (tx) => {
    const name = await vehicleName(tx, vehicleId)
    const [already] = await tx
      .select({ role: vehicleMemberships.role })
      .from(vehicleMemberships)
      .innerJoin(users, eq(users.id, vehicleMemberships.userId))
      .where(and(eq(vehicleMemberships.vehicleId, vehicleId), sql`lower(${users.email}) = ${email}`))
    if (already) {
      throw new HttpError(
        409,
        'already_member',
        `${email} is already on the crew (${already.role}). Change their role instead.`,
      )
    }
    // A new invitation to the same address replaces the pending one, so only the newest link works.
    await tx
      .update(vehicleInvitations)
      .set({ revokedAt: now })
      .where(
        and(
          eq(vehicleInvitations.vehicleId, vehicleId),
          eq(vehicleInvitations.email, email),
          isNull(vehicleInvitations.acceptedAt),
          isNull(vehicleInvitations.revokedAt),
        ),
      )
    const token = encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(25)))
    const [row] = await tx
      .insert(vehicleInvitations)
      .values({
        vehicleId,
        email,
        role,
        tokenHash: hashToken(token),
        invitedBy: ownerId,
        expiresAt: new Date(now.getTime() + INVITATION_LIFETIME_DAYS * 86_400_000),
      })
      .returning()
    await recordCrewHistory(tx, {
      vehicleId,
      actorId: ownerId,
      action: 'create',
      entityId: row!.id,
      summary: `Invited ${email} as ${role}`,
      after: { email, role },
    })
    const inviter = owner?.displayName ?? 'A member'
    await enqueueMail(
      asDb(tx),
      invitationMail(
        email,
        inviter,
        name,
        role,
        `${appUrl(ctx)}/invitations/${token}`,
        INVITATION_LIFETIME_DAYS,
      ),
    )
    return toInvitation(row!, inviter)
  })
}

export async function revokeInvitation(
  ctx: AppContext,
  vehicleId: string,
  ownerId: string,
  invitationId: string,
): Promise<void> {
  // Not an id at all: the same 404 as an unknown one (PostgreSQL would refuse the uuid cast with a 500).
  if (!isId(invitationId)) throw notFound('That pending invitation')
  await ctx.db.transaction(async (tx) => {
    const [row] = await tx
      .update(vehicleInvitations)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(vehicleInvitations.id, invitationId),
          eq(vehicleInvitations.vehicleId, vehicleId),
          isNull(vehicleInvitations.acceptedAt),
          isNull(vehicleInvitations.revokedAt),
        ),
      )
      .returning()
    if (!row) throw notFound('That pending invitation')
    await recordCrewHistory(tx, {
      vehicleId,
      actorId: ownerId,
      action: 'delete',
      entityId: row.id,
      summary: `Withdrew the invitation to ${row.email}`,
    })
  })
}

async function findInvitation(db: Db | Tx, token: string, lock = false) {
  const q = db
    .select()
    .from(vehicleInvitations)
    .where(eq(vehicleInvitations.tokenHash, hashToken(token)))
  const [row] = lock ? await q.for('update') : await q
  return row ?? null
}

const invalidInvitation = () => notFound('That invitation')

/** What the link offers; needs no sign-in (the page shows it before asking to sign in or sign up). */
export async function previewInvitation(ctx: AppContext, token: string): Promise<InvitationPreview> {
  const row = await findInvitation(ctx.db, token)
  if (!row) throw invalidInvitation()
  const [v] = await ctx.db
    .select({ name: vehicles.name })
    .from(vehicles)
    .where(eq(vehicles.id, row.vehicleId))
  const by = row.invitedBy ? await userById(ctx.db, row.invitedBy) : null
  return {
    vehicleName: v?.name ?? '',
    role: row.role,
    invitedBy: by?.displayName ?? null,
    email: row.email,
    status: invitationStatus(row),
    expiresAt: row.expiresAt.toISOString(),
  }
}

function maskEmail(email: string): string {
  const [local, domain] = email.split('@')
  return `${local!.slice(0, 1)}…@${domain}`
}

/**
 * The signed-in user takes the invitation: only once, only before it expires, only the account whose
 * e-mail it was sent to. A wrong account leaves the invitation untouched.
 */
export async function acceptInvitation(
  ctx: AppContext,
  token: string,
  userId: string,
): Promise<InvitationAccepted> {
  return ctx.db.transaction(async (tx) => {
    const row = await findInvitation(tx, token, true)
    if (!row) throw invalidInvitation()
    const status = invitationStatus(row)
    if (status === 'accepted')
      throw new HttpError(
        410,
        'invitation_used',
        'This invitation was already used. Ask the owner for a new one.',
      )
    if (status === 'revoked')
      throw new HttpError(
        410,
        'invitation_revoked',
        'This invitation was withdrawn. Ask the owner for a new one.',
      )
    if (status === 'expired')
      throw new HttpError(
        410,
        'invitation_expired',
        'This invitation has expired. Ask the owner for a new one.',
      )
    const me = await userById(tx, userId)
    if (!me) throw notFound('Your account')
    if (me.email.toLowerCase() !== row.email) {
      throw new HttpError(
        403,
        'wrong_account',
        `This invitation was sent to ${maskEmail(row.email)}. Sign in with that address to accept it (you are signed in as ${me.email}).`,
      )
    }
    const current = await tx
      .select()
      .from(vehicleMemberships)
      .where(and(eq(vehicleMemberships.vehicleId, row.vehicleId), eq(vehicleMemberships.userId, userId)))
    const name = await vehicleName(tx, row.vehicleId)
    let role: CrewRole = row.role
    if (current[0]) {
      // Already on the crew: an owner stays owner; anyone else gets the invited role.
      if (current[0].role === 'owner') role = 'owner'
      else if (current[0].role !== row.role) {
        await tx
          .update(vehicleMemberships)
          .set({
            role: row.role,
            version: sql`${vehicleMemberships.version} + 1`,
            updatedAt: new Date(),
            updatedBy: userId,
          })
          .where(eq(vehicleMemberships.id, current[0].id))
        await recordCrewHistory(tx, {
          vehicleId: row.vehicleId,
          actorId: userId,
          action: 'update',
          entityId: userId,
          summary: `${me.displayName} is now ${row.role} (accepted an invitation)`,
          changedFields: ['role'],
          before: { role: current[0].role },
          after: { role: row.role },
        })
      }
    } else {
      await tx
        .insert(vehicleMemberships)
        .values({ vehicleId: row.vehicleId, userId, role: row.role, updatedBy: userId })
      await recordCrewHistory(tx, {
        vehicleId: row.vehicleId,
        actorId: userId,
        action: 'create',
        entityId: userId,
        summary: `${me.displayName} joined as ${row.role}`,
        after: { role: row.role },
      })
    }
    await tx
      .update(vehicleInvitations)
      .set({ acceptedAt: new Date(), acceptedBy: userId })
      .where(eq(vehicleInvitations.id, row.id))
    if (row.invitedBy) {
      const inviter = await userById(tx, row.invitedBy)
      if (inviter)
        await enqueueMail(
          asDb(tx),
          joinedMail(inviter.email, inviter.displayName, me.displayName, name, role),
        )
    }
    return { vehicleId: row.vehicleId, role }
  })
}

async function membershipOf(tx: Tx, vehicleId: string, userId: string) {
  const [m] = await tx
    .select()
    .from(vehicleMemberships)
    .where(and(eq(vehicleMemberships.vehicleId, vehicleId), eq(vehicleMemberships.userId, userId)))
    .for('update')
  return m ?? null
}

export async function changeRole(
  ctx: AppContext,
  vehicleId: string,
  ownerId: string,
  targetId: string,
  role: InviteRole,
): Promise<void> {
  await ctx.db.transaction(async (tx) => {
    const m = await membershipOf(tx, vehicleId, targetId)
    if (!m) throw notFound('That crew member')
    if (m.role === 'owner')
      throw badRequest('The owner’s role changes only by handing the vehicle over to someone else.')
    if (m.role === role) return
    await tx
      .update(vehicleMemberships)
      .set({
        role,
        version: sql`${vehicleMemberships.version} + 1`,
        updatedAt: new Date(),
        updatedBy: ownerId,
      })
      .where(eq(vehicleMemberships.id, m.id))
    const target = await userById(tx, targetId)
    const owner = await userById(tx, ownerId)
    await recordCrewHistory(tx, {
      vehicleId,
      actorId: ownerId,
      action: 'update',
      entityId: targetId,
      summary: `Changed ${target?.displayName ?? 'a member'}’s role from ${m.role} to ${role}`,
      changedFields: ['role'],
      before: { role: m.role },
      after: { role },
    })
    if (target) {
      await enqueueMail(
        asDb(tx),
        roleChangedMail(
          target.email,
          target.displayName,
          await vehicleName(tx, vehicleId),
          role,
          owner?.displayName ?? 'The owner',
        ),
      )
    }
  })
}

export async function removeMember(
  ctx: AppContext,
  vehicleId: string,
  ownerId: string,
  targetId: string,
): Promise<void> {
  if (targetId === ownerId)
    throw badRequest('You own this vehicle: hand it over to someone else before leaving.')
  await ctx.db.transaction(async (tx) => {
    const m = await membershipOf(tx, vehicleId, targetId)
    if (!m) throw notFound('That crew member')
    if (m.role === 'owner') throw forbidden('The owner cannot be removed.')
    await tx.delete(vehicleMemberships).where(eq(vehicleMemberships.id, m.id))
    const target = await userById(tx, targetId)
    const owner = await userById(tx, ownerId)
    await recordCrewHistory(tx, {
      vehicleId,
      actorId: ownerId,
      action: 'delete',
      entityId: targetId,
      summary: `Removed ${target?.displayName ?? 'a member'} (${m.role}) from the crew`,
      before: { role: m.role },
    })
    if (target) {
      await enqueueMail(
        asDb(tx),
        removedMail(
          target.email,
          target.displayName,
          await vehicleName(tx, vehicleId),
          owner?.displayName ?? 'The owner',
        ),
      )
    }
  })
}

export async function leave(ctx: AppContext, vehicleId: string, userId: string): Promise<void> {
  await ctx.db.transaction(async (tx) => {
    const m = await membershipOf(tx, vehicleId, userId)
    if (!m) throw notFound('That vehicle')
    if (m.role === 'owner') {
      throw new HttpError(
        400,
        'owner_cannot_leave',
        'You own this vehicle: hand it over to another crew member first, or delete it.',
      )
    }
    await tx.delete(vehicleMemberships).where(eq(vehicleMemberships.id, m.id))
    const me = await userById(tx, userId)
    await recordCrewHistory(tx, {
      vehicleId,
      actorId: userId,
      action: 'delete',
      entityId: userId,
      summary: `${me?.displayName ?? 'A member'} left the crew (was ${m.role})`,
      before: { role: m.role },
    })
  })
}

/** Hand the vehicle to another member: they become owner, the old owner stays as editor. */
export async function transferOwnership(
  ctx: AppContext,
  vehicleId: string,
  ownerId: string,
  targetId: string,
): Promise<void> {
  if (targetId === ownerId)
    throw badRequest('You already own this vehicle.', { userId: ['must be another crew member'] })
  await ctx.db.transaction(async (tx) => {
    const mine = await membershipOf(tx, vehicleId, ownerId)
    if (mine?.role !== 'owner') throw conflict('You are no longer the owner of this vehicle.')
    const theirs = await membershipOf(tx, vehicleId, targetId)
    if (!theirs)
      throw badRequest('Only a crew member can become the owner.', { userId: ['must be a crew member'] })
    const now = new Date()
    await tx
      .update(vehicleMemberships)
      .set({
        role: 'owner',
        version: sql`${vehicleMemberships.version} + 1`,
        updatedAt: now,
        updatedBy: ownerId,
      })
      .where(eq(vehicleMemberships.id, theirs.id))
    await tx
      .update(vehicleMemberships)
      .set({
        role: 'editor',
        version: sql`${vehicleMemberships.version} + 1`,
        updatedAt: now,
        updatedBy: ownerId,
      })
      .where(eq(vehicleMemberships.id, mine.id))
    const target = await userById(tx, targetId)
    const owner = await userById(tx, ownerId)
    await recordCrewHistory(tx, {
      vehicleId,
      actorId: ownerId,
      action: 'update',
      entityId: targetId,
      summary: `${owner?.displayName ?? 'The owner'} handed the vehicle over to ${target?.displayName ?? 'a member'} (now owner; ${owner?.displayName ?? 'the old owner'} is an editor)`,
      changedFields: ['role'],
      before: { owner: ownerId, role: theirs.role },
      after: { owner: targetId },
    })
    if (target) {
      await enqueueMail(
        asDb(tx),
        ownershipMail(
          target.email,
          target.displayName,
          await vehicleName(tx, vehicleId),
          owner?.displayName ?? 'The owner',
        ),
      )
    }
  })
}
