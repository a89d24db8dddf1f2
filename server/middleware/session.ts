import type { RequestHandler } from 'express'
import type { Session, User } from 'lucia'
import type { AppLucia } from '../auth/lucia'

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      user: User | null
      session: Session | null
    }
  }
}

/** Reads the session cookie, validates it, refreshes it when Lucia extends it, and sets res.locals.user. */
export function sessionMiddleware(lucia: AppLucia): RequestHandler {
  return async (req, res, next) => {
    const sessionId = lucia.readSessionCookie(req.headers.cookie ?? '')
    res.locals.user = null
    res.locals.session = null
    if (!sessionId) return next()
    const { session, user } = await lucia.validateSession(sessionId)
    if (session?.fresh) res.append('Set-Cookie', lucia.createSessionCookie(session.id).serialize())
    if (!session) res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize())
    res.locals.user = user
    res.locals.session = session
    next()
  }
}
