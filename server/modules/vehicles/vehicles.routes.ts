import { Router } from 'express'
import {
  BatteryPutSchema,
  DeleteQuerySchema,
  InverterPutSchema,
  PageQuerySchema,
  ScenarioCreateSchema,
  ScenarioListQuerySchema,
  VehicleCreateSchema,
  VehiclePatchSchema,
} from '../../../shared/schemas/vehicles'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { parseInput as parse } from './input'
import * as scenarios from '../scenarios/scenarios.service'
import { actorOf } from './actor'
import { appliancesRouter } from './appliances.routes'
import { exportAppliancesCsv } from './appliances.csv'
import * as equipment from './equipment.service'
import { listHistory } from './history.service'
import { sourcesRouter } from './sources.routes'
import * as vehicles from './vehicles.service'

/** /api/vehicles: vehicles, their one-per-vehicle equipment, history and scenarios (docs/api.md). */
export function vehiclesRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router()
  r.use(requireUser)

  r.get('/', async (req, res) => {
    res.json(await vehicles.listVehicles(db, actorOf(res), parse(PageQuerySchema, req.query)))
  })
  r.post('/', async (req, res) => {
    res.status(201).json(await vehicles.createVehicle(db, actorOf(res), parse(VehicleCreateSchema, req.body)))
  })
  r.get('/:vehicleId', async (req, res) => {
    res.json(await vehicles.getVehicle(db, actorOf(res), req.params.vehicleId))
  })
  r.patch('/:vehicleId', async (req, res) => {
    const patch = parse(VehiclePatchSchema, req.body)
    res.json(await vehicles.patchVehicle(db, actorOf(res), req.params.vehicleId, patch))
  })
  r.delete('/:vehicleId', async (req, res) => {
    const { version } = parse(DeleteQuerySchema, req.query)
    await vehicles.deleteVehicle(db, actorOf(res), req.params.vehicleId, version)
    res.status(204).end()
  })

  r.get('/:vehicleId/battery', async (req, res) => {
    res.json(await equipment.getBattery(db, actorOf(res), req.params.vehicleId))
  })
  r.put('/:vehicleId/battery', async (req, res) => {
    const body = parse(BatteryPutSchema, req.body)
    res.json(await equipment.putBattery(db, actorOf(res), req.params.vehicleId, body))
  })
  r.get('/:vehicleId/inverter', async (req, res) => {
    res.json(await equipment.getInverter(db, actorOf(res), req.params.vehicleId))
  })
  r.put('/:vehicleId/inverter', async (req, res) => {
    const body = parse(InverterPutSchema, req.body)
    res.json(await equipment.putInverter(db, actorOf(res), req.params.vehicleId, body))
  })

  r.get('/:vehicleId/appliances.csv', async (req, res) => {
    const { fileName, csv } = await exportAppliancesCsv(db, actorOf(res), req.params.vehicleId)
    res.setHeader('Content-Type', 'text/csv; charset=utf-8')
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`)
    res.send(csv)
  })
  r.use('/:vehicleId/appliances', appliancesRouter(ctx))
  r.use('/:vehicleId/sources', sourcesRouter(ctx))

  r.get('/:vehicleId/history', async (req, res) => {
    res.json(await listHistory(db, actorOf(res), req.params.vehicleId, parse(PageQuerySchema, req.query)))
  })

  r.get('/:vehicleId/scenarios', async (req, res) => {
    const q = parse(ScenarioListQuerySchema, req.query)
    res.json(await scenarios.listVehicleScenarios(db, actorOf(res), req.params.vehicleId, q))
  })
  r.post('/:vehicleId/scenarios', async (req, res) => {
    const input = parse(ScenarioCreateSchema, req.body)
    res.status(201).json(await scenarios.createScenario(db, actorOf(res), req.params.vehicleId, input))
  })
  return r
}
