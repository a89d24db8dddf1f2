import { describe, expect, it } from 'vitest'
import winterWeek from '../../data/examples/winter-week-lofoten.json'
import { parsePlan, type Plan } from '../schemas/plan.ts'
import { fillPlanDefaults } from './presets.ts'
import { PREPARE_BATTERY_FIELDS, prepareTrip, prepareTripReusing } from './prepare.ts'
import { resultsToJson, simulate } from './index.ts'

const plan = (): Plan => {
  const p = parsePlan(JSON.parse(JSON.stringify(winterWeek)))
  if (!p.ok) throw new Error(JSON.stringify(p.fields))
  return p.plan
}

// prepareTripReusing (shared/engine/prepare.ts) is our own memo: it is only right while prepareTrip reads
// nothing of the battery bank but PREPARE_BATTERY_FIELDS.
describe('prepareTripReusing', () => {
  it('prepareTrip reads only the listed battery fields', () => {
    const resolved = fillPlanDefaults(plan())
    const read = new Set<string>()
    const battery = new Proxy(resolved.battery, {
      get(target, key, receiver) {
        if (typeof key === 'string') read.add(key)
        return Reflect.get(target, key, receiver) as unknown
      },
    })
    prepareTrip({ ...resolved, battery })
    expect([...read].sort()).toEqual([...PREPARE_BATTERY_FIELDS].sort())
  })

  it('a capacity change reuses the preparation and gives exactly what a fresh preparation gives', () => {
    const small = fillPlanDefaults(plan())
    const big = fillPlanDefaults({ ...plan(), battery: { ...plan().battery, cellsParallel: 2 } })
    const first = prepareTripReusing(small)
    const again = prepareTripReusing(big)
    expect(again.solarW).toBe(first.solarW) // the same series, not rebuilt
    expect(again.plan).toBe(big)
    const fresh = prepareTrip(big)
    expect(again.demandW).toEqual(fresh.demandW)
    expect(again.solarW).toEqual(fresh.solarW)
  })

  it('any other change prepares anew, and simulate gives the same JSON either way', () => {
    const p = plan()
    simulate(p)
    const colder = { ...p, trip: { ...p.trip, nightLowC: p.trip.nightLowC - 5 } }
    const a = prepareTripReusing(fillPlanDefaults(p))
    const b = prepareTripReusing(fillPlanDefaults(colder))
    expect(b.ambientC).not.toBe(a.ambientC)
    const bigger = { ...p, battery: { ...p.battery, cellsParallel: 3 } }
    simulate(p) // leaves p's preparation in the memo
    const reused = JSON.stringify(resultsToJson(simulate(bigger)))
    simulate(colder) // a different trip: the memo is replaced
    const freshRun = JSON.stringify(resultsToJson(simulate(bigger)))
    expect(reused).toBe(freshRun)
  })
})
