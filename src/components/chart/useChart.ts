/**
 * One chart.js chart on a canvas, created once and then updated in place: a change writes the new data
 * arrays into the chart's own dataset objects (matched by label, else by position), lets the component
 * adjust the few options that depend on the data, and redraws with `update('none')` (no animation, no
 * re-created chart, no re-resolved options objects from Vue). Nothing chart.js touches is made reactive.
 * A change that leaves the chart's figures as they were (a new result with the same numbers) is not redrawn.
 * A chart scrolled out of view redraws in idle time or when it comes near the viewport (whenVisible.ts).
 */
import { markRaw, onBeforeUnmount, onMounted, watch, type Ref } from 'vue'
import { Chart, type ChartConfiguration, type ChartData, type ChartType, type Plugin } from 'chart.js'
import { useVisibleWork } from './whenVisible'

export interface ChartSpec<T extends ChartType> {
  canvas: Ref<HTMLCanvasElement | null>
  /** The element whose visibility decides whether a change redraws at once (the chart's box). */
  box: Ref<HTMLElement | null>
  /** Type, options and plugins; built once, when the chart is created. */
  config: () => Omit<ChartConfiguration<T>, 'data'>
  /** The data to draw now. Called when the chart is created and on every redraw. */
  data: () => ChartData<T>
  /** Options that follow the data (axis ends, band ranges), written into chart.options before a redraw. */
  tune?: (options: NonNullable<ChartConfiguration<T>['options']>) => void
  /** What the chart draws: a change of any of these redraws it (unless the values are equal to the drawn ones). */
  sources: (() => unknown)[]
  /**
   * For charts whose axes and legend do not follow the data's values (fixed axis ends): a key of everything the
   * layout does depend on (axis ends, dataset labels). While it and the canvas size stay the same, a redraw
   * keeps the last layout (chart.js's cancelable `beforeLayout` hook) instead of measuring axes and legend
   * again, which was most of a redraw's time on a "Try a change" move.
   */
  layoutKey?: () => string
}

export type AnyDataset = Record<string, unknown> & { label?: string }

/**
 * Writes `next` into the chart's dataset objects, keeping their identity (chart.js keeps each dataset's
 * state, such as hidden from the legend, by object): matched by label first, then, when the number of
 * datasets is unchanged, by position (a label that carries a value, such as the charging limit); others are
 * new objects.
 */
export function mergeDatasets(
  current: AnyDataset[],
  next: AnyDataset[],
  options: { inPlace?: boolean } = {},
): AnyDataset[] {
  const used = new Set<AnyDataset>()
  const matches: (AnyDataset | undefined)[] = next.map((n) => {
    const m = current.find((c) => !used.has(c) && c.label !== undefined && c.label === n.label)
    if (m) used.add(m)
    return m
  })
  if (current.length === next.length)
    matches.forEach((m, i) => {
      if (!m && !used.has(current[i]!)) used.add((matches[i] = current[i]!))
    })
  return next.map((n, i) => {
    const match = matches[i]
    if (!match) return { ...n }
    for (const k of Object.keys(match)) if (!(k in n)) delete match[k]
    const kept = options.inPlace ? match.data : undefined
    Object.assign(match, n)
    if (kept !== undefined && copyPoints(kept, n.data)) match.data = kept
    return match
  })
}

/**
 * With chart.js's `parsing: false` the chart reads each {x, y} point object itself: writing the new values
 * into the points it already holds (same array, same objects) spares it re-reading a new array and rebuilding
 * its per-point state on every redraw. Only for equal lengths of {x, y} points; returns whether it copied.
 */
function copyPoints(into: unknown, from: unknown): boolean {
  if (!Array.isArray(into) || !Array.isArray(from) || into.length !== from.length || into.length === 0)
    return false
  const a = into as { x: unknown; y: unknown }[]
  const b = from as { x: unknown; y: unknown }[]
  if (typeof a[0] !== 'object' || typeof b[0] !== 'object' || a[0] === null || b[0] === null) return false
  for (let i = 0; i < a.length; i++) {
    a[i]!.x = b[i]!.x
    a[i]!.y = b[i]!.y
  }
  return true
}

/** Same numbers, strings and shapes (arrays and plain objects compared by content, functions by identity). */
export function sameData(a: unknown, b: unknown): boolean {
  if (a === b) return true
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) return false
    for (let i = 0; i < a.length; i++) if (!sameData(a[i], b[i])) return false
    return true
  }
  if (Array.isArray(b)) return false
  const ka = Object.keys(a)
  if (ka.length !== Object.keys(b).length) return false
  for (const k of ka)
    if (!sameData((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k])) return false
  return true
}

export function useChart<T extends ChartType>(spec: ChartSpec<T>): { chart: () => Chart<T> | null } {
  let chart: Chart<T> | null = null
  /** The sources' values the chart was last drawn from. */
  let drawn: unknown[] = []
  const read = () => spec.sources.map((s) => s())

  /** The layout chart.js last computed: its key and canvas size; `keep` asks the next update to reuse it. */
  const layout = { key: '', width: -1, height: -1, keep: false }
  const keepLayout: Plugin = {
    id: 'owKeepLayout',
    beforeLayout: () => (layout.keep ? false : undefined),
    afterLayout: (c) => {
      layout.key = spec.layoutKey?.() ?? ''
      layout.width = c.width
      layout.height = c.height
    },
  }

  function redraw(): void {
    if (!chart) return
    const t0 = performance.now()
    const now = read()
    if (sameData(now, drawn)) return
    drawn = now
    const d = spec.data()
    const cd = chart.data as unknown as { labels?: unknown[]; datasets: AnyDataset[] }
    if (d.labels !== undefined) cd.labels = d.labels as unknown[]
    const count = cd.datasets.length
    cd.datasets = mergeDatasets(cd.datasets, d.datasets as unknown as AnyDataset[], {
      inPlace: (chart.options as { parsing?: unknown }).parsing === false,
    })
    if (spec.tune && chart.options) spec.tune(chart.options as never)
    layout.keep =
      spec.layoutKey !== undefined &&
      cd.datasets.length === count &&
      layout.key === spec.layoutKey() &&
      layout.width === chart.width &&
      layout.height === chart.height
    chart.update('none')
    layout.keep = false
    // For npm run bench:whatif (and the browser's performance panel): the charts' share of a move.
    performance.measure?.('ow-chart-redraw', { start: t0, end: performance.now() })
  }
  const work = useVisibleWork(spec.box, redraw)

  onMounted(() => {
    if (!spec.canvas.value) return
    drawn = read()
    const base = spec.config()
    const config = {
      ...base,
      plugins: [...(base.plugins ?? []), keepLayout],
      data: spec.data(),
    } as ChartConfiguration<T>
    if (spec.tune && config.options) spec.tune(config.options as never)
    chart = markRaw(new Chart(spec.canvas.value, config)) as Chart<T>
  })
  onBeforeUnmount(() => {
    chart?.destroy()
    chart = null
  })
  // After Vue's own update of this flush, in the same task: the chart is drawn before the next frame.
  watch(spec.sources, () => work.schedule(), { flush: 'post' })
  return { chart: () => chart }
}
