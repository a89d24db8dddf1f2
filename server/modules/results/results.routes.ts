import { Router } from 'express'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { actorOf } from '../vehicles/actor'
import { loadScenarioForUser } from '../scenarios/scenarios.service'
import { buildPlanForScenario } from '../scenarios/plan'
import { resultsForPlan } from './results.service'

/**
 * GET /api/scenarios/:scenarioId/results → `{ scenarioId, computedInMs, cached, results }`, `results` being
 * the engine's analysis JSON (shared/engine resultsToJson(analysePlan(plan))). Read access as for the
 * scenario itself (members of its vehicle; others 404); 422 `plan_incomplete` when the vehicle cannot be run.
 */
export function resultsRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router()
  r.get('/:scenarioId/results', requireUser, async (req, res) => {
    const { row } = await loadScenarioForUser(db, actorOf(res).id, String(req.params.scenarioId), 'read')
    const plan = await buildPlanForScenario(db, row.id)
    const { text, key, cached, computedInMs } = resultsForPlan(plan)
    // The results are the same for the same plan: an ETag from the plan's hash lets a browser revalidate with a
    // 304, and the memoised JSON text is sent as it is (no serialising 100+ kB per request).
    const etag = `"${key.slice(0, 32)}"`
    res.setHeader('Cache-Control', 'private, no-cache')
    res.setHeader('ETag', etag)
    if (req.get('if-none-match') === etag) {
      res.status(304).end()
      return
    }
    res.type('application/json')
    res.send(
      `{"scenarioId":${JSON.stringify(row.id)},"computedInMs":${Math.round(computedInMs)},"cached":${cached},"results":${text}}`,
    )
  })
  return r
}
