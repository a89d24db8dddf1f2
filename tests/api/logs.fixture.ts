/**
 * A van built from the engine's example plan data/examples/winter-week-lofoten.json (the plan the sample
 * log was generated from), with its winter scenario, made through the vehicles/scenarios services.
 */
import { readFileSync } from 'node:fs'
import { parsePlan } from '../../shared/schemas/plan'
import type { AppContext } from '../../server/context'
import { createScenario } from '../../server/modules/scenarios/scenarios.service'
import { createAppliance } from '../../server/modules/vehicles/appliances.service'
import { putBattery, putInverter } from '../../server/modules/vehicles/equipment.service'
import { createSource } from '../../server/modules/vehicles/sources.service'
import { createVehicle } from '../../server/modules/vehicles/vehicles.service'
import type { TestUser } from '../support/factories'

export const SAMPLE_LOG = new URL('../../data/sample-logs/lingon-lofoten-2027-02.csv', import.meta.url)

export async function createLofotenVan(
  ctx: AppContext,
  owner: TestUser,
): Promise<{ vehicleId: string; scenarioId: string }> {
  const parsed = parsePlan(
    JSON.parse(
      readFileSync(new URL('../../data/examples/winter-week-lofoten.json', import.meta.url), 'utf8'),
    ),
  )
  if (!parsed.ok) throw new Error('example plan invalid')
  const plan = parsed.plan
  const actor = { id: owner.id, displayName: owner.displayName }
  const van = await createVehicle(ctx.db, actor, { name: 'Test van', kind: 'van', systemVoltageV: 12 })
  await putBattery(ctx.db, actor, van.id, { version: 0, battery: plan.battery })
  if (plan.inverter) await putInverter(ctx.db, actor, van.id, { version: 0, inverter: plan.inverter })
  const usage: Record<string, NonNullable<(typeof plan.appliances)[number]['usage']>> = {}
  for (const a of plan.appliances) {
    const { id: _id, usage: planUsage, ...fields } = a
    const created = await createAppliance(ctx.db, actor, van.id, fields)
    if (planUsage) usage[created.id] = planUsage
  }
  for (const s of plan.sources) {
    const { id: _id, ...fields } = s
    await createSource(ctx.db, actor, van.id, fields)
  }
  const scenario = await createScenario(ctx.db, actor, van.id, {
    name: 'Winter week',
    trip: plan.trip,
    usage,
  })
  return { vehicleId: van.id, scenarioId: scenario.id }
}
