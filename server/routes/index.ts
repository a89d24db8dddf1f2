import { Router } from 'express'
import type { AppContext } from '../context'
import { healthRouter } from './health'
import { vehiclesRouter } from '../modules/vehicles/vehicles.routes'
import { scenariosRouter } from '../modules/scenarios/scenarios.routes'
import { resultsRouter } from '../modules/results/results.routes'
import { placesRouter } from '../modules/places/places.routes'
import { applianceLibraryRouter } from '../modules/vehicles/library'
import { accountRouter, adminRouter, authRouter } from '../modules/auth/routes'
import { crewRouter } from '../modules/crew/routes'
import { advisorsRouter } from '../modules/advisors/routes'
import { reviewsRouter } from '../modules/reviews/routes'
import { paymentsWebhookRouter } from '../modules/payments/webhook'
import { buildSheetRouter } from '../modules/buildsheet/buildsheet.routes'
import { logsRouter } from '../modules/logs/logs.routes'
import { exchangeRouter } from '../modules/exchange/exchange.routes'
import { reportsRouter } from '../modules/reports/reports.routes'

/**
 * Every API area, mounted under /api. One line per area: keep edits here to a single line each.
 */
export function apiRouter(ctx: AppContext): Router {
  const api = Router()
  api.use('/health', healthRouter(ctx))
  api.use('/vehicles', vehiclesRouter(ctx))
  api.use('/scenarios', scenariosRouter(ctx))
  api.use('/scenarios', resultsRouter(ctx))
  api.use('/places', placesRouter(ctx))
  api.use('/appliance-library', applianceLibraryRouter(ctx))
  api.use('/auth', authRouter(ctx))
  api.use('/account', accountRouter(ctx))
  api.use('/admin', adminRouter(ctx))
  api.use('/webhooks', paymentsWebhookRouter(ctx))
  api.use('/advisors', advisorsRouter(ctx))
  api.use('/reviews', reviewsRouter(ctx))
  api.use('/vehicles', buildSheetRouter(ctx))
  api.use('/', crewRouter(ctx))
  api.use('/', logsRouter(ctx))
  api.use('/', exchangeRouter(ctx))
  api.use('/', reportsRouter(ctx))
  return api
}
