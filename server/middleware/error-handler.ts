import type { ErrorRequestHandler, RequestHandler } from 'express'
import { ZodError } from 'zod'
import { HttpError, notFound } from '../errors'
import { zodFieldErrors } from '../validate'

/** Unknown /api paths: the JSON 404. */
export const apiNotFound: RequestHandler = () => {
  throw notFound('That API route')
}

/** The one place errors become responses: `{ error: { code, message, fields? } }`. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  void _next
  if (err instanceof ZodError) {
    res.status(400).json({
      error: {
        code: 'validation_failed',
        message: 'Some fields need attention.',
        fields: zodFieldErrors(err),
      },
    })
    return
  }
  if (err instanceof HttpError) {
    res.status(err.status).json({
      error: {
        code: err.code,
        message: err.message,
        ...(err.fields ? { fields: err.fields } : {}),
        ...err.details,
      },
    })
    return
  }
  // body-parser errors (malformed JSON, too large) carry a status and a type
  const e = err as { status?: number; type?: string; message?: string }
  if (e.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'bad_json', message: 'The request body is not valid JSON.' } })
    return
  }
  if (e.type === 'entity.too.large') {
    res.status(413).json({ error: { code: 'too_large', message: 'The request body is too large.' } })
    return
  }
  if (typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
    res.status(e.status).json({ error: { code: 'bad_request', message: e.message ?? 'Bad request.' } })
    return
  }
  req.log?.error({ err }, 'unhandled error')
  const dbDown = isConnectionError(err)
  res.status(dbDown ? 503 : 500).json({
    error: dbDown
      ? { code: 'unavailable', message: 'The database is not answering. Please try again in a moment.' }
      : { code: 'internal', message: 'Something went wrong on our side. Nothing was changed.' },
  })
}

function isConnectionError(err: unknown): boolean {
  const code =
    (err as { code?: string; cause?: { code?: string } })?.code ??
    (err as { cause?: { code?: string } })?.cause?.code
  return (
    ['ECONNREFUSED', 'ECONNRESET', '57P01', '57P03', 'ETIMEDOUT'].includes(code ?? '') ||
    /Connection terminated|timeout exceeded when trying to connect/i.test(String((err as Error)?.message))
  )
}
