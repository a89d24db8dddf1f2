import type { RequestHandler, Response } from 'express'
import type { User } from 'lucia'
import { forbidden, unauthorized } from '../errors'

export type AccountRole = User['role']

/** 401 unless signed in. */
export const requireUser: RequestHandler = (_req, res, next) => {
  if (!res.locals.user) throw unauthorized()
  next()
}

/** 401 unless signed in, 403 unless the account has one of the roles. */
export function requireRole(...roles: AccountRole[]): RequestHandler {
  return (_req, res, next) => {
    const user = res.locals.user
    if (!user) throw unauthorized()
    if (!roles.includes(user.role)) throw forbidden()
    next()
  }
}

/** The signed-in user; use after requireUser. */
export function currentUser(res: Response): User {
  const user = res.locals.user
  if (!user) throw unauthorized()
  return user
}
