import { Router } from 'express'
import {
  DeleteQuerySchema,
  ScenarioDuplicateSchema,
  ScenarioListQuerySchema,
  ScenarioPatchSchema,
} from '../../../shared/schemas/vehicles'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { parseInput as parse } from '../vehicles/input'
import { actorOf } from '../vehicles/actor'
import { buildPlanForScenario } from './plan'
import * as service from './scenarios.service'

/** /api/scenarios (a vehicle's list and creation live under /api/vehicles/:vehicleId/scenarios). */
export function scenariosRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router()
  r.use(requireUser)

  r.get('/', async (req, res) => {
    res.json(await service.listScenarios(db, actorOf(res), parse(ScenarioListQuerySchema, req.query)))
  })
  r.get('/:scenarioId', async (req, res) => {
    res.json(await service.getScenario(db, actorOf(res), req.params.scenarioId))
  })
  r.patch('/:scenarioId', async (req, res) => {
    const patch = parse(ScenarioPatchSchema, req.body)
    res.json(await service.patchScenario(db, actorOf(res), req.params.scenarioId, patch))
  })
  r.delete('/:scenarioId', async (req, res) => {
    const { version } = parse(DeleteQuerySchema, req.query)
    await service.deleteScenario(db, actorOf(res), req.params.scenarioId, version)
    res.status(204).end()
  })
  r.post('/:scenarioId/duplicate', async (req, res) => {
    const input = parse(ScenarioDuplicateSchema, req.body)
    res.status(201).json(await service.duplicateScenario(db, actorOf(res), req.params.scenarioId, input))
  })
  r.get('/:scenarioId/plan', async (req, res) => {
    const { row } = await service.loadScenarioForUser(db, actorOf(res).id, req.params.scenarioId, 'read')
    res.json(await buildPlanForScenario(db, row.id))
  })
  return r
}
