import { describe, it, expect } from 'vitest'
import { parsePlan, fillPlanDefaults, CHEMISTRY_PRESETS, applyScenarioUsage } from './index.ts'
import winterWeek from '../../data/examples/winter-week-lofoten.json'

const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x))

describe('parsePlan', () => {
  it('accepts the example plan', () => {
    expect(parsePlan(clone(winterWeek)).ok).toBe(true)
  })

  it('names each bad field by its dotted path', () => {
    const bad = clone(winterWeek) as Record<string, any> // eslint-disable-line @typescript-eslint/no-explicit-any -- poking bad values into a plan
    bad.battery.capacityAh = -1
    bad.battery.cellCapacityAh = undefined
    bad.appliances[1].powerW = 'lots'
    bad.trip.timeZone = 'Europe/Nowhere'
    bad.trip.days = 400
    bad.sources[0].tiltDeg = 95
    const r = parsePlan(bad)
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.fields['battery.capacityAh']).toEqual(['must be greater than 0'])
    expect(r.fields['appliances.1.powerW']).toEqual(['must be a number'])
    expect(r.fields['trip.timeZone']?.[0]).toMatch(/IANA/)
    expect(r.fields['trip.days']).toEqual(['must be between 1 and 366'])
    expect(r.fields['sources.0.tiltDeg']).toEqual(['must be between 0 and 90'])
  })

  it('points at an unknown field itself', () => {
    const bad = clone(winterWeek) as Record<string, any> // eslint-disable-line @typescript-eslint/no-explicit-any -- poking bad values into a plan
    bad.battery.capacityAmpHours = 5
    const r = parsePlan(bad)
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.fields['battery.capacityAmpHours']).toEqual(['is not a known field'])
  })

  it('checks cross-field rules: hysteresis, window length, AC without inverter, day list length', () => {
    const bad = clone(winterWeek) as Record<string, any> // eslint-disable-line @typescript-eslint/no-explicit-any -- poking bad values into a plan
    bad.battery.heater = { powerW: 30, onBelowC: 5, offAboveC: 3 }
    bad.appliances[2].hoursPerDay = 12 // window 15–23 is 8 h
    bad.inverter = null
    bad.trip.dayPlan.days.pop()
    const r = parsePlan(bad)
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.fields['battery.heater.offAboveC']).toBeDefined()
    expect(r.fields['appliances.2.hoursPerDay']?.[0]).toMatch(/does not fit/)
    expect(r.fields['appliances.6.supply']).toEqual(['is ac but the plan has no inverter'])
    expect(r.fields['trip.dayPlan.days']?.[0]).toMatch(/one entry per trip day/)
  })

  it('says a missing field is required', () => {
    const r = parsePlan({
      battery: { chemistry: 'lfp', cellsSeries: 4, cellsParallel: 1, capacityAh: 100 },
      appliances: [],
      sources: [],
    })
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.fields['trip']).toEqual(['is required'])
  })
})

describe('chemistry presets and defaults', () => {
  it('fills an LFP bank from its preset: 4 × 3.2 V = 12.8 V, a heater pad, charge blocked below 0 °C', () => {
    const r = parsePlan({
      ...clone(winterWeek),
      battery: { chemistry: 'lfp', cellsSeries: 4, cellsParallel: 2, cellCapacityAh: 100 },
    })
    expect(r.ok).toBe(true)
    if (!r.ok) return
    const b = fillPlanDefaults(r.plan).battery
    expect(b.nominalVoltageV).toBeCloseTo(12.8, 12)
    expect(b.capacityAh).toBe(200)
    expect(b.chargeMinC).toBe(0)
    expect(b.heater).not.toBeNull()
    expect(b.socFloorFraction).toBe(CHEMISTRY_PRESETS.lfp.socFloorFraction)
  })

  it('fills a lead-acid bank without a heater and with a 50 % floor', () => {
    for (const chemistry of ['agm', 'gel', 'flooded'] as const) {
      const r = parsePlan({
        ...clone(winterWeek),
        battery: { chemistry, cellsSeries: 6, cellsParallel: 1, capacityAh: 100 },
      })
      expect(r.ok).toBe(true)
      if (!r.ok) continue
      const b = fillPlanDefaults(r.plan).battery
      expect(b.nominalVoltageV).toBe(12)
      expect(b.socFloorFraction).toBe(0.5)
      expect(b.heater).toBeNull()
      expect(b.peukertExponent).toBeGreaterThan(1)
    }
  })

  it('applies a scenario usage override and expands a repeating week by weekday', () => {
    const r = parsePlan(clone(winterWeek))
    if (!r.ok) throw new Error('example invalid')
    const apps = applyScenarioUsage(r.plan.appliances, {
      fridge: { hoursPerDay: 12 },
      lights: { enabled: false },
    })
    const resolved = fillPlanDefaults({ ...r.plan, appliances: apps })
    expect(resolved.appliances.find((a) => a.id === 'fridge')?.hoursPerDay).toBe(12)
    expect(resolved.appliances.find((a) => a.id === 'lights')?.quantity).toBe(0)
    expect(resolved.appliances.find((a) => a.id === 'kettle')?.quantity).toBe(0) // disabled in the example
    const week = {
      kind: 'week' as const,
      days: [0, 1, 2, 3, 4, 5, 6].map((d) => ({ drivingHours: d, hookup: false })),
    }
    // 2027-02-08 is a Monday: day 0 takes Monday's entry, day 6 Sunday's.
    const w = fillPlanDefaults({ ...r.plan, trip: { ...r.plan.trip, days: 9, dayPlan: week } })
    expect(w.trip.dayPlan.map((d) => d.drivingHours)).toEqual([0, 1, 2, 3, 4, 5, 6, 0, 1])
  })
})
