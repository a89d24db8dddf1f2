import { and, asc, eq, sql } from 'drizzle-orm'
import { Decimal } from 'decimal.js'
import type { AppContext } from '../../context'
import { advisorProfiles, users } from '../../db/schema/index'
import { conflict, forbidden, notFound } from '../../errors'
import type { AdvisorProfile, AdvisorProfilePut } from '../../../shared/schemas/reviews'

type Row = typeof advisorProfiles.$inferSelect

/** Fee as stored text with exactly two decimals ("45.00"). */
export const normalizeFee = (amount: string) => new Decimal(amount).toFixed(2)

function toProfile(p: Row, displayName: string): AdvisorProfile {
  return {
    userId: p.userId,
    displayName,
    headline: p.headline,
    bio: p.bio,
    specialities: p.specialities,
    feeAmount: normalizeFee(p.feeAmount),
    currency: p.currency,
    accepting: p.accepting,
    version: p.version,
    updatedAt: p.updatedAt.toISOString(),
  }
}

/** The directory: advisor accounts with a profile that takes requests, by name. */
export async function listAdvisors(ctx: AppContext, q?: string): Promise<AdvisorProfile[]> {
  const rows = await ctx.db
    .select({ p: advisorProfiles, name: users.displayName })
    .from(advisorProfiles)
    .innerJoin(users, eq(users.id, advisorProfiles.userId))
    .where(
      and(
        eq(advisorProfiles.accepting, true),
        eq(users.role, 'advisor'),
        q
          ? sql`(${users.displayName} ilike ${'%' + q + '%'} or ${advisorProfiles.bio} ilike ${'%' + q + '%'} or ${advisorProfiles.specialities}::text ilike ${'%' + q + '%'})`
          : undefined,
      ),
    )
    .orderBy(asc(users.displayName))
    .limit(100)
  return rows.map((r) => toProfile(r.p, r.name))
}

export async function getAdvisor(ctx: AppContext, userId: string): Promise<AdvisorProfile> {
  const [r] = await ctx.db
    .select({ p: advisorProfiles, name: users.displayName, role: users.role })
    .from(advisorProfiles)
    .innerJoin(users, eq(users.id, advisorProfiles.userId))
    .where(eq(advisorProfiles.userId, userId))
  if (!r || r.role !== 'advisor') throw notFound('That advisor')
  return toProfile(r.p, r.name)
}

/** My own profile; null until I save one. */
export async function getMyProfile(ctx: AppContext, userId: string): Promise<AdvisorProfile | null> {
  const [r] = await ctx.db
    .select({ p: advisorProfiles, name: users.displayName })
    .from(advisorProfiles)
    .innerJoin(users, eq(users.id, advisorProfiles.userId))
    .where(eq(advisorProfiles.userId, userId))
  return r ? toProfile(r.p, r.name) : null
}

/** Create (version 0) or update (the version last seen; a stale one answers 409 with the current profile). */
export async function putMyProfile(
  ctx: AppContext,
  user: { id: string; role: string; displayName: string },
  input: Omit<AdvisorProfilePut, 'feeAmount'> & { feeAmount: string },
): Promise<AdvisorProfile> {
  if (user.role !== 'advisor') {
    throw forbidden(
      'Only advisor accounts have a profile in the directory. Ask us to turn your account into an advisor account.',
    )
  }
  const values = {
    headline: input.headline,
    bio: input.bio,
    specialities: [...new Set(input.specialities)],
    feeAmount: normalizeFee(input.feeAmount),
    currency: input.currency,
    accepting: input.accepting,
  }
  const current = await getMyProfile(ctx, user.id)
  if (input.version === 0) {
    if (current) throw conflict('You already have a profile; reload it and try again.', { current })
    const [row] = await ctx.db
      .insert(advisorProfiles)
      .values({ userId: user.id, ...values })
      .returning()
    return toProfile(row!, user.displayName)
  }
  const [row] = await ctx.db
    .update(advisorProfiles)
    .set({ ...values, version: sql`${advisorProfiles.version} + 1`, updatedAt: new Date() })
    .where(and(eq(advisorProfiles.userId, user.id), eq(advisorProfiles.version, input.version)))
    .returning()
  if (!row) {
    throw conflict('Your profile was changed elsewhere since you opened it. Nothing was saved.', { current })
  }
  return toProfile(row, user.displayName)
}
