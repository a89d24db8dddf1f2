/**
 * The chart kinds (src/components/chart/chartKinds.ts) are plain functions of plain input, so the chart worker
 * draws from a posted copy exactly what the page would draw: the input survives structuredClone and gives the
 * same data, options and layout key; the temperature axis moves in whole 5-degree steps (a small shift of the
 * curve keeps the layout); the night bands follow the sun series by value, not by identity.
 */
import { describe, expect, it } from 'vitest'
import type { ChartOptions } from 'chart.js'
import { CHART_KINDS, type ChartInputs, type ChartKindName } from '../../src/components/chart/chartKinds'

const hours = 48
const socInput: ChartInputs['soc'] = {
  lines: [
    {
      label: 'State of charge',
      startSocFraction: 0.9,
      socEndFraction: Array.from({ length: hours }, (_, i) => 0.9 - i * 0.01),
      socFloorFraction: 0.2,
    },
  ],
  // Up from 06:00 to 18:00 each day.
  sunElevationDeg: Array.from({ length: hours }, (_, i) => (i % 24 >= 6 && i % 24 < 18 ? 30 : -10)),
}
const temperatureInput = (shift = 0): ChartInputs['temperature'] => ({
  pack: Array.from({ length: hours }, (_, i) => 4 + shift + Math.sin(i / 4)),
  ambient: Array.from({ length: hours }, (_, i) => -6 + 3 * Math.sin(i / 4)),
  heaterW: Array.from({ length: hours }, (_, i) => (i % 24 < 4 ? 20 : 0)),
  chargeBlockedCold: Array.from({ length: hours }, (_, i) => (i % 24 === 5 ? 1 : 0)),
  chargeMin: 0,
  unit: '°C',
})
const dailyInput: ChartInputs['daily'] = {
  days: [0, 1].map((day) => ({
    day,
    inWh: { solar: 900 + day, dcdc: 0, shore: 0, generator: 0 },
    outWh: { fridge: 400, heater: 120 },
    heaterWh: 120,
  })),
}
const appliancesInput: ChartInputs['appliances'] = {
  items: [
    { name: 'Fridge', energyWh: 800, kind: 'appliance' },
    { name: 'Heater pad', energyWh: 240, kind: 'heater' },
  ],
}
const inputs: { [K in ChartKindName]: ChartInputs[K] } = {
  soc: socInput,
  temperature: temperatureInput(),
  daily: dailyInput,
  appliances: appliancesInput,
}

/** What a chart of `kind` is given: its options after tune, its data and its layout key. */
function drawnFrom<K extends ChartKindName>(name: K, input: ChartInputs[K]) {
  const kind = CHART_KINDS[name]()
  const config = kind.config(input)
  const options = config.options as ChartOptions
  kind.tune?.(options, input)
  return { options, data: kind.data(input), key: kind.layoutKey?.(input) }
}
/** Functions and canvas patterns compared by kind only (the callbacks are new closures per chart). */
const comparable = (v: unknown): unknown =>
  JSON.parse(JSON.stringify(v, (_k, x) => (typeof x === 'function' ? 'function' : x)))

describe('chart kinds draw the same from a posted copy of their input', () => {
  for (const name of Object.keys(inputs) as ChartKindName[])
    it(`${name}: structuredClone of the input gives the same data, options and layout key`, () => {
      const input = inputs[name]
      const copy = structuredClone(input)
      expect(copy).not.toBe(input)
      const a = drawnFrom(name, input as never)
      const b = drawnFrom(name, copy as never)
      expect(comparable(b.data)).toEqual(comparable(a.data))
      expect(comparable(b.options)).toEqual(comparable(a.options))
      expect(b.key).toBe(a.key)
      expect((a.data.datasets as unknown[]).length).toBeGreaterThan(0)
    })
})

describe('temperature chart', () => {
  it('puts the y axis on whole 5-degree steps around the data and the charging limit', () => {
    const { options } = drawnFrom('temperature', temperatureInput())
    const y = options.scales!.y as { min: number; max: number }
    // Data from −9 (ambient) to 5 (pack), limit 0: −10 … 5.
    expect(y).toMatchObject({ min: -10, max: 5 })
  })
  it('keeps its layout key for a shift inside the step and changes it when the range crosses a step', () => {
    const base = drawnFrom('temperature', temperatureInput()).key
    expect(drawnFrom('temperature', temperatureInput(-0.5)).key).toBe(base)
    expect(drawnFrom('temperature', temperatureInput(1)).key).not.toBe(base)
  })
  it('bands the heater-on and cold-blocked hours', () => {
    const { options } = drawnFrom('temperature', temperatureInput())
    const bands = (options.plugins as unknown as { owBands: { bands: { ranges: number[][] }[] } }).owBands
      .bands
    // Blocked: hour 5 of each day; heater: hours 0–3 of each day (in days from the start).
    expect(bands[0]!.ranges).toEqual([
      [5 / 24, 6 / 24],
      [29 / 24, 30 / 24],
    ])
    expect(bands[1]!.ranges).toEqual([
      [0, 4 / 24],
      [1, 28 / 24],
    ])
  })
})

describe('state-of-charge chart', () => {
  it('shades the nights from the sun series, the same for an equal copy of it', () => {
    const kind = CHART_KINDS.soc()
    const options = kind.config(socInput).options as ChartOptions
    const ranges = () =>
      (options.plugins as unknown as { owBands: { bands: { ranges: number[][] }[] } }).owBands.bands[0]!
        .ranges
    kind.tune!(options, socInput)
    const first = ranges()
    expect(first).toEqual([
      [0, 6 / 24],
      [18 / 24, 30 / 24],
      [42 / 24, 2],
    ])
    kind.tune!(options, structuredClone(socInput))
    expect(ranges()).toEqual(first)
    // A different sun series (a later start) gives other bands.
    kind.tune!(options, { ...socInput, sunElevationDeg: socInput.sunElevationDeg!.map(() => 30) })
    expect(ranges()).toEqual([])
  })
})

describe('daily energy chart', () => {
  const labels = (input: ChartInputs['daily']) =>
    (drawnFrom('daily', input).data.datasets as { label: string }[]).map((d) => d.label)
  it('shows only the series these days have', () => {
    const noHeater = { days: dailyInput.days.map((d) => ({ ...d, heaterWh: 0 })) }
    expect(labels(noHeater)).toEqual(['In: Solar', 'Out: loads'])
  })
  it('keeps the series other charts beside it have, so the legends and plot areas match (Side by side)', () => {
    const noHeater = { days: dailyInput.days.map((d) => ({ ...d, heaterWh: 0 })) }
    const kept = labels({ ...noHeater, keep: ['heater', 'shore', 'solar'] })
    expect(kept).toEqual(['In: Solar', 'In: Shore power', 'Out: loads', 'Out: heater pad'])
    const { options } = drawnFrom('daily', { ...noHeater, yMaxWh: 4800 })
    expect((options.scales!.y as { max?: number }).max).toBe(4800)
  })
})
