import { Router } from 'express'
import { fileNameFor } from '../../../shared/exchange/format'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { actorOf } from '../vehicles/actor'
import { attachment } from '../exchange/exchange.routes'
import { renderReportPdf, reportInput } from './report.service'

/**
 * Mounted at /api: GET /scenarios/:scenarioId/report.pdf → the PDF report (read access; 422
 * `plan_incomplete` when the scenario cannot be run). `?inline=1` shows it in the browser instead of
 * downloading it.
 */
export function reportsRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router()
  r.get('/scenarios/:scenarioId/report.pdf', requireUser, async (req, res) => {
    const input = await reportInput(db, actorOf(res), String(req.params.scenarioId))
    const pdf = await renderReportPdf(input)
    const name = fileNameFor([input.vehicle.name, input.scenario.name, 'report'], 'pdf')
    res.setHeader('Cache-Control', 'private, no-cache')
    res.setHeader(
      'Content-Disposition',
      req.query.inline === '1' ? attachment(name).replace(/^attachment/, 'inline') : attachment(name),
    )
    res.type('application/pdf').send(pdf)
  })
  return r
}
