import { rateLimit, type RateLimitRequestHandler } from 'express-rate-limit'
import type { AppContext } from '../../context'
import { PgRateLimitStore } from '../../auth/rate-limit-store'
import { tooMany } from '../../errors'

/**
 * Attempts per client address for one auth action (sign-in, sign-up, reset), counted in PostgreSQL so every
 * server process shares the count. AUTH_RATE_LIMIT_MAX and AUTH_RATE_LIMIT_WINDOW_SECONDS set it.
 * Sign-in counts only the attempts that fail (express-rate-limit's skipSuccessfulRequests), so a household
 * behind one address, signing in on several devices, is not locked out; guessing passwords still is.
 */
export function authLimiter(ctx: AppContext, name: 'sign-in' | 'sign-up' | 'reset'): RateLimitRequestHandler {
  const windowS = ctx.env.AUTH_RATE_LIMIT_WINDOW_SECONDS
  return rateLimit({
    windowMs: windowS * 1000,
    limit: ctx.env.AUTH_RATE_LIMIT_MAX ?? 10,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    skipSuccessfulRequests: name === 'sign-in',
    store: new PgRateLimitStore(ctx.pool, `auth-${name}`),
    handler: (_req, _res, next) => {
      const minutes = Math.max(1, Math.round(windowS / 60))
      next(
        tooMany(
          `Too many attempts from your connection. Please wait up to ${minutes} minutes and try again.`,
        ),
      )
    },
  })
}
