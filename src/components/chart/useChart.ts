/**
 * One Outlook chart in a component: the component gives the kind (chartKinds.ts) and a function of its props
 * that returns the kind's input; this draws it and redraws it when the input's figures change (not for a new
 * result with the same numbers). Where the browser can (OffscreenCanvas and module workers), the chart is
 * drawn in the chart worker (chart.worker.ts), so a "Try a change" move costs the page only posting the new
 * figures; otherwise (and in component tests) on the page's thread with the same code (chartRunner.ts).
 * A chart scrolled out of view redraws in idle time or when it comes near the viewport (whenVisible.ts).
 */
import { onBeforeUnmount, onMounted, ref, toRaw, watch, type Ref } from 'vue'
import type { ChartInputs, ChartKindName } from './chartKinds'
import type { ChartPointer, ChartRunner } from './chartRunner'
import { sameData } from './chartData'
import type { ChartWorkerMessage, ChartWorkerReply } from './chart.worker'
import { useVisibleWork } from './whenVisible'

export { mergeDatasets, sameData, type AnyDataset } from './chartData'

export interface ChartSpec<K extends ChartKindName> {
  kind: K
  canvas: Ref<HTMLCanvasElement | null>
  /** The element whose visibility decides whether a change redraws at once (the chart's box); sized by CSS. */
  box: Ref<HTMLElement | null>
  /** The chart's input now: plain numbers, strings and arrays (it may be posted to the worker). */
  input: () => ChartInputs[K]
}

/** Where a chart is drawn. */
export type ChartPlace = 'worker' | 'page'

/** Whether this browser can draw charts in a worker: OffscreenCanvas, transferControlToOffscreen and Worker. */
export function canDrawInWorker(): boolean {
  return (
    typeof Worker !== 'undefined' &&
    typeof OffscreenCanvas !== 'undefined' &&
    typeof HTMLCanvasElement !== 'undefined' &&
    'transferControlToOffscreen' in HTMLCanvasElement.prototype &&
    !workerFailed
  )
}

/** The chart worker, shared by every chart of the page; started with the first chart. */
let worker: Worker | null = null
let workerFailed = false
let nextId = 1
const listeners = new Map<number, (r: ChartWorkerReply) => void>()
/** Charts to move to the page's thread if the worker fails (their canvases were handed over). */
const onWorkerFailure = new Set<() => void>()

function chartWorker(): Worker {
  if (worker) return worker
  const w = new Worker(new URL('./chart.worker.ts', import.meta.url), { type: 'module' })
  w.onmessage = (e: MessageEvent<ChartWorkerReply>) => listeners.get(e.data.id)?.(e.data)
  w.onerror = (e) => {
    // The worker could not start or threw outside a message: draw every chart on the page from now on.
    e.preventDefault?.()
    workerFailed = true
    worker = null
    w.terminate()
    for (const f of [...onWorkerFailure]) f()
  }
  worker = w
  return w
}

/** Deep plain copy of reactive data (Vue proxies cannot be posted); plain arrays and objects pass through. */
function plain<T>(v: T): T {
  const raw = toRaw(v) as unknown
  if (Array.isArray(raw)) {
    const a = raw as unknown[]
    return (typeof a[0] === 'object' && a[0] !== null ? a.map(plain) : a) as T
  }
  if (typeof raw === 'object' && raw !== null) {
    const out: Record<string, unknown> = {}
    for (const [k, x] of Object.entries(raw)) out[k] = plain(x)
    return out as T
  }
  return raw as T
}

/** Calls `cb` whenever window.devicePixelRatio changes (browser zoom, a screen with another density). */
function watchPixelRatio(cb: () => void): () => void {
  if (typeof matchMedia === 'undefined') return () => {}
  let query: MediaQueryList | null = null
  const onChange = () => {
    cb()
    arm()
  }
  const arm = () => {
    query?.removeEventListener('change', onChange)
    query = matchMedia(`(resolution: ${window.devicePixelRatio || 1}dppx)`)
    query.addEventListener('change', onChange)
  }
  arm()
  return () => query?.removeEventListener('change', onChange)
}

