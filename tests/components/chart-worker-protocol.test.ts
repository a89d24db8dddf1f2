// @vitest-environment happy-dom
/**
 * How a chart component talks to the chart worker (src/components/chart/useChart.ts), against a stand-in
 * Worker that records what it is sent and answers as the test says: the canvas is handed over once with the
 * first input; while a drawing is in flight, further changes wait and only the latest is sent; a failed
 * drawing still lets the waiting one go; a chart the worker cannot draw moves to a new canvas on the page;
 * unmounting destroys the worker's chart.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { mount, type VueWrapper } from '@vue/test-utils'
import { nextTick } from 'vue'
import type { ChartWorkerMessage, ChartWorkerReply } from '../../src/components/chart/chart.worker'
import type { SocLine } from '../../src/components/outlook/energy'

class FakeWorker {
  static last: FakeWorker | null = null
  sent: ChartWorkerMessage[] = []
  transferred: unknown[] = []
  onmessage: ((e: { data: ChartWorkerReply }) => void) | null = null
  onerror: ((e: unknown) => void) | null = null
  constructor() {
    FakeWorker.last = this
  }
  postMessage(m: ChartWorkerMessage, transfer: unknown[] = []): void {
    // Like the real thing: what is posted is a copy (a Vue proxy would throw here).
    this.sent.push(structuredClone({ ...m, canvas: undefined }) as ChartWorkerMessage)
    this.transferred.push(...transfer)
  }
  terminate(): void {}
  reply(r: ChartWorkerReply): void {
    this.onmessage?.({ data: r })
  }
  drawn(m: ChartWorkerMessage): void {
    this.reply({ type: 'drawn', id: m.id, seq: (m as { seq: number }).seq, ms: 1, endEpochMs: Date.now() })
  }
}

const line = (soc: number): SocLine => ({
  label: 'State of charge',
  startSocFraction: 1,
  socEndFraction: [soc, soc],
  socFloorFraction: 0.2,
})

let wrapper: VueWrapper | null = null
async function mountSoc(): Promise<VueWrapper> {
  // A fresh useChart module (its worker is shared by the charts of a page) for each test.
  vi.resetModules()
  const { default: ChartSoc } = await import('../../src/components/chart/ChartSoc.vue')
  wrapper = mount(
    ChartSoc as never,
    {
      props: { lines: [line(0.9)], summary: 'State of charge' },
      attachTo: document.body,
    } as never,
  )
  await nextTick()
  return wrapper
}
const sent = () => FakeWorker.last!.sent
const ofType = (t: ChartWorkerMessage['type']) => sent().filter((m) => m.type === t)
const lastSoc = (m: ChartWorkerMessage) =>
  (m as { input: { lines: SocLine[] } }).input.lines[0]!.socEndFraction[0]

describe('useChart with the chart worker', () => {
  beforeEach(() => {
    FakeWorker.last = null
    vi.stubGlobal('Worker', FakeWorker)
    vi.stubGlobal('OffscreenCanvas', class {})
    vi.stubGlobal(
      'ResizeObserver',
      class {
        observe(): void {}
        disconnect(): void {}
      },
    )
    ;(HTMLCanvasElement.prototype as unknown as Record<string, unknown>).transferControlToOffscreen =
      function () {
        return { offscreen: true }
      }
  })
  afterEach(() => {
    wrapper?.unmount()
    wrapper = null
    delete (HTMLCanvasElement.prototype as unknown as Record<string, unknown>).transferControlToOffscreen
    vi.unstubAllGlobals()
  })

  it('hands the canvas over once, with the first input', async () => {
    const w = await mountSoc()
    expect(ofType('create')).toHaveLength(1)
    const create = ofType('create')[0] as Extract<ChartWorkerMessage, { type: 'create' }>
    expect(create.kind).toBe('soc')
    expect(lastSoc(create)).toBe(0.9)
    expect(FakeWorker.last!.transferred).toEqual([{ offscreen: true }])
    expect(w.find('canvas').attributes('data-drawn-in')).toBe('worker')
  })

  it('sends only the latest of the changes made while a drawing is in flight', async () => {
    const w = await mountSoc()
    await w.setProps({ lines: [line(0.8)] })
    await w.setProps({ lines: [line(0.7)] })
    // The creation has not been drawn yet: nothing more was sent.
    expect(ofType('update')).toHaveLength(0)
    FakeWorker.last!.drawn(ofType('create')[0]!)
    expect(ofType('update')).toHaveLength(1)
    expect(lastSoc(ofType('update')[0]!)).toBe(0.7)
    // The same figures again are not sent at all.
    FakeWorker.last!.drawn(ofType('update')[0]!)
    await w.setProps({ lines: [line(0.7)] })
    expect(ofType('update')).toHaveLength(1)
  })

  it('lets the waiting change go when a drawing fails', async () => {
    const w = await mountSoc()
    const create = ofType('create')[0]!
    FakeWorker.last!.drawn(create)
    await w.setProps({ lines: [line(0.6)] })
    const first = ofType('update')[0]!
    await w.setProps({ lines: [line(0.5)] })
    FakeWorker.last!.reply({
      type: 'error',
      id: first.id,
      seq: (first as { seq: number }).seq,
      message: 'test',
      fatal: false,
    })
    expect(ofType('update')).toHaveLength(2)
    expect(lastSoc(ofType('update')[1]!)).toBe(0.5)
  })

  it('moves a chart the worker cannot draw to a new canvas on the page', async () => {
    const w = await mountSoc()
    const before = w.find('canvas').element
    const create = ofType('create')[0]!
    FakeWorker.last!.reply({ type: 'error', id: create.id, seq: 1, message: 'no context', fatal: true })
    await vi.waitFor(() => expect(w.find('canvas').attributes('data-drawn-in')).toBe('page'))
    expect(w.find('canvas').element).not.toBe(before)
  })

  it('destroys the chart in the worker when the component goes', async () => {
    const w = await mountSoc()
    const id = ofType('create')[0]!.id
    w.unmount()
    wrapper = null
    expect(ofType('destroy')).toEqual([{ type: 'destroy', id }])
  })
})
