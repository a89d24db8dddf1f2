import { Router, type Request, type Response } from 'express'
import { z } from 'zod'
import type { AppContext } from '../../context'
import { parse } from '../../validate'
import { currentUser, requireRole, requireUser } from '../../auth/authorize'
import {
  ChangeEmailSchema,
  ChangePasswordSchema,
  EmailOnlySchema,
  ProfileSchema,
  ResetPasswordSchema,
  RoleChangeSchema,
  SignInSchema,
  SignUpSchema,
  TokenSchema,
} from '../../../shared/schemas/account'
import { authLimiter } from './limits'
import * as auth from './service'

/** Links in mails point at APP_URL, or at the address the request came to. */
function baseUrl(ctx: AppContext, req: Request): string {
  return (ctx.env.APP_URL ?? `${req.protocol}://${req.get('host')}`).replace(/\/$/, '')
}

/** Start a session and set its cookie (Secure when the request came over HTTPS, even if APP_URL is http). */
async function startSession(ctx: AppContext, req: Request, res: Response, userId: string): Promise<void> {
  const session = await ctx.lucia.createSession(userId, {})
  const cookie = ctx.lucia.createSessionCookie(session.id)
  if (req.secure) cookie.attributes.secure = true
  res.append('Set-Cookie', cookie.serialize())
}

function clearSessionCookie(ctx: AppContext, res: Response): void {
  res.append('Set-Cookie', ctx.lucia.createBlankSessionCookie().serialize())
}

/** True for every address: a registered one gets an "you already have an account" mail instead of a link. */
const SIGN_UP_SENT =
  'A mail is on its way to that address. Open the link in it to go on. It can take a minute; check the spam folder too.'
/** Unknown addresses get no mail, so this says "if". */
const RESET_SENT =
  'If that address has an account, a mail with a link is on its way to it. It can take a minute; check the spam folder too.'

/** /api/auth: sign-up, sign-in and out, e-mail links. */
export function authRouter(ctx: AppContext): Router {
  const r = Router()
  const signInLimit = authLimiter(ctx, 'sign-in')
  const signUpLimit = authLimiter(ctx, 'sign-up')
  const resetLimit = authLimiter(ctx, 'reset')

  r.get('/me', async (_req, res) => {
    const user = res.locals.user
    res.json({ user: user ? auth.toPublicUser(await auth.getUser(ctx, user.id)) : null })
  })

  r.post('/sign-up', signUpLimit, async (req, res) => {
    const input = parse(SignUpSchema, req.body)
    await auth.signUp(ctx, input, baseUrl(ctx, req))
    res.status(202).json({ message: SIGN_UP_SENT })
  })

  r.post('/sign-in', signInLimit, async (req, res) => {
    const input = parse(SignInSchema, req.body)
    const user = await auth.signIn(ctx, input, baseUrl(ctx, req))
    // A session this browser already had (perhaps another account's) ends; the new one replaces it.
    if (res.locals.session) await ctx.lucia.invalidateSession(res.locals.session.id)
    await startSession(ctx, req, res, user.id)
    res.json({ user: auth.toPublicUser(user) })
  })

  r.post('/sign-out', async (_req, res) => {
    if (res.locals.session) await ctx.lucia.invalidateSession(res.locals.session.id)
    clearSessionCookie(ctx, res)
    res.status(204).end()
  })

  r.post('/sign-out-everywhere', requireUser, async (_req, res) => {
    await ctx.lucia.invalidateUserSessions(currentUser(res).id)
    clearSessionCookie(ctx, res)
    res.status(204).end()
  })

  r.post('/verify-email', async (req, res) => {
    const { token } = parse(TokenSchema, req.body)
    const user = await auth.verifyEmail(ctx, token)
    if (res.locals.session) await ctx.lucia.invalidateSession(res.locals.session.id)
    await startSession(ctx, req, res, user.id)
    res.json({ user: auth.toPublicUser(user) })
  })

  r.post('/confirm-email-change', async (req, res) => {
    const { token } = parse(TokenSchema, req.body)
    const user = await auth.confirmEmailChange(ctx, token)
    res.json({ user: auth.toPublicUser(user) })
  })

  r.post('/forgot-password', resetLimit, async (req, res) => {
    const { email } = parse(EmailOnlySchema, req.body)
    await auth.requestPasswordReset(ctx, email, baseUrl(ctx, req))
    res.status(202).json({ message: RESET_SENT })
  })

  r.post('/reset-password', resetLimit, async (req, res) => {
    const input = parse(ResetPasswordSchema, req.body)
    await auth.resetPassword(ctx, input.token, input.password)
    clearSessionCookie(ctx, res)
    res.json({ message: 'Your new password is set, and every device was signed out. Sign in with it now.' })
  })

  return r
}

/** /api/account: the signed-in user's profile, preferences and security. */
export function accountRouter(ctx: AppContext): Router {
  const r = Router()
  r.use(requireUser)

  r.get('/', async (_req, res) => {
    res.json({ user: auth.toPublicUser(await auth.getUser(ctx, currentUser(res).id)) })
  })

  r.patch('/profile', async (req, res) => {
    const input = parse(ProfileSchema, req.body)
    const user = await auth.updateProfile(ctx, currentUser(res).id, input)
    res.json({ user: auth.toPublicUser(user) })
  })

  r.post('/password', async (req, res) => {
    const input = parse(ChangePasswordSchema, req.body)
    const userId = currentUser(res).id
    await auth.changePassword(ctx, userId, input)
    // Every session ended; this device gets a fresh one.
    await startSession(ctx, req, res, userId)
    res.json({ message: 'Password changed. Other devices were signed out.' })
  })

  r.post('/email', async (req, res) => {
    const input = parse(ChangeEmailSchema, req.body)
    await auth.requestEmailChange(ctx, currentUser(res).id, input, baseUrl(ctx, req))
    res.status(202).json({
      message: `We sent a link to ${input.newEmail}. Your address changes when you open it; until then the old one stays.`,
    })
  })

  return r
}

const UserListQuery = z.object({
  q: z.string().max(200).optional(),
  page: z.coerce.number().int().min(1, 'Pages start at 1.').default(1),
  pageSize: z.coerce.number().int().min(1).max(100, 'At most 100 per page.').default(20),
})

/** /api/admin: admins only. */
export function adminRouter(ctx: AppContext): Router {
  const r = Router()
  r.use(requireRole('admin'))

  r.get('/users', async (req, res) => {
    res.json(await auth.listUsers(ctx, parse(UserListQuery, req.query)))
  })

  r.put('/users/:id/role', async (req, res) => {
    const { role } = parse(RoleChangeSchema, req.body)
    const user = await auth.setAdvisorRole(ctx, String(req.params.id), role)
    res.json({ user: auth.toPublicUser(user) })
  })

  return r
}
