/**
 * Errors with stable machine codes. Thrown anywhere in a request; translated to JSON in one place
 * (middleware/error-handler.ts) as `{ error: { code, message, fields? } }`.
 */
export type FieldErrors = Record<string, string[]>

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: FieldErrors,
    readonly details?: Record<string, unknown>,
  ) {
    super(message)
  }
}

export const badRequest = (message: string, fields?: FieldErrors) =>
  new HttpError(400, 'bad_request', message, fields)
export const validationFailed = (fields: FieldErrors, message = 'Some fields need attention.') =>
  new HttpError(400, 'validation_failed', message, fields)
export const unauthorized = (message = 'Please sign in first.') => new HttpError(401, 'unauthorized', message)
export const forbidden = (message = 'You are not allowed to do this.') =>
  new HttpError(403, 'forbidden', message)
export const notFound = (what = 'That item') => new HttpError(404, 'not_found', `${what} was not found.`)
export const conflict = (message: string, details?: Record<string, unknown>) =>
  new HttpError(409, 'conflict', message, undefined, details)
export const tooMany = (message = 'Too many attempts. Please wait a minute and try again.') =>
  new HttpError(429, 'rate_limited', message)
export const serviceUnavailable = (message: string) => new HttpError(503, 'unavailable', message)
