import { and, asc, count, eq, ilike, or, sql } from 'drizzle-orm'
import { generateIdFromEntropySize } from 'lucia'
import type { AppContext } from '../../context'
import { users } from '../../db/schema/index'
import { dummyPasswordHash, hashPassword, verifyPassword } from '../../auth/password'
import { consumeToken, issueToken } from '../../auth/tokens'
import { badRequest, conflict, HttpError, notFound, validationFailed } from '../../errors'
import {
  addressTakenMail,
  alreadyRegisteredMail,
  changeEmailMail,
  emailChangeNoticeMail,
  enqueueMail,
  passwordChangedMail,
  resetPasswordMail,
  verifyEmailMail,
} from '../../services/mail'
import type { AdminUserPage, PublicUser } from '../../../shared/schemas/account'

type UserRow = typeof users.$inferSelect

/** Presenter: the columns of a user that the API shows. */
export function toPublicUser(u: UserRow): PublicUser {
  return {
    id: u.id,
    email: u.email,
    displayName: u.displayName,
    role: u.role,
    emailVerified: u.emailVerifiedAt !== null,
    unitSystem: u.unitSystem,
    temperatureUnit: u.temperatureUnit,
    currency: u.currency,
    version: u.version,
  }
}

/** The one answer for a wrong e-mail or a wrong password, so neither tells which it was. */
export const badCredentials = () =>
  new HttpError(400, 'bad_credentials', 'That e-mail and password do not match an account.')
export const invalidLink = () =>
  new HttpError(400, 'invalid_token', 'This link has expired or was already used. Ask for a new one.')

export async function findUserByEmail(ctx: AppContext, email: string): Promise<UserRow | null> {
  const [u] = await ctx.db
    .select()
    .from(users)
    .where(sql`lower(${users.email}) = ${email.toLowerCase()}`)
  return u ?? null
}

export async function getUser(ctx: AppContext, id: string): Promise<UserRow> {
  const [u] = await ctx.db.select().from(users).where(eq(users.id, id))
  if (!u) throw notFound('That account')
  return u
}

const isUniqueViolation = (err: unknown) =>
  (err as { code?: string })?.code === '23505' ||
  (err as { cause?: { code?: string } })?.cause?.code === '23505'

/**
 * Sign-up. The answer is the same whether or not the address has an account:
 * - new address: create the account (unverified) and mail a verification link;
 * - an unverified account: take over its password and name (the mailbox owner proves the address when
 *   opening the link, so an account someone else started with this address cannot be kept by them);
 * - a verified account: mail its owner that the address is already registered.
 * The password is hashed in every case so the timing is similar.
 */
export async function signUp(
  ctx: AppContext,
  input: { email: string; displayName: string; password: string },
  baseUrl: string,
): Promise<void> {
  const passwordHash = await hashPassword(input.password)
  const existing = await findUserByEmail(ctx, input.email)
  if (existing?.emailVerifiedAt) {
    await enqueueMail(
      ctx.db,
      alreadyRegisteredMail(
        existing.email,
        existing.displayName,
        `${baseUrl}/sign-in`,
        `${baseUrl}/forgot-password`,
      ),
    )
    return
  }
  let userId: string
  if (existing) {
    userId = existing.id
    await ctx.db
      .update(users)
      .set({
        passwordHash,
        displayName: input.displayName,
        updatedAt: new Date(),
        version: sql`${users.version} + 1`,
      })
      .where(eq(users.id, existing.id))
    await ctx.lucia.invalidateUserSessions(existing.id)
  } else {
    userId = generateIdFromEntropySize(10)
    try {
      await ctx.db
        .insert(users)
        .values({ id: userId, email: input.email, displayName: input.displayName, passwordHash })
    } catch (err) {
      if (isUniqueViolation(err)) return // a sign-up for the same address at the same moment: it mails
      throw err
    }
  }
  const token = await issueToken(ctx.db, userId, 'verify_email', input.email)
  await enqueueMail(
    ctx.db,
    verifyEmailMail(input.email, input.displayName, `${baseUrl}/verify-email?token=${token}`),
  )
}

