import { Router } from 'express'
import { z } from 'zod'
import { fileNameFor } from '../../../shared/exchange/format'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { parse } from '../../validate'
import { actorOf } from '../vehicles/actor'
import { parseInput } from '../vehicles/input'
import { NameSchema } from '../../../shared/schemas/vehicles'
import { exportHourlyCsv, exportPlanFile, importPlanFile, saveChangeOnVehicleCopy } from './exchange.service'

/** `attachment; filename="…"; filename*=UTF-8''…` (ASCII fallback plus the exact name). */
export function attachment(name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/"/g, '')
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`
}

/** The plan's own fields are checked by the engine's parsePlan (errors named `plan.…`). */
const SaveChangeSchema = z.strictObject({
  name: NameSchema,
  plan: z.looseObject(
    {},
    { error: (iss) => (iss.input === undefined ? 'is required' : 'must be a plan (an object)') },
  ),
})

const ImportQuerySchema = z.strictObject({
  name: z.string().trim().min(1, 'must not be empty').max(100, 'must be at most 100 characters').optional(),
})

/**
 * Mounted at /api (full paths below, so it adds no guard to other routes):
 * - GET  /scenarios/:scenarioId/export.json → the plan file (shared/exchange/format.ts), as a download
 * - GET  /scenarios/:scenarioId/hourly.csv  → hourly results, one row per hour
 * - POST /vehicles/:vehicleId/scenarios/import (body: the plan file's JSON; `?name=` renames the scenario)
 *        → 201 `{ scenario, equipmentCreated, upgradedFrom, notes }`; 400 `import_invalid` with `fields`
 * - POST /scenarios/:scenarioId/save-change (body `{ name, plan }`: the tried plan from the Outlook)
 *        → 201 `{ scenario, vehicleId }`: a copy of the scenario's vehicle with the plan's equipment and the
 *        new scenario on it, in one transaction; 400 `validation_failed` with `fields` (`name`, `plan.…`)
 */
export function exchangeRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router()
  r.get('/scenarios/:scenarioId/export.json', requireUser, async (req, res) => {
    const file = await exportPlanFile(db, actorOf(res), String(req.params.scenarioId))
    res.setHeader('Cache-Control', 'private, no-cache')
    res.setHeader(
      'Content-Disposition',
      attachment(fileNameFor([file.vehicle.name, file.scenario.name], 'ohmward.json')),
    )
    res.type('application/json').send(JSON.stringify(file, null, 2) + '\n')
  })
  r.get('/scenarios/:scenarioId/hourly.csv', requireUser, async (req, res) => {
    const out = await exportHourlyCsv(db, actorOf(res), String(req.params.scenarioId))
    res.setHeader('Cache-Control', 'private, no-cache')
    res.setHeader(
      'Content-Disposition',
      attachment(fileNameFor([out.vehicleName, out.scenarioName, 'hourly'], 'csv')),
    )
    res.type('text/csv; charset=utf-8').send(out.csv)
  })
  r.post('/vehicles/:vehicleId/scenarios/import', requireUser, async (req, res) => {
    const q = parse(ImportQuerySchema, req.query)
    const result = await importPlanFile(db, actorOf(res), String(req.params.vehicleId), req.body, q.name)
    res.status(201).json(result)
  })
  r.post('/scenarios/:scenarioId/save-change', requireUser, async (req, res) => {
    const input = parseInput(SaveChangeSchema, req.body)
    res
      .status(201)
      .json(await saveChangeOnVehicleCopy(db, actorOf(res), String(req.params.scenarioId), input))
  })
  return r
}
