import { describe, expect, it } from 'vitest'
import { cellSpreadTrend, leastSquares } from './trend'
import type { LogDay } from './types'

function day(date: string, p95: number | null): LogDay {
  return {
    date,
    sampleCount: 1440,
    coveredH: 24,
    energyInWh: 0,
    energyOutWh: 0,
    socMinFraction: null,
    socMaxFraction: null,
    packVoltageMinV: 13,
    packVoltageMaxV: 13.5,
    cellSpreadMaxMv: p95,
    cellSpreadTypicalMv: p95,
    cellSpreadP95Mv: p95,
    temperatureMinC: null,
    temperatureMaxC: null,
  }
}
const dates = (n: number) => Array.from({ length: n }, (_, i) => `2026-01-${String(i + 1).padStart(2, '0')}`)

describe('leastSquares', () => {
  it('recovers a straight line exactly', () => {
    const fit = leastSquares([0, 1, 2, 3], [5, 7, 9, 11])
    expect(fit.slope).toBeCloseTo(2, 12)
    expect(fit.intercept).toBeCloseTo(5, 12)
    expect(fit.r2).toBeCloseTo(1, 12)
  })
})

describe('cellSpreadTrend', () => {
  it('flags a spread that grows day after day, in plain words', () => {
    const t = cellSpreadTrend(dates(14).map((d, i) => day(d, 6 + 2 * i + (i % 2 ? 1 : -1))))
    expect(t.status).toBe('drifting')
    expect(t.slopeMvPerDay!).toBeCloseTo(2, 0)
    expect(t.message).toMatch(/drifting/)
    expect(t.message).toMatch(/weaker|out of balance/)
  })
  it('calls a few steady millivolts healthy', () => {
    const t = cellSpreadTrend(dates(10).map((d, i) => day(d, 5 + (i % 3))))
    expect(t.status).toBe('steady')
  })
  it('does not claim a trend from noise', () => {
    const noisy = [5, 30, 6, 28, 7, 31, 5, 29]
    expect(cellSpreadTrend(dates(8).map((d, i) => day(d, noisy[i]!))).status).toBe('steady')
  })
  it('notes a wide but steady spread', () => {
    expect(cellSpreadTrend(dates(6).map((d) => day(d, 60))).status).toBe('wide')
  })
  it('needs enough days with cell voltages', () => {
    expect(cellSpreadTrend(dates(3).map((d) => day(d, 5))).status).toBe('not_enough_data')
    expect(cellSpreadTrend(dates(5).map((d) => day(d, null))).message).toMatch(/no cell voltages/)
  })
})