/**
 * Sign-in: a wrong e-mail and a wrong password give the same error after the same work (an argon2
 * verification against a dummy hash when the address is unknown). An unverified account with the right
 * password gets a fresh verification link and a 403 that says so.
 */
export async function signIn(
  ctx: AppContext,
  input: { email: string; password: string },
  baseUrl: string,
): Promise<UserRow> {
  const user = await findUserByEmail(ctx, input.email)
  const ok = await verifyPassword(user?.passwordHash ?? (await dummyPasswordHash()), input.password)
  if (!user || !ok) throw badCredentials()
  if (!user.emailVerifiedAt) {
    const token = await issueToken(ctx.db, user.id, 'verify_email', user.email)
    await enqueueMail(
      ctx.db,
      verifyEmailMail(user.email, user.displayName, `${baseUrl}/verify-email?token=${token}`),
    )
    throw new HttpError(
      403,
      'email_unverified',
      'Please confirm your e-mail address first. We have just sent you a new link.',
    )
  }
  return user
}

/** Opening the verification link: marks the address verified; the caller then signs the user in. */
export async function verifyEmail(ctx: AppContext, token: string): Promise<UserRow> {
  const t = await consumeToken(ctx.db, token, 'verify_email')
  if (!t) throw invalidLink()
  const user = await getUser(ctx, t.userId)
  if (user.email.toLowerCase() !== t.email.toLowerCase()) throw invalidLink()
  if (!user.emailVerifiedAt) {
    await ctx.db
      .update(users)
      .set({ emailVerifiedAt: new Date(), updatedAt: new Date() })
      .where(eq(users.id, user.id))
  }
  return getUser(ctx, user.id)
}

/** Forgotten password: a reset link when the address has an account, nothing otherwise; same answer. */
export async function requestPasswordReset(ctx: AppContext, email: string, baseUrl: string): Promise<void> {
  const user = await findUserByEmail(ctx, email)
  if (!user) {
    // Similar work to the other branch (a token hash and a write), so timing does not tell.
    await ctx.pool.query('SELECT 1')
    return
  }
  const token = await issueToken(ctx.db, user.id, 'reset_password', user.email)
  await enqueueMail(
    ctx.db,
    resetPasswordMail(user.email, user.displayName, `${baseUrl}/reset-password?token=${token}`),
  )
}

