/**
 * The Outlook's charts drawn off the page's thread: each chart's canvas is handed over as an OffscreenCanvas
 * (canvas.transferControlToOffscreen) and chart.js draws into it here, so a "Try a change" move costs the page
 * only posting the new figures; the browser shows each new picture when this worker has drawn it. The page
 * forwards size changes and pointer events (tooltips, legend clicks). One worker draws every chart of a page.
 *
 * Messages in:  ChartWorkerMessage (create / update / resize / pointer / destroy)
 * Messages out: ChartWorkerReply ({ type: 'drawn', id, seq, ms, endEpochMs } after each drawing, or 'error')
 */
import nunito400 from '@fontsource/nunito/files/nunito-latin-400-normal.woff2?url'
import nunito700 from '@fontsource/nunito/files/nunito-latin-700-normal.woff2?url'
import nunitoExt400 from '@fontsource/nunito/files/nunito-latin-ext-400-normal.woff2?url'
import nunitoExt700 from '@fontsource/nunito/files/nunito-latin-ext-700-normal.woff2?url'
import { CHART_KINDS, type ChartInputs, type ChartKindName } from './chartKinds'
import { createChartRunner, type ChartPointer, type ChartRunner } from './chartRunner'

export type ChartWorkerMessage =
  | {
      type: 'create'
      id: number
      kind: ChartKindName
      canvas: OffscreenCanvas
      input: ChartInputs[ChartKindName]
      width: number
      height: number
      pixelRatio: number
      seq: number
    }
  | { type: 'update'; id: number; input: ChartInputs[ChartKindName]; seq: number }
  | { type: 'resize'; id: number; width: number; height: number; pixelRatio: number; seq: number }
  | { type: 'pointer'; id: number; event: ChartPointer }
  | { type: 'destroy'; id: number }

export type ChartWorkerReply =
  /** A drawing finished: how long it took and when it ended (epoch ms, the page converts it to its clock). */
  | { type: 'drawn'; id: number; seq: number; ms: number; endEpochMs: number }
  /**
   * A message failed: `seq` is the failed drawing's (or -1 for a pointer event); `fatal` when the chart does
   * not exist here (its creation failed), so the page draws it itself.
   */
  | { type: 'error'; id: number; seq: number; message: string; fatal: boolean }

const scope = self as unknown as {
  postMessage(m: ChartWorkerReply): void
  onmessage: ((e: MessageEvent<ChartWorkerMessage>) => void) | null
  fonts?: { add(f: FontFace): void }
}

/**
 * Nunito for the charts' text, as on the page (boot/quasar.ts loads it there): the regular and bold Latin
 * faces chart.js uses (tooltip titles are bold), loaded before the first chart is drawn; a face that fails
 * to load leaves the fallback sans-serif.
 */
const LATIN =
  'U+0000-00FF,U+0131,U+0152-0153,U+02BB-02BC,U+02C6,U+02DA,U+02DC,U+0304,U+0308,U+0329,U+2000-206F,U+20AC,U+2122,U+2191,U+2193,U+2212,U+2215,U+FEFF,U+FFFD'
const LATIN_EXT =
  'U+0100-02BA,U+02BD-02C5,U+02C7-02CC,U+02CE-02D7,U+02DD-02FF,U+1E00-1E9F,U+1EF2-1EFF,U+2020,U+20A0-20AB,U+20AD-20C0,U+2113,U+2C60-2C7F,U+A720-A7FF'
function loadFonts(): Promise<unknown> {
  if (!scope.fonts || typeof FontFace === 'undefined') return Promise.resolve()
  const faces = [
    [nunito400, '400', LATIN],
    [nunito700, '700', LATIN],
    [nunitoExt400, '400', LATIN_EXT],
    [nunitoExt700, '700', LATIN_EXT],
  ].map(([url, weight, unicodeRange]) => {
    const f = new FontFace('Nunito', `url(${url})`, { weight, unicodeRange })
    scope.fonts!.add(f)
    return f.load().catch(() => undefined)
  })
  return Promise.all(faces)
}
/** The charts wait at most this long for the fonts, then draw with the fallback face. [ms] */
const FONT_WAIT_MS = 1500
const fontsReady = Promise.race([loadFonts(), new Promise((r) => setTimeout(r, FONT_WAIT_MS))])

const charts = new Map<number, ChartRunner<unknown>>()

function drawn(id: number, seq: number, t0: number): void {
  const t1 = performance.now()
  scope.postMessage({ type: 'drawn', id, seq, ms: t1 - t0, endEpochMs: performance.timeOrigin + t1 })
}

function handle(m: ChartWorkerMessage): void {
  const t0 = performance.now()
  switch (m.type) {
    case 'create': {
      const kind = CHART_KINDS[m.kind]() as never
      const runner = createChartRunner(m.canvas, kind, m.input, {
        width: m.width,
        height: m.height,
        pixelRatio: m.pixelRatio,
      })
      charts.set(m.id, runner as ChartRunner<unknown>)
      return drawn(m.id, m.seq, t0)
    }
    case 'update': {
      const c = charts.get(m.id)
      if (!c) throw new MissingChart()
      c.update(m.input)
      return drawn(m.id, m.seq, t0)
    }
    case 'resize': {
      const c = charts.get(m.id)
      if (!c) throw new MissingChart()
      c.resize(m.width, m.height, m.pixelRatio)
      return drawn(m.id, m.seq, t0)
    }
    case 'pointer':
      return charts.get(m.id)?.pointer(m.event)
    case 'destroy':
      charts.get(m.id)?.destroy()
      charts.delete(m.id)
      return
  }
}

/** An update or resize for a chart whose creation failed. */
class MissingChart extends Error {
  constructor() {
    super('no such chart here')
  }
}

// Messages wait for the fonts once; after that they run in the order they came.
scope.onmessage = (e) => {
  void fontsReady.then(() => {
    const m = e.data
    try {
      handle(m)
    } catch (err) {
      scope.postMessage({
        type: 'error',
        id: m.id,
        seq: 'seq' in m ? m.seq : -1,
        message: err instanceof Error ? err.message : String(err),
        fatal: m.type === 'create' || err instanceof MissingChart,
      })
    }
  })
}
