import { Router } from 'express'
import type { AppContext } from '../context'

declare const __APP_VERSION__: string | undefined

export function appVersion(): string {
  return typeof __APP_VERSION__ === 'string' ? __APP_VERSION__ : (process.env.npm_package_version ?? '0.0.0')
}

/** GET /api/health: the app's version and whether the database answers (503 when it does not). */
export function healthRouter(ctx: AppContext): Router {
  const r = Router()
  r.get('/', async (_req, res) => {
    const started = performance.now()
    const database: 'up' | 'down' = await ctx.pool.query('SELECT 1').then(
      () => 'up' as const,
      () => 'down' as const,
    )
    const body = {
      status: database === 'up' ? 'ok' : 'degraded',
      version: appVersion(),
      database,
      checkedInMs: Math.round(performance.now() - started),
    }
    res.status(database === 'up' ? 200 : 503).json(body)
  })
  return r
}
