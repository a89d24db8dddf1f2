/**
 * The Outlook's four kinds of chart, as plain functions of plain data: the chart.js configuration, the data,
 * the options that follow the data and the layout key (useChart.ts). Kept apart from the Chart*.vue
 * components so the same code draws a chart on the page's thread or in the chart worker (chart.worker.ts):
 * a component turns its props into the kind's input (numbers, strings and arrays only, so the input can be
 * posted to the worker as it is) and hands it over.
 */
import type { ChartConfiguration, ChartData, ChartOptions } from 'chart.js'
import {
  bandsPlugin,
  dayAxis,
  DASHES,
  hatch,
  hourlyLineBase,
  hourRanges,
  lineLegendLabels,
  RUN_LINE,
  runsPlugin,
  SERIES,
  SOURCE_LABELS,
  tripInstant,
  type BandOptions,
} from './chartSetup'
import { formatEnergy } from '../outlook/format'
import { loadsWh, type ApplianceShare, type DailyEnergyRow, type SocLine } from '../outlook/energy'

/** A chart's type, options and plugins (its data comes from `data`). */
export type KindConfig = Omit<ChartConfiguration<'line'>, 'data'> | Omit<ChartConfiguration<'bar'>, 'data'>

/** How one kind of chart is drawn from its input `I`. One per chart (it may keep caches of its own). */
export interface ChartKind<I> {
  /** Type, options and plugins; built once, when the chart is created. */
  config(input: I): KindConfig
  /** The data to draw. Called when the chart is created and on every redraw. */
  data(input: I): ChartData
  /** Options that follow the data (axis ends, band ranges), written into chart.options before a redraw. */
  tune?(options: ChartOptions, input: I): void
  /**
   * For charts whose axes and legend do not follow the data's values (fixed axis ends): a key of everything the
   * layout does depend on (axis ends, dataset labels). While it and the canvas size stay the same, a redraw
   * keeps the last layout instead of measuring axes and legend again (chartRunner.ts).
   */
  layoutKey?(input: I): string
}

export interface SocInput {
  lines: SocLine[]
  /** Sun elevation per hour of the first line's trip, for the night bands. [°] */
  sunElevationDeg?: number[]
}

export interface TemperatureInput {
  /** Pack temperature at the start of each hour, in the unit shown. */
  pack: number[]
  /** Outside air per hour, in the unit shown. */
  ambient: number[]
  /** Heater power per hour. [W] */
  heaterW: number[]
  /** 1 where charging was blocked by cold. */
  chargeBlockedCold: number[]
  /** Lowest pack temperature at which the cells may be charged, in the unit shown. */
  chargeMin: number
  /** The unit shown ("°C" or "°F"). */
  unit: string
}

export interface DailyInput {
  days: DailyEnergyRow[]
  /** Same top of scale for charts shown side by side. [Wh] */
  yMaxWh?: number
  /**
   * Series shown even where these days have none (charts side by side: the union of every chart's series,
   * so their legends, and with them their plot areas, are the same). Source kinds and `heater`.
   */
  keep?: string[]
}

export interface AppliancesInput {
  items: ApplianceShare[]
}

export interface ChartInputs {
  soc: SocInput
  temperature: TemperatureInput
  daily: DailyInput
  appliances: AppliancesInput
}
export type ChartKindName = keyof ChartInputs

type Pt = { x: number; y: number }

/** The day axis' end and tick step for a trip of `days` (hourly charts whose trip length may change). */
function tuneDayAxis(o: ChartOptions, days: number): void {
  const x = o.scales!.x as { max?: number; ticks: { stepSize?: number } }
  x.max = days
  x.ticks.stepSize = dayAxis(days).ticks.stepSize
}
type Plugins = ChartOptions<'line'>['plugins']

const LINE_COLOURS = [SERIES.soc, '#4d4d4d', SERIES.soc, '#4d4d4d']

