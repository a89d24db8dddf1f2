import { Router } from 'express'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { actorOf } from '../vehicles/actor'
import { loadPlanDigestForReader, loadPlanWithDigest } from '../scenarios/plan'
import { resultsForDigest } from './results.service'

/**
 * GET /api/scenarios/:scenarioId/results → `{ scenarioId, computedInMs, cached, results }`, `results` being
 * the engine's analysis JSON (shared/engine resultsToJson(analysePlan(plan))). Read access as for the
 * scenario itself (members of its vehicle; others 404); 422 `plan_incomplete` when the vehicle cannot be run.
 */
export function resultsRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router()
  r.get('/:scenarioId/results', requireUser, async (req, res) => {
    // One prepared query: access, and the digest of everything the plan is made of (the hot path of every
    // Outlook and of Side by side; bench:api measures it). The plan itself is read only when not memoised.
    const { scenarioId, digest } = await loadPlanDigestForReader(
      db,
      actorOf(res).id,
      String(req.params.scenarioId),
    )
    const answer = await resultsForDigest(scenarioId, digest, () => loadPlanWithDigest(db, scenarioId))
    // The results are the same for the same plan: an ETag from the plan's hash lets a browser revalidate with a
    // 304, and the memoised body is sent as it is (no serialising 100+ kB per request), gzip-compressed once
    // for clients that accept it (every browser does; a month's results shrink from ~160 kB to ~35 kB).
    const etag = `"${answer.key.slice(0, 32)}"`
    res.setHeader('Cache-Control', 'private, no-cache')
    res.setHeader('ETag', etag)
    res.setHeader('Vary', 'Accept-Encoding')
    if (req.get('if-none-match') === etag) {
      res.status(304).end()
      return
    }
    res.type('application/json')
    if (req.acceptsEncodings('gzip') === 'gzip') {
      res.setHeader('Content-Encoding', 'gzip')
      res.send(answer.gzipped())
    } else {
      res.send(answer.body)
    }
  })
  return r
}
