// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest'
import { tripInstant } from '../../src/components/chart/chartSetup'
import {
  formatAh,
  formatDays,
  formatEnergy,
  formatMass,
  formatNumber,
  formatPercent,
  formatTemperature,
  formatTripHour,
  formatTripMoment,
  formatWp,
  temperatureFromDisplay,
} from '../../src/components/outlook/format'
import { dayAxis, dayTickLabel } from '../../src/components/chart/chartSetup'

const metric = { unitSystem: 'metric', temperatureUnit: 'C' } as const
const imperial = { unitSystem: 'imperial', temperatureUnit: 'F' } as const

describe('key-figure formatting', () => {
  it('shows energy in Wh below 1 kWh and in kWh with one decimal above', () => {
    expect(formatEnergy(0)).toBe('0 Wh')
    expect(formatEnergy(849.6)).toBe('850 Wh')
    expect(formatEnergy(999.4)).toBe('999 Wh')
    expect(formatEnergy(999.6)).toBe('1.0 kWh')
    expect(formatEnergy(3600)).toBe('3.6 kWh')
    expect(formatEnergy(12_345)).toBe('12.3 kWh')
    expect(formatEnergy(123_456)).toBe('123 kWh')
    expect(formatEnergy(null)).toBe('—')
    expect(formatEnergy(Number.NaN)).toBe('—')
  })

  it('rounds capacity, array size and percentages to whole numbers with their units and thousands separators', () => {
    expect(formatAh(279.6)).toBe('280 Ah')
    expect(formatAh(1234)).toBe('1,234 Ah')
    expect(formatWp(410)).toBe('410 Wp')
    expect(formatWp(0)).toBe('0 Wp')
    expect(formatPercent(0.234)).toBe('23 %')
    expect(formatPercent(0.1)).toBe('10 %')
    expect(formatPercent(1)).toBe('100 %')
  })

  it('writes days with one decimal below ten, whole above, and "1 day" in the singular', () => {
    expect(formatDays(2.125)).toBe('2.1 days')
    expect(formatDays(1)).toBe('1 day')
    expect(formatDays(0.958)).toBe('1 day')
    expect(formatDays(0.5)).toBe('0.5 days')
    expect(formatDays(12.4)).toBe('12 days')
    expect(formatDays(null)).toBe('—')
  })

  it('shows temperatures in the user’s unit with the typographic minus', () => {
    expect(formatTemperature(-6, metric)).toBe('−6 °C')
    expect(formatTemperature(0, metric)).toBe('0 °C')
    expect(formatTemperature(-0.2, metric)).toBe('0 °C') // no "−0"
    // °F = °C × 9/5 + 32 (exact by definition): −6 °C = 21.2 °F, 0 °C = 32 °F, −40 °C = −40 °F.
    expect(formatTemperature(-6, imperial)).toBe('21 °F')
    expect(formatTemperature(0, imperial)).toBe('32 °F')
    expect(formatTemperature(-40, imperial)).toBe('−40 °F')
    expect(formatTemperature(3.3, imperial, 1)).toBe('37.9 °F')
    expect(temperatureFromDisplay(32, imperial)).toBe(0)
    expect(temperatureFromDisplay(-4, metric)).toBe(-4)
  })

  it('shows mass in kg or, for imperial users, in pounds (1 lb = 0.45359237 kg exactly)', () => {
    expect(formatMass(22, metric)).toBe('22 kg')
    expect(formatMass(22, imperial)).toBe('49 lb') // 22 / 0.45359237 = 48.5 lb
    expect(formatMass(100, imperial)).toBe('220 lb')
  })

  it('names a moment of the trip by the end of its hour, and a day’s last hour ends at 24:00 of that day', () => {
    // Hour 0 covers 00:00–01:00 of day 1 and ends at 01:00.
    expect(formatTripMoment(0)).toBe('day 1 at 01:00')
    expect(formatTripMoment(67)).toBe('day 3 at 20:00')
    // The last hour of day 1, and of a 7-day trip (hour 167): never "day 2 at 00:00" or "day 8 at 00:00".
    expect(formatTripMoment(23)).toBe('day 1 at 24:00')
    expect(formatTripMoment(7 * 24 - 1)).toBe('day 7 at 24:00')
    expect(formatTripHour(0)).toBe('Day 1, 00:00–01:00')
    expect(formatTripHour(167)).toBe('Day 7, 23:00–24:00')
    expect(formatNumber(-1234.5, 1)).toBe('−1,234.5')
  })

  it('labels the day axis where each day begins and the trip’s end as “end”, not a day after the trip', () => {
    expect(dayTickLabel(0, 7)).toBe('day 1')
    expect(dayTickLabel(6, 7)).toBe('day 7')
    expect(dayTickLabel(7, 7)).toBe('end')
    expect(dayTickLabel(28, 31)).toBe('day 29')
    expect(dayTickLabel(31, 31)).toBe('end')
  })

  it('keeps day-axis ticks on whole steps: no tick at 31 on a monthly trip, “end” on a 7-day trip', () => {
    const ticksFor = (days: number, values: number[]) => {
      const axis = dayAxis(days)
      const scale = { max: days, ticks: values.map((value) => ({ value })) }
      axis.afterBuildTicks(scale)
      return scale.ticks.map((t) => axis.ticks.callback.call({ max: days }, t.value))
    }
    expect(ticksFor(31, [0, 7, 14, 21, 28, 31])).toEqual(['day 1', 'day 8', 'day 15', 'day 22', 'day 29'])
    expect(ticksFor(7, [0, 1, 2, 3, 4, 5, 6, 7])).toEqual([
      'day 1',
      'day 2',
      'day 3',
      'day 4',
      'day 5',
      'day 6',
      'day 7',
      'end',
    ])
  })
})

describe('tripInstant (chart tooltips)', () => {
  it('names an instant as the end of the hour before it', () => {
    expect(tripInstant(0)).toBe('day 1 at 00:00')
    expect(tripInstant(6)).toBe('day 1 at 06:00')
    expect(tripInstant(7 * 24)).toBe('day 7 at 24:00')
  })
})
