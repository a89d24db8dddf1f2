import express, { type Express } from 'express'
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import type { AppContext } from './context'
import { apiRouter } from './routes/index'
import { apiNotFound, errorHandler } from './middleware/error-handler'
import { requestLog } from './middleware/request-log'
import { securityHeaders } from './middleware/security-headers'
import type { HelmetOptions } from 'helmet'
import { sessionMiddleware } from './middleware/session'
import { sameOrigin } from './middleware/same-origin'
import { devRouter } from './routes/dev'

export interface CreateAppOptions {
  /** Folder of the built client to serve (with the SPA fallback); omitted in API-only tests. */
  clientDir?: string
}

/** Helmet's settings: our CSP (images from data:/blob:, inline styles for Quasar, workers from blob:), HSTS on https. */
export function helmetOptions(appUrl: string | undefined): HelmetOptions {
  return {
    contentSecurityPolicy: {
      useDefaults: true,
      directives: {
        'img-src': ["'self'", 'data:', 'blob:'],
        'style-src': ["'self'", "'unsafe-inline'"],
        'worker-src': ["'self'", 'blob:'],
        'upgrade-insecure-requests': null,
      },
    },
    strictTransportSecurity: appUrl?.startsWith('https:') ?? false,
  }
}

/** The Express app; server/index.ts and the tests both build it from here. */
export function createApp(ctx: AppContext, options: CreateAppOptions = {}): Express {
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', 'loopback')
  app.use(securityHeaders(helmetOptions(ctx.env.APP_URL)))
  app.use(requestLog(ctx.log))
  // Payment webhooks need the raw body for their signature check; their router parses it itself.
  const json = express.json({ limit: '2mb' })
  app.use('/api', (req, res, next) => (req.path.startsWith('/webhooks/') ? next() : json(req, res, next)))
  app.use('/api', sessionMiddleware(ctx.lucia))
  app.use('/api', sameOrigin(ctx.env.APP_URL))
  app.use('/api', apiRouter(ctx))
  app.use('/api', apiNotFound)
  if (ctx.env.NODE_ENV !== 'production') app.use('/dev', devRouter(ctx))

  const clientDir = options.clientDir ? resolve(options.clientDir) : null
  if (clientDir && existsSync(clientDir)) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }))
    // The client routes in the browser: every other GET gets index.html.
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache')
      res.sendFile(resolve(clientDir, 'index.html'))
    })
  }
  app.use(errorHandler)
  return app
}