/** A new password from a reset link: single use, one hour; every session of the account ends. */
export async function resetPassword(ctx: AppContext, token: string, password: string): Promise<void> {
  const passwordHash = await hashPassword(password)
  const t = await consumeToken(ctx.db, token, 'reset_password')
  if (!t) throw invalidLink()
  await ctx.db
    .update(users)
    .set({
      passwordHash,
      // The link proved the mailbox, so the address counts as verified.
      emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, now())`,
      updatedAt: new Date(),
      version: sql`${users.version} + 1`,
    })
    .where(eq(users.id, t.userId))
  await ctx.lucia.invalidateUserSessions(t.userId)
}

/** Change password (signed in): needs the current one; every other session ends. */
export async function changePassword(
  ctx: AppContext,
  userId: string,
  input: { currentPassword: string; newPassword: string },
): Promise<void> {
  const user = await getUser(ctx, userId)
  if (!(await verifyPassword(user.passwordHash, input.currentPassword))) {
    throw validationFailed({ currentPassword: ['That is not your current password.'] })
  }
  const passwordHash = await hashPassword(input.newPassword)
  await ctx.db
    .update(users)
    .set({ passwordHash, updatedAt: new Date(), version: sql`${users.version} + 1` })
    .where(eq(users.id, userId))
  await ctx.lucia.invalidateUserSessions(userId)
  await enqueueMail(ctx.db, passwordChangedMail(user.email, user.displayName))
}

/**
 * Change e-mail (signed in, with the current password): the new address gets a confirmation link; the old
 * one a notice. If the new address already has an account, it gets a note instead; the answer is the same.
 */
export async function requestEmailChange(
  ctx: AppContext,
  userId: string,
  input: { newEmail: string; password: string },
  baseUrl: string,
): Promise<void> {
  const user = await getUser(ctx, userId)
  if (!(await verifyPassword(user.passwordHash, input.password))) {
    throw validationFailed({ password: ['That is not your current password.'] })
  }
  if (input.newEmail === user.email.toLowerCase()) {
    throw validationFailed({ newEmail: ['That is already your address.'] })
  }
  const other = await findUserByEmail(ctx, input.newEmail)
  if (other) {
    await enqueueMail(ctx.db, addressTakenMail(input.newEmail))
  } else {
    const token = await issueToken(ctx.db, userId, 'change_email', input.newEmail)
    await enqueueMail(
      ctx.db,
      changeEmailMail(input.newEmail, user.displayName, `${baseUrl}/verify-email?change=1&token=${token}`),
    )
  }
  await enqueueMail(ctx.db, emailChangeNoticeMail(user.email, user.displayName, input.newEmail))
}

/** Opening the e-mail-change link: the account moves to the new, now verified, address. */
export async function confirmEmailChange(ctx: AppContext, token: string): Promise<UserRow> {
  const t = await consumeToken(ctx.db, token, 'change_email')
  if (!t) throw invalidLink()
  try {
    await ctx.db
      .update(users)
      .set({
        email: t.email,
        emailVerifiedAt: new Date(),
        updatedAt: new Date(),
        version: sql`${users.version} + 1`,
      })
      .where(eq(users.id, t.userId))
  } catch (err) {
    if (isUniqueViolation(err))
      throw conflict('That address is now used by another account, so it was not changed.')
    throw err
  }
  return getUser(ctx, t.userId)
}

/** Display name and preferences; `version` (when sent) must match, or the edit is refused as stale. */
export async function updateProfile(
  ctx: AppContext,
  userId: string,
  input: {
    displayName?: string
    unitSystem?: 'metric' | 'imperial'
    temperatureUnit?: 'C' | 'F'
    currency?: string
    version?: number
  },
): Promise<UserRow> {
  const { version, ...changes } = input
  if (Object.keys(changes).length === 0) throw badRequest('Nothing to change.')
  const rows = await ctx.db
    .update(users)
    .set({ ...changes, updatedAt: new Date(), version: sql`${users.version} + 1` })
    .where(
      version === undefined ? eq(users.id, userId) : and(eq(users.id, userId), eq(users.version, version)),
    )
    .returning()
  if (rows.length === 0) {
    const current = await getUser(ctx, userId)
    throw conflict(
      'Your profile was changed somewhere else in the meantime. Reload it and make your change again.',
      {
        current: toPublicUser(current),
      },
    )
  }
  return rows[0]!
}

/** Admin: users, newest first, searched by e-mail or name. */
export async function listUsers(
  ctx: AppContext,
  query: { q?: string; page: number; pageSize: number },
): Promise<AdminUserPage> {
  const q = query.q?.trim()
  const like = q ? `%${q.replace(/[\\%_]/g, (c) => '\\' + c)}%` : null
  const where = like ? or(ilike(users.email, like), ilike(users.displayName, like)) : undefined
  const [{ n } = { n: 0 }] = await ctx.db.select({ n: count() }).from(users).where(where)
  const rows = await ctx.db
    .select()
    .from(users)
    .where(where)
    .orderBy(asc(users.email))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize)
  return {
    items: rows.map((u) => ({
      id: u.id,
      email: u.email,
      displayName: u.displayName,
      role: u.role,
      emailVerified: u.emailVerifiedAt !== null,
      createdAt: u.createdAt.toISOString(),
    })),
    total: n,
    page: query.page,
    pageSize: query.pageSize,
  }
}

/** Admin: grant or remove the advisor role. Admin accounts are not changed here. */
export async function setAdvisorRole(
  ctx: AppContext,
  userId: string,
  role: 'member' | 'advisor',
): Promise<UserRow> {
  const user = await getUser(ctx, userId)
  if (user.role === 'admin')
    throw badRequest('Admin accounts keep their role; it is not changed from this page.')
  const [row] = await ctx.db
    .update(users)
    .set({ role, updatedAt: new Date(), version: sql`${users.version} + 1` })
    .where(eq(users.id, userId))
    .returning()
  return row!
}
