import { Router } from 'express'
import { z } from 'zod'
import { fileNameFor } from '../../../shared/exchange/format'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { parse } from '../../validate'
import { actorOf } from '../vehicles/actor'
import { exportHourlyCsv, exportPlanFile, importPlanFile } from './exchange.service'

/** `attachment; filename="…"; filename*=UTF-8''…` (ASCII fallback plus the exact name). */
export function attachment(name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/"/g, '')
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`
}

const ImportQuerySchema = z.strictObject({
  name: z.string().trim().min(1, 'must not be empty').max(100, 'must be at most 100 characters').optional(),
})

/**
 * Mounted at /api (full paths below, so it adds no guard to other routes):
 * - GET  /scenarios/:scenarioId/export.json → the plan file (shared/exchange/format.ts), as a download
 * - GET  /scenarios/:scenarioId/hourly.csv  → hourly results, one row per hour
 * - POST /vehicles/:vehicleId/scenarios/import (body: the plan file's JSON; `?name=` renames the scenario)
 *        → 201 `{ scenario, equipmentCreated, upgradedFrom, notes }`; 400 `import_invalid` with `fields`
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
  return r
}
