import type { RequestHandler } from 'express'
import helmet, { type HelmetOptions } from 'helmet'

/**
 * Helmet's security headers, worked out once at start and then set on every answer with one middleware.
 * With our options every header helmet sets is the same for every request (no nonces, nothing read from the
 * request), but helmet's chain of thirteen middlewares computes and sets them anew each time; under load
 * (bench:api) that was about a twentieth of the server's CPU. The test compares both on a real answer.
 */
export function securityHeaders(options: Readonly<HelmetOptions>): RequestHandler {
  const headers: [string, string | number | readonly string[]][] = []
  const removed: string[] = []
  const recorder = {
    setHeader(name: string, value: string | number | readonly string[]) {
      headers.push([name, value])
    },
    removeHeader(name: string) {
      removed.push(name)
    },
  }
  let called = false
  helmet(options)({} as never, recorder as never, () => (called = true))
  if (!called) throw new Error('helmet did not finish synchronously: its headers cannot be worked out once')
  return (_req, res, next) => {
    for (const name of removed) res.removeHeader(name)
    for (const [name, value] of headers) res.setHeader(name, value)
    next()
  }
}
