import { describe, expect, it } from 'vitest'
import { compareWithPlan, plannedPackDays } from './compare'
import { calibrateUsage } from './calibrate'
import type { LogDay } from './types'

const logDay = (date: string, inWh: number, outWh: number, coveredH = 24): LogDay => ({
  date,
  sampleCount: 1440,
  coveredH,
  energyInWh: inWh,
  energyOutWh: outWh,
  socMinFraction: null,
  socMaxFraction: null,
  packVoltageMinV: 13,
  packVoltageMaxV: 13.5,
  cellSpreadMaxMv: null,
  cellSpreadTypicalMv: null,
  cellSpreadP95Mv: null,
  temperatureMinC: null,
  temperatureMaxC: null,
})

describe('plannedPackDays', () => {
  it('nets sources against loads each hour, at the battery terminals', () => {
    const sourceW = { solar: new Array(48).fill(0), dcdc: new Array(48).fill(0) }
    const loadW = { fridge: new Array(48).fill(10) }
    sourceW.solar[12] = 110 // +100 W net in that hour
    sourceW.dcdc[30] = 60 // +50 W net on day 2
    const days = plannedPackDays({
      series: { sourceW, loadW },
      days: [{ date: '2026-01-12' }, { date: '2026-01-13' }],
    })
    expect(days).toEqual([
      { date: '2026-01-12', inWh: 100, outWh: 230 },
      { date: '2026-01-13', inWh: 50, outWh: 230 },
    ])
  })
})

describe('compareWithPlan', () => {
  const plan = [
    { date: '2026-01-12', inWh: 500, outWh: 600 },
    { date: '2026-01-13', inWh: 500, outWh: 600 },
  ]
  it('aligns by date, leaves partial days out of the ratio, and suggests a calibration', () => {
    const c = compareWithPlan(
      [logDay('2026-01-11', 10, 10, 3), logDay('2026-01-12', 480, 780), logDay('2026-01-13', 520, 780)],
      plan,
    )
    expect(c.alignment).toBe('date')
    expect(c.rows[0]!.planDay).toBeNull()
    expect(c.totals.days).toBe(2)
    expect(c.useRatio).toBeCloseTo(1.3, 9)
    expect(c.headline).toBe(
      'Over 2 full days: use from the pack is 30 % above plan, and charge is close to plan.',
    )
    expect(c.suggestion?.message).toMatch(/^Measured use is 30 % above plan/)
  })
  it('aligns by order when no date meets, and stays quiet when close to plan', () => {
    const c = compareWithPlan([logDay('2025-07-01', 500, 610), logDay('2025-07-02', 500, 590)], plan)
    expect(c.alignment).toBe('order')
    expect(c.rows.map((r) => r.planDay)).toEqual([1, 2])
    expect(c.suggestion).toBeNull()
  })
})

describe('calibrateUsage', () => {
  const appliances = [
    { id: 'fridge', hoursPerDay: 24, startHour: 0, endHour: 0, dutyCycleFraction: 0.25 },
    { id: 'lights', hoursPerDay: 4, startHour: 18, endHour: 23 },
    { id: 'kettle', hoursPerDay: 0.2, startHour: 7, endHour: 9 },
  ]
  it('scales hours, and the duty cycle once the window is full; keeps disabled ones off', () => {
    const r = calibrateUsage(appliances, { kettle: { enabled: false } }, 1.3)
    expect(r.usage.fridge).toEqual({ hoursPerDay: 24, dutyCycleFraction: 0.325 })
    expect(r.usage.lights).toEqual({ hoursPerDay: 5, dutyCycleFraction: 1 })
    expect(r.capped).toEqual(['lights'])
    expect(r.usage.kettle).toEqual({ enabled: false })
  })
  it('scales down by hours', () => {
    expect(calibrateUsage(appliances, {}, 0.5).usage.lights).toEqual({ hoursPerDay: 2 })
  })
})
