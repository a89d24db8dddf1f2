import { describe, expect, it } from 'vitest'
import { resultsToJson, roundFigure } from './results.ts'

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