/** Hourly state of charge: one line per scenario (dashes tell them apart), the floor, nights as grey bands. */
function socChart(): ChartKind<SocInput> {
  const days = (i: SocInput) => Math.max(1, ...i.lines.map((l) => l.socEndFraction.length / 24))
  // Night bands: recomputed only when the sun's series or the trip length changes, not on every move.
  let nightsFor: [number[] | undefined, number] | null = null
  let nights: [number, number][] = []
  const nightRanges = (i: SocInput): [number, number][] => {
    const el = i.sunElevationDeg
    const end = days(i)
    const same = nightsFor && nightsFor[1] === end && sameNumbers(nightsFor[0], el)
    if (!same) {
      nights = el ? hourRanges(Math.min(el.length, end * 24), (h) => el[h]! <= 0) : []
      nightsFor = [el, end]
    }
    return nights
  }
  return {
    data(input) {
      const datasets: ChartData<'line', Pt[]>['datasets'] = []
      const many = input.lines.length > 1
      input.lines.forEach((l, k) => {
        const soc = l.socEndFraction
        const pts = new Array<Pt>(soc.length + 1)
        pts[0] = { x: 0, y: l.startSocFraction * 100 }
        for (let i = 0; i < soc.length; i++) pts[i + 1] = { x: (i + 1) / 24, y: soc[i]! * 100 }
        datasets.push({
          label: many ? l.label : 'State of charge',
          data: pts,
          borderColor: LINE_COLOURS[k % 4],
          backgroundColor: LINE_COLOURS[k % 4],
          borderDash: DASHES[k % 4],
          borderWidth: many ? 2.5 : 2,
          pointRadius: 0,
          tension: 0,
          ...RUN_LINE,
        })
      })
      const floors = [...new Set(input.lines.map((l) => l.socFloorFraction))]
      const end = days(input)
      floors.forEach((f) => {
        const owners = input.lines.filter((l) => l.socFloorFraction === f).map((l) => l.label)
        datasets.push({
          label: floors.length > 1 ? `Floor ${Math.round(f * 100)} % (${owners.join(', ')})` : 'SOC floor',
          data: [
            { x: 0, y: f * 100 },
            { x: end, y: f * 100 },
          ],
          borderColor: '#B23A3A',
          backgroundColor: '#B23A3A',
          borderDash: [6, 6],
          borderWidth: 1.5,
          pointRadius: 0,
        })
      })
      return { datasets } as ChartData
    },
    // Both axes have fixed ends (0–100 %, the trip's days): only these and the legend's entries shape the layout.
    layoutKey: (i) =>
      JSON.stringify([days(i), i.lines.map((l) => [l.label, l.socFloorFraction]), i.lines.length]),
    tune(o, input) {
      tuneDayAxis(o, days(input))
      const bands = (o.plugins as { owBands: { bands: BandOptions[] } }).owBands.bands
      bands[0]!.ranges = nightRanges(input)
    },
    config: (input) => ({
      type: 'line',
      plugins: [bandsPlugin, runsPlugin],
      options: {
        ...hourlyLineBase(),
        scales: {
          x: dayAxis(days(input)),
          y: {
            min: 0,
            max: 100,
            grid: { color: SERIES.grid },
            ticks: { stepSize: 25, callback: (v) => `${v} %` },
            title: { display: true, text: 'State of charge' },
          },
        },
        plugins: {
          legend: { position: 'bottom', labels: lineLegendLabels() },
          tooltip: {
            callbacks: {
              // Points sit at the end of each hour (x = (i + 1) / 24).
              title: (items) => tripInstant(Math.round((items[0]?.parsed.x ?? 0) * 24)),
              label: (item) => `${item.dataset.label}: ${Math.round(item.parsed.y ?? 0)} %`,
            },
          },
          owBands: { bands: [{ ranges: [], color: SERIES.night }] },
        } as Plugins,
      } as ChartOptions<'line'>,
    }),
  }
}

/** The temperature chart's y axis moves in whole steps of this many degrees (in the unit shown). */
const Y_STEP = 5

/**
 * Pack and ambient temperature by hour, heater-on hours (vermillion strip along the bottom) and the hours
 * charging was blocked by cold (hatched bands).
 */
