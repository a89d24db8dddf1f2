import { rateLimit, type RateLimitRequestHandler } from 'express-rate-limit'
import type { AppContext } from '../../context'
import { PgRateLimitStore } from '../../auth/rate-limit-store'
import { tooMany } from '../../errors'

/**
 * Attempts per client address for one auth action (sign-in, sign-up, reset), counted in PostgreSQL so every
 * server process shares the count. AUTH_RATE_LIMIT_MAX and AUTH_RATE_LIMIT_WINDOW_SECONDS set it.
 */
export function authLimiter(ctx: AppContext, name: 'sign-in' | 'sign-up' | 'reset'): RateLimitRequestHandler {
  const windowS = ctx.env.AUTH_RATE_LIMIT_WINDOW_SECONDS
  return rateLimit({
    windowMs: windowS * 1000,
    limit: ctx.env.AUTH_RATE_LIMIT_MAX ?? 10,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
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
