import type { RequestHandler } from 'express'
import type { Logger } from 'pino'
import { randomUUID } from 'node:crypto'

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      log?: Logger
      id?: string
    }
  }
}

/** One pino line per request: method, path, status, duration; a request id for correlating errors. */
export function requestLog(log: Logger): RequestHandler {
  return (req, res, next) => {
    const start = performance.now()
    req.id = randomUUID()
    req.log = log.child({ reqId: req.id })
    res.on('finish', () => {
      req.log?.info(
        {
          method: req.method,
          path: req.originalUrl.split('?')[0],
          status: res.statusCode,
          ms: Math.round(performance.now() - start),
        },
        'request',
      )
    })
    next()
  }
}
