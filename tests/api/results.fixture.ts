/**
 * Builds a vehicle and a scenario through the real API from one of the example plans in data/examples, so
 * the results tests run on stored data exactly as a user would have entered it.
 */
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import type { Plan } from '../../shared/schemas/plan'

export type ExampleName = 'winter-week-lofoten' | 'summer-month-andalusia' | 'cabin-autumn-overcast'

export function examplePlan(name: ExampleName): Plan {
  const path = fileURLToPath(new URL(`../../data/examples/${name}.json`, import.meta.url))
  return JSON.parse(readFileSync(path, 'utf8')) as Plan
}

/** Minimal HTTP client: `send(method, path, body)` → `{ status, body }` with the user's cookie. */
export type Send = (
  method: 'GET' | 'POST' | 'PUT' | 'PATCH',
  path: string,
  body?: unknown,
) => Promise<{ status: number; body: any }>

/** A vehicle holding the plan's equipment and one scenario with its trip and usage. */
export async function storePlan(
  send: Send,
  plan: Plan,
  names: { vehicle: string; scenario: string },
): Promise<{ vehicleId: string; scenarioId: string }> {
  const ok = (r: Awaited<ReturnType<Send>>, what: string) => {
    if (r.status >= 300) throw new Error(`${what}: ${r.status} ${JSON.stringify(r.body)}`)
    return r.body
  }
  const voltage =
    plan.battery.nominalVoltageV ?? plan.battery.cellsSeries * (plan.battery.chemistry === 'lfp' ? 3.2 : 2)
  const systemVoltageV = voltage > 36 ? 48 : voltage > 18 ? 24 : 12
  const v = ok(
    await send('POST', '/api/vehicles', { name: names.vehicle, kind: 'van', systemVoltageV }),
    'vehicle',
  )
  ok(await send('PUT', `/api/vehicles/${v.id}/battery`, { version: 0, battery: plan.battery }), 'battery')
  if (plan.inverter)
    ok(
      await send('PUT', `/api/vehicles/${v.id}/inverter`, { version: 0, inverter: plan.inverter }),
      'inverter',
    )
  const usage: Record<string, unknown> = {}
  for (const a of plan.appliances) {
    const { id: _id, usage: u, ...fields } = a
    const rec = ok(await send('POST', `/api/vehicles/${v.id}/appliances`, fields), `appliance ${a.name}`)
    if (u) usage[rec.id] = u
  }
  for (const s of plan.sources) {
    const { id: _id, ...fields } = s
    ok(await send('POST', `/api/vehicles/${v.id}/sources`, fields), `source ${s.name}`)
  }
  const sc = ok(
    await send('POST', `/api/vehicles/${v.id}/scenarios`, { name: names.scenario, trip: plan.trip, usage }),
    'scenario',
  )
  return { vehicleId: v.id, scenarioId: sc.id }
}
