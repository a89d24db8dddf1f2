import { Router } from 'express'
import { z } from 'zod'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { parse } from '../../validate'
import { actorOf } from '../vehicles/actor'
import * as sheet from './buildsheet.service'

const SheetQuerySchema = z.object({ scenarioId: z.uuid({ error: 'must be a scenario id' }).optional() })
const DeleteQuerySchema = z.object({
  version: z.coerce.number({ error: 'is required' }).int('must be a whole number').min(0),
})

/** A route parameter as text (a missing or repeated one becomes an id no row has, answered 404). */
const p = (v: unknown): string => (typeof v === 'string' ? v : '')

/** Mounted at /api/vehicles (bodies are parsed in the service, after the role check): the build sheet and the parts list of a vehicle (docs/build-sheet.md). */
export function buildSheetRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router()

  r.get('/:vehicleId/build-sheet', requireUser, async (req, res) => {
    const { scenarioId } = parse(SheetQuerySchema, req.query)
    res.json(await sheet.getBuildSheet(db, actorOf(res), p(req.params.vehicleId), scenarioId))
  })
  r.put('/:vehicleId/build-sheet/settings', requireUser, async (req, res) => {
    res.json(await sheet.putSettings(db, actorOf(res), p(req.params.vehicleId), req.body))
  })

  r.get('/:vehicleId/parts', requireUser, async (req, res) => {
    res.json(await sheet.listParts(db, actorOf(res), p(req.params.vehicleId)))
  })
  r.post('/:vehicleId/parts', requireUser, async (req, res) => {
    res.status(201).json(await sheet.createPart(db, actorOf(res), p(req.params.vehicleId), req.body))
  })
  r.patch('/:vehicleId/parts/:partId', requireUser, async (req, res) => {
    res.json(await sheet.patchPart(db, actorOf(res), p(req.params.vehicleId), p(req.params.partId), req.body))
  })
  r.delete('/:vehicleId/parts/:partId', requireUser, async (req, res) => {
    const { version } = parse(DeleteQuerySchema, req.query)
    await sheet.deletePart(db, actorOf(res), p(req.params.vehicleId), p(req.params.partId), version)
    res.status(204).end()
  })
  return r
}
