import { Router } from 'express'
import {
  ChargeSourceCreateSchema,
  ChargeSourcePatchSchema,
  DeleteQuerySchema,
  type ChargeSourcePatch,
} from '../../../shared/schemas/vehicles'
import type { AppContext } from '../../context'
import { parseInput as parse } from './input'
import { actorOf } from './actor'
import * as service from './sources.service'

/** /api/vehicles/:vehicleId/sources (mounted by vehiclesRouter, which requires a user). */
export function sourcesRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router({ mergeParams: true })
  const vid = (params: object) => (params as { vehicleId: string }).vehicleId

  r.get('/', async (req, res) => {
    res.json({ items: await service.listSources(db, actorOf(res), vid(req.params)) })
  })
  r.post('/', async (req, res) => {
    const input = parse(ChargeSourceCreateSchema, req.body)
    res.status(201).json(await service.createSource(db, actorOf(res), vid(req.params), input))
  })
  r.patch('/:sourceId', async (req, res) => {
    // The fields are checked after merging with the stored source (service), by the kind's schema.
    const patch = parse(ChargeSourcePatchSchema, req.body) as ChargeSourcePatch
    res.json(await service.patchSource(db, actorOf(res), vid(req.params), req.params.sourceId, patch))
  })
  r.delete('/:sourceId', async (req, res) => {
    const { version } = parse(DeleteQuerySchema, req.query)
    await service.deleteSource(db, actorOf(res), vid(req.params), req.params.sourceId, version)
    res.status(204).end()
  })
  return r
}
