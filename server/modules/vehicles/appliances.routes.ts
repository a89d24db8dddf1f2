import { Router } from 'express'
import {
  ApplianceCreateSchema,
  ApplianceImportRequestSchema,
  AppliancePatchSchema,
  DeleteQuerySchema,
} from '../../../shared/schemas/vehicles'
import type { AppContext } from '../../context'
import { parseInput as parse } from './input'
import { actorOf } from './actor'
import { importAppliances } from './appliances.csv'
import * as service from './appliances.service'

/** /api/vehicles/:vehicleId/appliances (mounted by vehiclesRouter, which requires a user). */
export function appliancesRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router({ mergeParams: true })
  const vid = (params: object) => (params as { vehicleId: string }).vehicleId

  r.get('/', async (req, res) => {
    res.json({ items: await service.listAppliances(db, actorOf(res), vid(req.params)) })
  })
  r.post('/', async (req, res) => {
    const input = parse(ApplianceCreateSchema, req.body)
    res.status(201).json(await service.createAppliance(db, actorOf(res), vid(req.params), input))
  })
  r.post('/import', async (req, res) => {
    const input = parse(ApplianceImportRequestSchema, req.body)
    const out = await importAppliances(db, actorOf(res), vid(req.params), input)
    res.status(out.saved ? 201 : 200).json(out)
  })
  r.patch('/:applianceId', async (req, res) => {
    const patch = parse(AppliancePatchSchema, req.body)
    res.json(await service.patchAppliance(db, actorOf(res), vid(req.params), req.params.applianceId, patch))
  })
  r.delete('/:applianceId', async (req, res) => {
    const { version } = parse(DeleteQuerySchema, req.query)
    await service.deleteAppliance(db, actorOf(res), vid(req.params), req.params.applianceId, version)
    res.status(204).end()
  })
  return r
}