export function useChart<K extends ChartKindName>(
  spec: ChartSpec<K>,
): { place: Ref<ChartPlace | null>; canvasKey: Ref<number> } {
  /** The input the chart was last drawn from. */
  let drawn: ChartInputs[K] | null = null
  /** Where the chart is drawn (null until mounted). */
  const place = ref<ChartPlace | null>(null)
  /** Changes when the canvas must be replaced (a canvas handed to a failed worker cannot be drawn on again). */
  const canvasKey = ref(0)

  // On the page's thread.
  let runner: ChartRunner<ChartInputs[K]> | null = null
  // In the worker: the chart's id there; at most one update in flight, the latest waiting input behind it.
  const id = nextId++
  let seq = 0
  let inFlight = false
  let waiting: ChartInputs[K] | null = null
  let resizeObserver: ResizeObserver | null = null
  let unwatchRatio: (() => void) | null = null
  let unmounted = false

  function send(m: ChartWorkerMessage, transfer: Transferable[] = []): void {
    worker?.postMessage(m, transfer)
  }
  function onReply(r: ChartWorkerReply): void {
    if (r.type === 'error') {
      console.error(`chart ${spec.kind}: ${r.message}`)
      // The chart does not exist in the worker: draw it on the page instead.
      if (r.fatal) return fallBack()
    }
    if (r.seq === seq) inFlight = false
    if (!inFlight && waiting) {
      const next = waiting
      waiting = null
      post(next)
    }
    if (r.type === 'drawn') {
      // For npm run bench:whatif and the browser's performance panel: when the worker finished drawing.
      const end = r.endEpochMs - performance.timeOrigin
      performance.measure?.('ow-chart-redraw', { start: Math.max(0, end - r.ms), end })
      performance.mark?.('ow-chart-drawn', { startTime: Math.max(0, end) })
    }
  }
  function post(input: ChartInputs[K]): void {
    const next = seq + 1
    send({ type: 'update', id, input: input as never, seq: next })
    seq = next
    inFlight = true
  }

  async function startOnPage(canvas: HTMLCanvasElement, input: ChartInputs[K]): Promise<void> {
    const [{ CHART_KINDS }, { createChartRunner }] = await Promise.all([
      import('./chartKinds'),
      import('./chartRunner'),
    ])
    if (unmounted) return
    runner = createChartRunner(canvas, CHART_KINDS[spec.kind]() as never, input)
    place.value = 'page'
    // A change that came while chart.js was loading.
    redraw()
  }

  function startInWorker(canvas: HTMLCanvasElement, box: HTMLElement, input: ChartInputs[K]): void {
    const w = chartWorker()
    listeners.set(id, onReply)
    onWorkerFailure.add(fallBack)
    const offscreen = canvas.transferControlToOffscreen()
    const rect = box.getBoundingClientRect()
    inFlight = true
    w.postMessage(
      {
        type: 'create',
        id,
        kind: spec.kind,
        canvas: offscreen,
        input: input as never,
        width: rect.width,
        height: rect.height,
        pixelRatio: window.devicePixelRatio || 1,
        seq: ++seq,
      } satisfies ChartWorkerMessage,
      [offscreen],
    )
    let last = { width: rect.width, height: rect.height, pixelRatio: window.devicePixelRatio || 1 }
    const sizeChanged = () => {
      const r = box.getBoundingClientRect()
      const next = { width: r.width, height: r.height, pixelRatio: window.devicePixelRatio || 1 }
      if (next.width === last.width && next.height === last.height && next.pixelRatio === last.pixelRatio)
        return
      last = next
      if (next.width > 0 && next.height > 0) send({ type: 'resize', id, ...next, seq: ++seq })
    }
    resizeObserver = new ResizeObserver(sizeChanged)
    resizeObserver.observe(box)
    // Zoom or a move to another screen changes the pixel ratio without resizing the box.
    unwatchRatio = watchPixelRatio(sizeChanged)
    place.value = 'worker'
  }

  /** The worker failed: a new canvas (the old one was handed over) and the chart on the page's thread. */
  function fallBack(): void {
    stopWorkerPart()
    place.value = null
    canvasKey.value++
    // After Vue has put the new canvas in place.
    requestAnimationFrame(() => {
      if (unmounted || !spec.canvas.value) return
      drawn = plain(spec.input())
      void startOnPage(spec.canvas.value, drawn)
    })
  }
  function stopWorkerPart(): void {
    resizeObserver?.disconnect()
    resizeObserver = null
    unwatchRatio?.()
    unwatchRatio = null
    listeners.delete(id)
    onWorkerFailure.delete(fallBack)
    inFlight = false
    waiting = null
  }

  function redraw(): void {
    if (!place.value) return
    const now = spec.input()
    if (drawn !== null && sameData(now, drawn)) return
    if (place.value === 'page') {
      const t0 = performance.now()
      drawn = now
      runner?.update(now)
      performance.measure?.('ow-chart-redraw', { start: t0, end: performance.now() })
      return
    }
    drawn = plain(now)
    if (inFlight) waiting = drawn
    else post(drawn)
  }
  const work = useVisibleWork(spec.box, redraw)

  onMounted(() => {
    const canvas = spec.canvas.value
    const box = spec.box.value
    if (!canvas || !box) return
    drawn = plain(spec.input())
    if (canDrawInWorker()) {
      try {
        return startInWorker(canvas, box, drawn)
      } catch (e) {
        // The canvas may have been handed over already: a new one, drawn on the page.
        console.error('charts: drawing on the page', e)
        return fallBack()
      }
    }
    void startOnPage(canvas, drawn)
  })
  onBeforeUnmount(() => {
    unmounted = true
    if (place.value === 'worker') send({ type: 'destroy', id })
    stopWorkerPart()
    runner?.destroy()
    runner = null
  })
  // After Vue's own update of this flush, in the same task: the chart is drawn (or posted) before the next frame.
  watch(spec.input, () => work.schedule(), { flush: 'post' })

  /** Pointer events for a chart in the worker: tooltips and legend clicks (chart.js's own events there). */
  function forwardPointer(canvas: HTMLCanvasElement): () => void {
    const types: Record<string, ChartPointer['type']> = {
      mousemove: 'mousemove',
      mouseout: 'mouseout',
      click: 'click',
      touchstart: 'mousedown',
      touchmove: 'mousemove',
    }
    let frame = 0
    let pendingMove: ChartPointer | null = null
    const handler = (e: Event) => {
      if (place.value !== 'worker') return
      const rect = canvas.getBoundingClientRect()
      const at = 'touches' in e ? (e as TouchEvent).touches[0] : (e as MouseEvent)
      if (!at) return
      const ev: ChartPointer = {
        type: types[e.type]!,
        nativeType: e.type,
        x: at.clientX - rect.left,
        y: at.clientY - rect.top,
      }
      // Moves at most once a frame, like chart.js on the page; other events at once (a move still waiting
      // for its frame is dropped when the pointer leaves, so it cannot bring the tooltip back).
      if (ev.type === 'mouseout' && frame) {
        cancelAnimationFrame(frame)
        frame = 0
        pendingMove = null
      }
      if (ev.type === 'mousemove') {
        pendingMove = ev
        if (!frame)
          frame = requestAnimationFrame(() => {
            frame = 0
            if (pendingMove) send({ type: 'pointer', id, event: pendingMove })
            pendingMove = null
          })
        return
      }
      send({ type: 'pointer', id, event: ev })
    }
    for (const t of Object.keys(types)) canvas.addEventListener(t, handler, { passive: true })
    return () => {
      for (const t of Object.keys(types)) canvas.removeEventListener(t, handler)
      if (frame) cancelAnimationFrame(frame)
    }
  }
  let unforward: (() => void) | null = null
  watch(place, (p) => {
    unforward?.()
    unforward = p === 'worker' && spec.canvas.value ? forwardPointer(spec.canvas.value) : null
  })
  onBeforeUnmount(() => unforward?.())

  return { place, canvasKey }
}
