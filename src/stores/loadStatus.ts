import { ZodError } from 'zod'
import { ApiError } from '../api/http'

/** The one loading-status union of the vehicle and scenario stores. */
export type LoadStatus = 'idle' | 'loading' | 'success' | 'error'

/** Normalises anything a request can throw, so stores hold one error type. */
export function toApiError(e: unknown): ApiError {
  if (e instanceof ApiError) return e
  if (e instanceof ZodError)
    return new ApiError(0, 'bad_response', 'The server sent an answer we did not expect.')
  return new ApiError(0, 'unknown', e instanceof Error ? e.message : 'Something went wrong.')
}
