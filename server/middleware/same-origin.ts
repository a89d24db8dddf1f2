import type { RequestHandler } from 'express'
import { forbidden } from '../errors'

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

/**
 * CSRF guard for cookie sessions: a state-changing request that carries an Origin (every browser sends one
 * on cross-site POSTs) must come from this app's own origin. Requests without Origin (curl, server to server,
 * supertest) are let through: they carry no ambient browser cookies of a victim. `Sec-Fetch-Site: cross-site`
 * is refused too.
 */
export function sameOrigin(appUrl?: string): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next()
    if (req.path.startsWith('/webhooks/')) return next()
    const origin = req.get('origin')
    const site = req.get('sec-fetch-site')
    if (site === 'cross-site') throw forbidden('Cross-site requests are not accepted.')
    if (!origin) return next()
    const allowed = new Set<string>()
    const host = req.get('host')
    if (host) {
      allowed.add(`http://${host}`)
      allowed.add(`https://${host}`)
    }
    if (appUrl) allowed.add(new URL(appUrl).origin)
    if (!allowed.has(origin)) throw forbidden('Cross-site requests are not accepted.')
    next()
  }
}
