/**
 * chart.js set-up shared by the Chart*.vue components: only the pieces we draw with are registered, no
 * animation (screenshots and the what-if benchmark must see the final frame), our fixed series colours
 * (Okabe–Ito, DESIGN.md) and a plugin that shades nights.
 */
import {
  Chart,
  BarController,
  BarElement,
  CategoryScale,
  Legend,
  LineController,
  LineElement,
  LinearScale,
  PointElement,
  Tooltip,
  type Plugin,
} from 'chart.js'
import { tripMoment } from '@shared/engine/results'

Chart.register(
  BarController,
  BarElement,
  CategoryScale,
  Legend,
  LineController,
  LineElement,
  LinearScale,
  PointElement,
  Tooltip,
)
Chart.defaults.font.family = 'Nunito, system-ui, sans-serif'
Chart.defaults.font.size = 12
Chart.defaults.color = '#3b4444'
Chart.defaults.animation = false

export { SERIES, SOURCE_LABELS, DASHES, hatch } from './chartStyle'
import { SERIES } from './chartStyle'

export interface BandOptions {
  /** [startX, endX) ranges in x-axis units. */
  ranges: [number, number][]
  color: string | CanvasPattern
  /** Only this share of the plot's height, from the bottom (a strip). Default 1. */
  heightFraction?: number
}

/** Draws vertical bands (nights, blocked hours) behind the datasets; options under plugins.owBands. */
export const bandsPlugin: Plugin = {
  id: 'owBands',
  beforeDatasetsDraw(chart, _args, options) {
    const o = options as unknown as { bands?: BandOptions[] }
    const x = chart.scales.x
    const area = chart.chartArea
    if (!x || !o.bands) return
    const ctx = chart.ctx
    ctx.save()
    for (const band of o.bands) {
      ctx.fillStyle = band.color
      for (const [a, b] of band.ranges) {
        const left = Math.max(area.left, x.getPixelForValue(a))
        const right = Math.min(area.right, x.getPixelForValue(b))
        const h = (area.bottom - area.top) * (band.heightFraction ?? 1)
        if (right > left) ctx.fillRect(left, area.bottom - h, right - left, h)
      }
    }
    ctx.restore()
  },
}

/**
 * Legend labels that show what is drawn: each line as one stroke with its dataset's dash pattern (a filled box
 * hides the dashes, and a box of no height strokes its top and bottom edges over each other, which fills the
 * gaps in); a dataset without points (the key to bands a plugin draws) as a strip of its fill.
 */
export function lineLegendLabels() {
  return {
    usePointStyle: true,
    pointStyle: 'line' as const,
    pointStyleWidth: 32,
    generateLabels: (chart: Chart) =>
      Chart.defaults.plugins.legend.labels.generateLabels(chart).map((l) => {
        const ds = chart.data.datasets[l.datasetIndex ?? 0] as
          { data?: unknown[]; borderDash?: number[]; borderColor?: unknown } | undefined
        if (ds && Array.isArray(ds.data) && ds.data.length === 0)
          return { ...l, pointStyle: 'rect' as const, lineDash: [], lineWidth: 1 }
        return {
          ...l,
          pointStyle: 'line' as const,
          lineDash: ds?.borderDash ?? [],
          strokeStyle: (ds?.borderColor as string | undefined) ?? l.strokeStyle,
          fillStyle: 'rgba(0, 0, 0, 0)',
          lineWidth: 2,
        }
      }),
  }
}

/** Points per stroke of a long line drawn by runsPlugin. */
export const RUN_POINTS = 32

/**
 * Long hourly lines stroked in short runs of points instead of one path: Chromium without a GPU rasterises
 * one long, wide, antialiased path far more slowly than the same line as short paths (a 2 px line of 745
 * points: about half the time; npm run bench:whatif). A dataset with `owRuns: true` and `showLine: false` is
 * drawn here, after the others and first dataset on top (chart.js's order); the legend and the tooltips
 * still read its style and points from chart.js. Dashes continue across runs (lineDashOffset).
 */
export const runsPlugin: Plugin = {
  id: 'owRuns',
  afterDatasetsDraw(chart) {
    const area = chart.chartArea
    const ctx = chart.ctx
    ctx.save()
    ctx.beginPath()
    ctx.rect(area.left, area.top, area.right - area.left, area.bottom - area.top)
    ctx.clip()
    const sets = chart.data.datasets as unknown as RunDataset[]
    for (let i = sets.length - 1; i >= 0; i--) {
      const ds = sets[i]!
      if (!ds.owRuns || !chart.isDatasetVisible(i)) continue
      strokeRuns(ctx, chart.getDatasetMeta(i).data as unknown as RunPoint[], ds)
    }
    ctx.restore()
  },
}