function temperatureChart(): ChartKind<TemperatureInput> {
  const hours = (i: TemperatureInput) => i.pack.length
  const days = (i: TemperatureInput) => Math.max(1, hours(i) / 24)
  const blockedPattern = hatch('rgba(61, 90, 128, 0.55)', 'rgba(61, 90, 128, 0.08)')
  /**
   * The y axis' ends: the data's range widened to whole steps, so a "Try a change" move that shifts the
   * pack's curve a little keeps the same axis and the chart keeps its layout.
   */
  function yBounds(i: TemperatureInput): { min: number; max: number } {
    let lo = i.chargeMin
    let hi = i.chargeMin
    for (const series of [i.pack, i.ambient])
      for (const v of series) {
        if (v < lo) lo = v
        if (v > hi) hi = v
      }
    if (!Number.isFinite(lo) || !Number.isFinite(hi)) return { min: 0, max: Y_STEP }
    const min = Math.floor(lo / Y_STEP) * Y_STEP
    const max = Math.ceil(hi / Y_STEP) * Y_STEP
    return { min, max: max > min ? max : min + Y_STEP }
  }
  return {
    data(input) {
      const n = hours(input)
      const pack = new Array<Pt>(n)
      const amb = new Array<Pt>(n)
      for (let i = 0; i < n; i++) {
        pack[i] = { x: i / 24, y: input.pack[i]! }
        amb[i] = { x: (i + 0.5) / 24, y: input.ambient[i]! }
      }
      const limit = input.chargeMin
      return {
        datasets: [
          {
            label: 'Pack',
            data: pack,
            borderColor: '#1d2424',
            backgroundColor: '#1d2424',
            borderWidth: 2,
            pointRadius: 0,
            ...RUN_LINE,
          },
          {
            label: 'Outside air',
            data: amb,
            borderColor: '#7a8585',
            backgroundColor: '#7a8585',
            borderDash: [5, 4],
            borderWidth: 1.5,
            pointRadius: 0,
            ...RUN_LINE,
          },
          {
            label: `Lowest charging temperature (${Math.round(limit)} ${input.unit})`,
            data: [
              { x: 0, y: limit },
              { x: days(input), y: limit },
            ],
            borderColor: '#3D5A80',
            backgroundColor: '#3D5A80',
            borderDash: [2, 3],
            borderWidth: 1.5,
            pointRadius: 0,
          },
          // Legend entries for the bands drawn by the plugin.
          {
            label: 'Heater on',
            data: [],
            backgroundColor: SERIES.heater,
            borderColor: SERIES.heater,
            borderWidth: 0,
          },
          {
            label: 'Charging blocked by cold',
            data: [],
            backgroundColor: blockedPattern as unknown as string,
            borderColor: '#3D5A80',
            borderWidth: 1,
          },
        ],
      } as ChartData
    },
    layoutKey(i) {
      const y = yBounds(i)
      return JSON.stringify([days(i), y.min, y.max, i.unit, Math.round(i.chargeMin)])
    },
    tune(o, input) {
      tuneDayAxis(o, days(input))
      const y = o.scales!.y as { min?: number; max?: number }
      const b = yBounds(input)
      y.min = b.min
      y.max = b.max
      const n = hours(input)
      const { chargeBlockedCold: blocked, heaterW: heater } = input
      const bands = (o.plugins as { owBands: { bands: BandOptions[] } }).owBands.bands
      bands[0]!.ranges = hourRanges(n, (i) => blocked[i] === 1)
      bands[1]!.ranges = hourRanges(n, (i) => (heater[i] ?? 0) > 0)
    },
    config: (input) => ({
      type: 'line',
      plugins: [bandsPlugin, runsPlugin],
      options: {
        ...hourlyLineBase(),
        scales: {
          x: dayAxis(days(input)),
          y: {
            grid: { color: SERIES.grid },
            ticks: { callback: (v) => `${v} ${input.unit}` },
            title: { display: true, text: 'Temperature' },
          },
        },
        plugins: {
          legend: { position: 'bottom', labels: lineLegendLabels() },
          tooltip: {
            filter: (item) => item.datasetIndex < 2,
            callbacks: {
              // The pack's temperature is taken at the start of each hour (x = i / 24).
              title: (items) => tripInstant(Math.floor((items[0]?.parsed.x ?? 0) * 24)),
              label: (item) => `${item.dataset.label}: ${(item.parsed.y ?? 0).toFixed(1)} ${input.unit}`,
            },
          },
          owBands: {
            bands: [
              { ranges: [], color: blockedPattern },
              { ranges: [], color: SERIES.heater, heightFraction: 0.05 },
            ],
          },
        } as Plugins,
      } as ChartOptions<'line'>,
    }),
  }
}

const SOURCE_KINDS = ['solar', 'dcdc', 'shore', 'generator'] as const

