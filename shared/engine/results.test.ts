import { describe, expect, it } from 'vitest'
import { resultsToJson, roundFigure, tripMoment } from './results.ts'

// The JSON form's rounding rule is our own (shared/engine/results.ts): fractions to 1e-6, other figures to a
// thousandth of their unit, the echoed plan untouched.
describe('resultsToJson', () => {
  it('rounds fractions to 1e-6 and other figures to 1e-3, typed arrays included', () => {
    const json = resultsToJson({
      lowestSocFraction: 0.69343560848107,
      inWh: { solar: 3131.045768156885 },
      series: { socEndFraction: new Float64Array([0.7843209637853391]), loadW: [26.999999999999996] },
    })
    expect(json.lowestSocFraction).toBe(0.693436)
    expect(json.inWh.solar).toBe(3131.046)
    expect(json.series.socEndFraction).toEqual([0.784321])
    expect(json.series.loadW).toEqual([27])
  })

  it('keeps integers, the echoed plan and big magnitudes; non-finite becomes null; never -0', () => {
    const json = resultsToJson({
      plan: { trip: { latitudeDeg: 68.23456789 } },
      day: 3,
      hugeWh: 1234567890.123,
      bad: Number.NaN,
      tinyW: -0.0000001,
    })
    expect(json.plan.trip.latitudeDeg).toBe(68.23456789)
    expect(json.day).toBe(3)
    expect(json.hugeWh).toBe(1234567890.123)
    expect(json.bad).toBeNull()
    expect(Object.is(json.tinyW, 0)).toBe(true)
    expect(roundFigure(Number.POSITIVE_INFINITY, 1e3)).toBeNull()
  })
})

describe('tripMoment', () => {
  // Our own rule (shared/engine/results.ts): a clock time names the end of an hour of the run.
  it('names the end of the hour; the last hour of a day ends at 24:00 of that day', () => {
    expect(tripMoment(0)).toBe('day 1 at 01:00')
    expect(tripMoment(77)).toBe('day 4 at 06:00')
    expect(tripMoment(7 * 24 - 1)).toBe('day 7 at 24:00')
  })
})