/** Spread into a line dataset to have runsPlugin draw it (the extra key is ours; chart.js ignores it). */
export const RUN_LINE = { showLine: false, owRuns: true } as { showLine: false }

type RunDataset = { owRuns?: boolean; borderColor?: unknown; borderWidth?: number; borderDash?: number[] }
type RunPoint = { x: number; y: number; skip?: boolean }

/** Strokes `pts` in runs of RUN_POINTS segments, breaking at skipped (missing) points. */
export function strokeRuns(ctx: CanvasRenderingContext2D, pts: RunPoint[], ds: RunDataset): void {
  const dash = ds.borderDash ?? []
  ctx.strokeStyle = (ds.borderColor as string) ?? '#000'
  ctx.lineWidth = ds.borderWidth ?? 1
  ctx.setLineDash(dash)
  ctx.lineJoin = 'miter'
  // Round ends hide the seam where two runs meet on a bend; dashes keep chart.js's square ends.
  ctx.lineCap = dash.length ? 'butt' : 'round'
  let offset = 0
  let inRun = 0
  let last: RunPoint | null = null
  ctx.beginPath()
  for (const p of pts) {
    if (p.skip || !Number.isFinite(p.x) || !Number.isFinite(p.y)) {
      if (inRun > 0) ctx.stroke()
      ctx.beginPath()
      inRun = 0
      last = null
      continue
    }
    if (!last) {
      ctx.lineDashOffset = offset
      ctx.moveTo(p.x, p.y)
    } else {
      ctx.lineTo(p.x, p.y)
      if (dash.length) offset += Math.hypot(p.x - last.x, p.y - last.y)
      if (++inRun >= RUN_POINTS) {
        ctx.stroke()
        ctx.beginPath()
        ctx.lineDashOffset = offset
        ctx.moveTo(p.x, p.y)
        inRun = 0
      }
    }
    last = p
  }
  if (inRun > 0) ctx.stroke()
}

/** Runs of hours where `test(i)` holds, as [start, end) in days from the trip start. */
export function hourRanges(n: number, test: (i: number) => boolean): [number, number][] {
  const out: [number, number][] = []
  let start = -1
  for (let i = 0; i <= n; i++) {
    const on = i < n && test(i)
    if (on && start < 0) start = i
    if (!on && start >= 0) {
      out.push([start / 24, i / 24])
      start = -1
    }
  }
  return out
}

/**
 * An instant of the trip for a tooltip, `h` hours after local midnight of day 1: the end of hour h − 1 in the
 * Outlook's words ("day 7 at 24:00" rather than "day 8, 00:00"); the trip's first instant is day 1 at 00:00.
 */
export function tripInstant(h: number): string {
  return h <= 0 ? 'day 1 at 00:00' : tripMoment(h - 1)
}

/**
 * What every hourly line chart shares: sized by its box, no animation, points given as {x, y} already (no
 * parsing; points are updated in place, useChart.ts), and tooltips for the nearest hour.
 */
export function hourlyLineBase() {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false as const,
    parsing: false as const,
    normalized: true,
    interaction: { mode: 'nearest' as const, axis: 'x' as const, intersect: false },
  }
}

/** Tick spacing of the day axis: every day up to two weeks, then weekly, then monthly. [day] */
function dayStep(days: number): number {
  return days > 60 ? 30 : days > 14 ? 7 : 1
}

/**
 * The label of a day-axis tick at `value` days from the trip start: a tick marks where a day begins
 * ("day 1" at 0, "day 2" at 1), and the trip's last tick marks its end ("end", never "day 8" on a 7-day trip).
 */
export function dayTickLabel(value: number, tripDays: number): string {
  return value >= tripDays - 1e-9 ? 'end' : `day ${Math.round(value) + 1}`
}

/**
 * x-axis in days from the trip start, ticks where days begin (every day, week or month), and the end of the
 * trip marked "end" when it falls on a tick. The trip's length is read from the axis' own max when the
 * labels are drawn, so a chart whose trip length changes (Side by side) labels its ticks right.
 */
export function dayAxis(days: number) {
  return {
    type: 'linear' as const,
    min: 0,
    max: days,
    grid: { color: SERIES.grid },
    ticks: {
      stepSize: dayStep(days),
      callback(this: { max: number }, v: number | string) {
        return dayTickLabel(Number(v), this.max)
      },
      maxRotation: 0,
      autoSkipPadding: 12,
    },
    // chart.js adds a tick at the axis' max even off the step (31 on a monthly trip): keep only whole steps.
    afterBuildTicks(scale: { max: number; ticks: { value: number }[] }) {
      const step = dayStep(scale.max)
      scale.ticks = scale.ticks.filter((t) => Math.abs(t.value / step - Math.round(t.value / step)) < 1e-9)
    },
    title: { display: false, text: '' },
  }
}
