import { describe, expect, it } from 'vitest'
import { integrateEnergyWh, intervalEnergyWh, type PowerSample } from './energy'
import { DailySummarizer } from './daily'

// Hand calculations (energy balance, no empirical model): Wh = W × h for each straight-line piece of power.
const MIN = 60_000

/** 12.8 V; +20 A for the samples at 0…60 min, then −10 A for the samples at 61…180 min (one per minute). */
function stepProfile(startMs = 0): PowerSample[] {
  const out: PowerSample[] = []
  for (let m = 0; m <= 180; m++)
    out.push({ tsMs: startMs + m * MIN, packVoltageV: 12.8, currentA: m <= 60 ? 20 : -10 })
  return out
}

describe('intervalEnergyWh', () => {
  it('integrates a constant power as W × h', () => {
    expect(intervalEnergyWh(100, 100, 3600)).toEqual({ inWh: 100, outWh: 0 })
    expect(intervalEnergyWh(-50, -50, 1800)).toEqual({ inWh: 0, outWh: 25 })
  })
  it('cuts an interval where the power line crosses zero', () => {
    // 100 W → −100 W over 1 h: two triangles of 0.5 h × 100 W / 2 = 25 Wh each.
    const e = intervalEnergyWh(100, -100, 3600)
    expect(e.inWh).toBeCloseTo(25, 12)
    expect(e.outWh).toBeCloseTo(25, 12)
  })
})

describe('integrateEnergyWh', () => {
  it('equals the hand calculation for a charge-then-discharge step profile', () => {
    // In:  60 min × 256 W = 256 Wh, plus the crossing minute 256 W → −128 W (zero at 2/3 of it):
    //      256 / 2 × (2/3) / 60 h = 1.42222 Wh.                                    → 257.42222 Wh
    // Out: 119 min × 128 W = 253.86667 Wh, plus 128 / 2 × (1/3) / 60 h = 0.35556 Wh → 254.22222 Wh
    const e = integrateEnergyWh(stepProfile())
    expect(e.inWh).toBeCloseTo(256 + (128 * (2 / 3)) / 60, 9)
    expect(e.outWh).toBeCloseTo((119 * 128) / 60 + (64 * (1 / 3)) / 60, 9)
    expect(e.inWh).toBeCloseTo(257.42222, 4)
    expect(e.outWh).toBeCloseTo(254.22222, 4)
  })

  it('is exact for a current ramp (trapezoids of a straight line): 12 V, 0 → 10 A over 1 h = 60 Wh', () => {
    const samples = Array.from({ length: 13 }, (_, k) => ({
      tsMs: k * 5 * MIN,
      packVoltageV: 12,
      currentA: (10 * k) / 12,
    }))
    expect(integrateEnergyWh(samples).inWh).toBeCloseTo(60, 9)
  })

  it('skips intervals longer than the allowed gap', () => {
    const samples = [
      { tsMs: 0, packVoltageV: 12, currentA: -10 },
      { tsMs: 60 * MIN, packVoltageV: 12, currentA: -10 },
      { tsMs: 600 * MIN, packVoltageV: 12, currentA: -10 },
    ]
    expect(integrateEnergyWh(samples, 3600).outWh).toBeCloseTo(120, 9)
  })
})

describe('DailySummarizer energy', () => {
  it('splits an interval that crosses midnight and keeps the total', () => {
    // Start at 22:30 UTC, so the profile runs over midnight (offset 0).
    const start = Date.UTC(2026, 0, 10, 22, 30)
    const sum = new DailySummarizer(0, 60)
    for (const s of stepProfile(start))
      sum.add({ ...s, socFraction: null, temperaturesC: null, cellVoltagesV: null })
    const days = sum.finish()
    expect(days.map((d) => d.date)).toEqual(['2026-01-10', '2026-01-11'])
    // 22:30–23:30 charging (256 Wh) lies in the first day with 30 min of discharge: 30 × 128 / 60 = 64 Wh less the crossing bits.
    expect(days[0]!.energyInWh + days[1]!.energyInWh).toBeCloseTo(257.42, 1)
    expect(days[0]!.energyOutWh + days[1]!.energyOutWh).toBeCloseTo(254.22, 1)
    expect(days[0]!.energyInWh).toBeCloseTo(257.42, 1)
    // First day ends at 00:00 = minute 90: discharge minutes 61…90 → 29 × 128 / 60 + 0.35556.
    expect(days[0]!.energyOutWh).toBeCloseTo((29 * 128) / 60 + 64 / 180, 1)
    expect(days[0]!.coveredH + days[1]!.coveredH).toBeCloseTo(3, 6)
  })

  it('follows the monitor clock: with +60 min the same instants fall on one local day', () => {
    const start = Date.UTC(2026, 0, 10, 22, 30)
    const sum = new DailySummarizer(60, 60)
    for (const s of stepProfile(start))
      sum.add({ ...s, socFraction: null, temperaturesC: null, cellVoltagesV: null })
    expect(sum.finish().map((d) => d.date)).toEqual(['2026-01-10', '2026-01-11'])
    const sum2 = new DailySummarizer(-120, 60)
    for (const s of stepProfile(start))
      sum2.add({ ...s, socFraction: null, temperaturesC: null, cellVoltagesV: null })
    expect(sum2.finish().map((d) => d.date)).toEqual(['2026-01-10'])
  })
})

describe('DailySummarizer statistics', () => {
  it('reports SOC range, temperature range and cell spread (highest, typical, 95th percentile)', () => {
    const sum = new DailySummarizer(0, 60)
    const t0 = Date.UTC(2026, 0, 12)
    for (let k = 0; k < 100; k++) {
      const spreadMv = k === 50 ? 40 : 4 + (k % 3) // one spike of 40 mV, otherwise 4–6 mV
      sum.add({
        tsMs: t0 + k * MIN,
        packVoltageV: 13.2,
        currentA: -2,
        socFraction: 0.9 - k * 0.001,
        temperaturesC: [10 + k * 0.1, 4],
        cellVoltagesV: [3.3, 3.3, 3.3, 3.3 + spreadMv / 1000],
      })
    }
    const [d] = sum.finish()
    expect(d!.socMaxFraction).toBeCloseTo(0.9, 6)
    expect(d!.socMinFraction).toBeCloseTo(0.801, 6)
    expect(d!.temperatureMinC).toBe(4)
    expect(d!.temperatureMaxC).toBeCloseTo(19.9, 6)
    expect(d!.cellSpreadMaxMv).toBeCloseTo(40, 1)
    expect(d!.cellSpreadTypicalMv).toBeCloseTo(5, 1)
    expect(d!.cellSpreadP95Mv).toBeCloseTo(6, 1)
    expect(d!.energyOutWh).toBeCloseTo((99 * 13.2 * 2) / 60, 6)
  })
})
