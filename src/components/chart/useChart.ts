/**
 * One chart.js chart on a canvas, created once and then updated in place: a change writes the new data
 * arrays into the chart's own dataset objects (matched by label, else by position), lets the component
 * adjust the few options that depend on the data, and redraws with `update('none')` (no animation, no
 * re-created chart, no re-resolved options objects from Vue). Nothing chart.js touches is made reactive.
 * A change that leaves the chart's figures as they were (a new result with the same numbers) is not redrawn.
 * A chart scrolled out of view redraws in idle time or when it comes near the viewport (whenVisible.ts).
 */
import { markRaw, onBeforeUnmount, onMounted, watch, type Ref } from 'vue'
import { Chart, type ChartConfiguration, type ChartData, type ChartType } from 'chart.js'
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
}

export type AnyDataset = Record<string, unknown> & { label?: string }

/**
 * Writes `next` into the chart's dataset objects, keeping their identity (chart.js keeps each dataset's
 * state, such as hidden from the legend, by object): matched by label first, then, when the number of
 * datasets is unchanged, by position (a label that carries a value, such as the charging limit); others are
 * new objects.
 */
export function mergeDatasets(current: AnyDataset[], next: AnyDataset[]): AnyDataset[] {
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
    return Object.assign(match, n)
  })
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

  function redraw(): void {
    if (!chart) return
    const t0 = performance.now()
    const now = read()
    if (sameData(now, drawn)) return
    drawn = now
    const d = spec.data()
    const cd = chart.data as unknown as { labels?: unknown[]; datasets: AnyDataset[] }
    if (d.labels !== undefined) cd.labels = d.labels as unknown[]
    cd.datasets = mergeDatasets(cd.datasets, d.datasets as unknown as AnyDataset[])
    if (spec.tune && chart.options) spec.tune(chart.options as never)
    chart.update('none')
    // For npm run bench:whatif (and the browser's performance panel): the charts' share of a move.
    performance.measure?.('ow-chart-redraw', { start: t0, end: performance.now() })
  }
  const work = useVisibleWork(spec.box, redraw)

  onMounted(() => {
    if (!spec.canvas.value) return
    drawn = read()
    const config = { ...spec.config(), data: spec.data() } as ChartConfiguration<T>
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
