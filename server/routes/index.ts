import { Router } from 'express'
import type { AppContext } from '../context'
import { healthRouter } from './health'

/**
 * Every API area, mounted under /api. One line per area: keep edits here to a single line each.
 */
export function apiRouter(ctx: AppContext): Router {
  const api = Router()
  api.use('/health', healthRouter(ctx))
  return api
}
