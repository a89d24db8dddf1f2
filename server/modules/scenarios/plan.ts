/**
 * Assemble the engine's Plan (shared/schemas/plan.ts) for a scenario: the vehicle's battery bank,
 * appliance inventory (with this scenario's usage), charge sources and inverter, plus the scenario's trip.
 * Used by GET /api/scenarios/:scenarioId/plan, and by reports and stored results.
 */
import { eq } from 'drizzle-orm'
import { applyScenarioUsage, parsePlan, PLAN_FORMAT_VERSION, type Plan } from '../../../shared/schemas/plan'
import type { Db } from '../../db/client'
import { batteryBanks, inverters, scenarios, vehicles } from '../../db/schema/index'
import { HttpError, notFound } from '../../errors'
import { isId } from '../vehicles/access'
import { loadApplianceRows } from '../vehicles/appliances.service'
import type { DbOrTx } from '../vehicles/records'
import { loadSourceRows } from '../vehicles/sources.service'
import { loadUsage } from './scenarios.service'

/** 422: the scenario's vehicle is not complete enough to simulate; `fields` says what is missing or wrong. */
export const planIncomplete = (fields: Record<string, string[]>) =>
  new HttpError(
    422,
    'plan_incomplete',
    fields.battery?.some((m) => m.startsWith('is required'))
      ? 'This vehicle has no battery bank yet. Add one to run this scenario.'
      : 'This scenario cannot be run yet: some equipment or trip values need attention.',
    fields,
  )

/**
 * The plan for a scenario. Does **not** check access: call `loadScenarioForUser(db, userId, scenarioId, 'read')`
 * (or `requireVehicleRole`) first. Throws 404 when the scenario does not exist, 422 `plan_incomplete` when
 * the combination is not a valid plan (no battery bank, an AC appliance without an inverter, …).
 */
export async function buildPlanForScenario(db: Db | DbOrTx, scenarioId: string): Promise<Plan> {
  if (!isId(scenarioId)) throw notFound('That scenario')
  const [scenario] = await db.select().from(scenarios).where(eq(scenarios.id, scenarioId)).limit(1)
  if (!scenario) throw notFound('That scenario')
  const vehicleId = scenario.vehicleId
  const [[vehicle], [battery], [inverter], applianceRows, sourceRows, usage] = await Promise.all([
    db.select({ name: vehicles.name }).from(vehicles).where(eq(vehicles.id, vehicleId)),
    db
      .select({ params: batteryBanks.params })
      .from(batteryBanks)
      .where(eq(batteryBanks.vehicleId, vehicleId)),
    db.select({ params: inverters.params }).from(inverters).where(eq(inverters.vehicleId, vehicleId)),
    loadApplianceRows(db, vehicleId),
    loadSourceRows(db, vehicleId),
    loadUsage(db, scenarioId),
  ])
  if (!battery) throw planIncomplete({ battery: ['is required: add a battery bank to the vehicle'] })
  const inventory = applianceRows.map((r) => ({ id: r.id, ...r.params }))
  const candidate = {
    formatVersion: PLAN_FORMAT_VERSION,
    name: `${vehicle?.name ?? 'Vehicle'} · ${scenario.name}`.slice(0, 200),
    battery: battery.params,
    appliances: applyScenarioUsage(inventory, usage),
    sources: sourceRows.map((r) => ({ ...r.params, id: r.id })),
    inverter: inverter?.params ?? null,
    trip: scenario.trip,
  }
  const parsed = parsePlan(candidate)
  if (!parsed.ok) throw planIncomplete(withRecordIds(parsed.fields, candidate))
  return parsed.plan
}

/** `appliances.3.supply` → `appliances.<id>.supply`, so the client can point at the record itself. */
function withRecordIds(
  fields: Record<string, string[]>,
  plan: { appliances: { id: string }[]; sources: { id: string }[] },
): Record<string, string[]> {
  const out: Record<string, string[]> = {}
  for (const [key, messages] of Object.entries(fields)) {
    const renamed = key.replace(
      /^(appliances|sources)\.(\d+)(?=\.|$)/,
      (whole, list: string, index: string) => {
        const item = (list === 'appliances' ? plan.appliances : plan.sources)[Number(index)]
        return item ? `${list}.${item.id}` : whole
      },
    )
    ;(out[renamed] ??= []).push(...messages)
  }
  return out
}