/**
 * Daily energy in by source (left bar of each day, solid) against energy out (right bar, hatched): loads (sky
 * blue) and the heater pad (vermillion). Sources with nothing to show are left out.
 */
function dailyChart(): ChartKind<DailyInput> {
  const loadsPattern = hatch('#2b7fae', SERIES.loads)
  const heaterPattern = hatch('#8a3c00', SERIES.heater)
  return {
    data({ days, keep }) {
      const labels = days.map((d) => `day ${d.day + 1}`)
      const datasets: ChartData<'bar', number[], string>['datasets'] = []
      for (const k of SOURCE_KINDS) {
        const values = days.map((d) => d.inWh[k])
        if (values.every((v) => v <= 0.5) && !keep?.includes(k)) continue
        datasets.push({
          label: `In: ${SOURCE_LABELS[k]}`,
          data: values,
          backgroundColor: SERIES[k],
          stack: 'in',
        })
      }
      datasets.push({
        label: 'Out: loads',
        data: days.map(loadsWh),
        backgroundColor: loadsPattern as unknown as string,
        borderColor: '#2b7fae',
        borderWidth: 1,
        stack: 'out',
      })
      if (days.some((d) => d.heaterWh > 0.5) || keep?.includes('heater'))
        datasets.push({
          label: 'Out: heater pad',
          data: days.map((d) => d.heaterWh),
          backgroundColor: heaterPattern as unknown as string,
          borderColor: '#8a3c00',
          borderWidth: 1,
          stack: 'out',
        })
      return { labels, datasets } as ChartData
    },
    tune(o, input) {
      ;(o.scales!.y as { max?: number }).max = input.yMaxWh
    },
    config: () => ({
      type: 'bar',
      options: {
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        scales: {
          x: { stacked: true, grid: { display: false }, ticks: { maxRotation: 0, autoSkipPadding: 10 } },
          y: {
            stacked: true,
            grid: { color: SERIES.grid },
            ticks: { callback: (v) => formatEnergy(Number(v)) },
            title: { display: true, text: 'Energy per day' },
          },
        },
        plugins: {
          legend: { position: 'bottom', labels: { boxWidth: 16, boxHeight: 12 } },
          tooltip: { callbacks: { label: (i) => `${i.dataset.label}: ${formatEnergy(i.parsed.y ?? 0)}` } },
        },
      } as ChartOptions<'bar'>,
    }),
  }
}

/** Where the energy goes: one horizontal bar per appliance (and the system's own draws), largest first. */
function appliancesChart(): ChartKind<AppliancesInput> {
  const heaterPattern = hatch('#8a3c00', SERIES.heater)
  const colour = (k: ApplianceShare['kind']) =>
    k === 'heater' ? (heaterPattern as unknown as string) : k === 'system' ? '#9aa5a5' : SERIES.loads
  return {
    data: ({ items }) =>
      ({
        labels: items.map((i) => i.name),
        datasets: [
          {
            label: 'Energy over the trip',
            data: items.map((i) => i.energyWh),
            backgroundColor: items.map((i) => colour(i.kind)),
            borderColor: items.map((i) => (i.kind === 'heater' ? '#8a3c00' : 'transparent')),
            borderWidth: 1,
          },
        ],
      }) as ChartData,
    config: () => ({
      type: 'bar',
      options: {
        indexAxis: 'y',
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        scales: {
          x: {
            grid: { color: SERIES.grid },
            ticks: { callback: (v) => formatEnergy(Number(v)), maxRotation: 0, autoSkipPadding: 16 },
          },
          y: { grid: { display: false }, ticks: { autoSkip: false } },
        },
        plugins: {
          legend: { display: false },
          tooltip: { callbacks: { label: (i) => formatEnergy(i.parsed.x ?? 0) } },
        },
      } as ChartOptions<'bar'>,
    }),
  }
}

/** A new chart of the named kind (each call its own caches). */
export const CHART_KINDS: { [K in ChartKindName]: () => ChartKind<ChartInputs[K]> } = {
  soc: socChart,
  temperature: temperatureChart,
  daily: dailyChart,
  appliances: appliancesChart,
}

/** Equal number arrays (or both missing): an input posted to the worker is a copy, so identity is lost. */
function sameNumbers(a: number[] | undefined, b: number[] | undefined): boolean {
  if (a === b) return true
  if (!a || !b || a.length !== b.length) return false
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false
  return true
}
