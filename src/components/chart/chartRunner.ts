/**
 * One chart.js chart of a kind (chartKinds.ts), created once and then updated in place, on a canvas on the page
 * or on an OffscreenCanvas in the chart worker (chart.worker.ts): an update writes the new data arrays into
 * the chart's own dataset objects (matched by label, else by position), lets the kind adjust the few options
 * that depend on the data, and redraws with `update('none')` (no animation, no re-created chart). When the
 * kind's layout key and the canvas size are unchanged, the redraw keeps the last layout (chart.js's cancelable
 * `beforeLayout` hook) instead of measuring axes and legend again, which was most of a redraw's time.
 */
import { Chart, type ChartConfiguration, type ChartEvent, type Plugin } from 'chart.js'
import type { ChartKind } from './chartKinds'

import { mergeDatasets, type AnyDataset } from './chartData'

/** A pointer event on the chart, in CSS pixels from the canvas' top left (what chart.js reads of an event). */
export interface ChartPointer {
  /** chart.js's name for it (touchstart → mousedown, touchmove → mousemove, as its own page code maps them). */
  type: ChartEvent['type']
  /** The browser's name for it (chart.js filters events by it). */
  nativeType: string
  x: number
  y: number
}

export interface ChartRunner<I> {
  /** Redraws for new input. */
  update(input: I): void
  /** Sets the drawing size (CSS pixels) and pixel ratio and redraws; only on a worker's canvas. */
  resize(width: number, height: number, pixelRatio: number): void
  /** Hands a pointer event to the chart (tooltips, legend clicks); only on a worker's canvas. */
  pointer(e: ChartPointer): void
  destroy(): void
}

/**
 * A chart of `kind` drawn from `input` on `canvas`. On the page the chart sizes itself by its box (chart.js's
 * responsive mode) and listens to the pointer; on an OffscreenCanvas `size` gives its size and the page
 * forwards resizes and pointer events.
 */
export function createChartRunner<I>(
  canvas: HTMLCanvasElement | OffscreenCanvas,
  kind: ChartKind<I>,
  input: I,
  size?: { width: number; height: number; pixelRatio: number },
): ChartRunner<I> {
  /** The layout chart.js last computed: its key and canvas size; `keep` asks the next update to reuse it. */
  const layout = { key: '', width: -1, height: -1, keep: false }
  let current = input
  const keepLayout: Plugin = {
    id: 'owKeepLayout',
    beforeLayout: () => (layout.keep ? false : undefined),
    afterLayout: (c) => {
      layout.key = kind.layoutKey?.(current) ?? ''
      layout.width = c.width
      layout.height = c.height
    },
  }
  const base = kind.config(input)
  const options = { ...(base.options ?? {}) } as NonNullable<ChartConfiguration['options']>
  if (size) {
    // No DOM to observe in a worker: the page tells the size (resize below).
    options.responsive = false
    options.devicePixelRatio = size.pixelRatio
    canvas.width = Math.max(1, Math.round(size.width))
    canvas.height = Math.max(1, Math.round(size.height))
  }
  const config = {
    ...base,
    options,
    plugins: [...(base.plugins ?? []), keepLayout],
    data: kind.data(input),
  } as ChartConfiguration
  kind.tune?.(config.options as never, input)
  let chart: Chart | null = new Chart(canvas as HTMLCanvasElement, config)

  return {
    update(next) {
      if (!chart) return
      current = next
      const d = kind.data(next)
      const cd = chart.data as unknown as { labels?: unknown[]; datasets: AnyDataset[] }
      if (d.labels !== undefined) cd.labels = d.labels as unknown[]
      const count = cd.datasets.length
      cd.datasets = mergeDatasets(cd.datasets, d.datasets as unknown as AnyDataset[], {
        inPlace: (chart.options as { parsing?: unknown }).parsing === false,
      })
      kind.tune?.(chart.options as never, next)
      layout.keep =
        kind.layoutKey !== undefined &&
        cd.datasets.length === count &&
        layout.key === kind.layoutKey(next) &&
        layout.width === chart.width &&
        layout.height === chart.height
      chart.update('none')
      layout.keep = false
    },
    resize(width, height, pixelRatio) {
      if (!chart) return
      chart.options.devicePixelRatio = pixelRatio
      chart.resize(Math.max(1, Math.round(width)), Math.max(1, Math.round(height)))
    },
    pointer(e) {
      if (!chart) return
      // What chart.js's page code hands its event handler (platform.dom.js fromNativeEvent).
      const event = { type: e.type, chart, native: { type: e.nativeType }, x: e.x, y: e.y }
      ;(chart as unknown as { _eventHandler(e: unknown): void })._eventHandler(event)
    },
    destroy() {
      chart?.destroy()
      chart = null
    },
  }
}
