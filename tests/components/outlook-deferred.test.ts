// @vitest-environment happy-dom
/**
 * What a "Try a change" move updates at once and what it leaves for later: a part on screen follows its
 * source in the same update; a part scrolled out of view catches up when the controls are still (idle time),
 * when it comes into view, or before printing. And the charts' in-place update keeps chart.js's own dataset
 * objects (so a dataset hidden from the legend stays hidden).
 */
// Small stand-in components defined beside the tests that use them.
/* eslint-disable vue/one-component-per-file */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h, nextTick, ref, type Ref } from 'vue'
import { mount } from '@vue/test-utils'
import { useWhenVisible } from '../../src/components/chart/whenVisible'
import { mergeDatasets, sameData, type AnyDataset } from '../../src/components/chart/useChart'

/** A stand-in IntersectionObserver whose answers the test gives (the page shares one for every part). */
class FakeObserver {
  static current: FakeObserver | null = null
  constructor(private readonly cb: (entries: { target: Element; isIntersecting: boolean }[]) => void) {
    FakeObserver.current = this
  }
  observe(): void {}
  unobserve(): void {}
  disconnect(): void {}
  report(target: Element, isIntersecting: boolean): void {
    this.cb([{ target, isIntersecting }])
  }
}
/** Tells the part mounted in `w` whether it is on screen. */
const report = (w: { element: Element }, visible: boolean) => FakeObserver.current!.report(w.element, visible)

function mountShown(source: Ref<number>, onRead: () => void = () => {}) {
  const Comp = defineComponent({
    setup() {
      const el = ref<HTMLElement | null>(null)
      const shown = useWhenVisible(el, () => (onRead(), source.value))
      return () => h('div', { ref: el, 'data-test': 'shown' }, String(shown.value))
    },
  })
  return mount(Comp, { attachTo: document.body })
}

describe('useWhenVisible', () => {
  beforeEach(() => {
    vi.useFakeTimers()
    vi.stubGlobal('IntersectionObserver', FakeObserver)
    // The fallback for browsers without requestIdleCallback: a short timer, which the fake clock drives.
    vi.stubGlobal('requestIdleCallback', undefined)
    vi.stubGlobal('cancelIdleCallback', undefined)
  })
  afterEach(() => {
    vi.useRealTimers()
    vi.unstubAllGlobals()
  })

  it('follows its source in the same update while on screen', async () => {
    const source = ref(1)
    const w = mountShown(source)
    report(w, true)
    source.value = 2
    await nextTick()
    expect(w.text()).toBe('2')
    source.value = 3
    await nextTick()
    expect(w.text()).toBe('3')
    w.unmount()
  })

  it('off screen, waits until the source has been still, then catches up with the latest value', async () => {
    const source = ref(1)
    const w = mountShown(source)
    report(w, false)
    source.value = 2
    await nextTick()
    expect(w.text()).toBe('1')
    await vi.advanceTimersByTimeAsync(150)
    source.value = 3 // another move inside the quiet time starts the wait again
    await nextTick()
    await vi.advanceTimersByTimeAsync(150)
    expect(w.text()).toBe('1')
    await vi.advanceTimersByTimeAsync(200)
    await nextTick()
    expect(w.text()).toBe('3')
    w.unmount()
  })

  it('off screen, catches up at once when it comes into view, or before printing', async () => {
    const source = ref(1)
    const w = mountShown(source)
    report(w, false)
    source.value = 2
    await nextTick()
    expect(w.text()).toBe('1')
    report(w, true)
    await nextTick()
    expect(w.text()).toBe('2')

    report(w, false)
    source.value = 5
    await nextTick()
    expect(w.text()).toBe('2')
    window.dispatchEvent(new Event('beforeprint'))
    await nextTick()
    expect(w.text()).toBe('5')
    window.dispatchEvent(new Event('afterprint'))
    w.unmount()
  })

  it('while printing, a part inside another one that has just caught up follows at once too', async () => {
    // Like a chart inside the Outlook's deferred charts block: the inner part's print listener runs first
    // (children mount first), so it only gets the new value after the outer part's listener has run.
    const source = ref(1)
    const Inner = defineComponent({
      props: { v: { type: Number, required: true } },
      setup(props) {
        const el = ref<HTMLElement | null>(null)
        const shown = useWhenVisible(el, () => props.v)
        return () => h('span', { ref: el, 'data-test': 'inner' }, String(shown.value))
      },
    })
    const Outer = defineComponent({
      setup() {
        const el = ref<HTMLElement | null>(null)
        const shown = useWhenVisible(el, () => source.value)
        return () => h('div', { ref: el }, [h(Inner, { v: shown.value })])
      },
    })
    const w = mount(Outer, { attachTo: document.body })
    report(w, false)
    FakeObserver.current!.report(w.find('[data-test="inner"]').element, false)
    source.value = 2
    await nextTick()
    expect(w.text()).toBe('1')
    window.dispatchEvent(new Event('beforeprint'))
    await nextTick()
    await nextTick()
    expect(w.find('[data-test="inner"]').text()).toBe('2')
    window.dispatchEvent(new Event('afterprint'))
    // After printing, off-screen parts wait again.
    source.value = 3
    await nextTick()
    expect(w.find('[data-test="inner"]').text()).toBe('2')
    w.unmount()
  })

  it('tells parts apart: one on screen follows at once while another out of view waits', async () => {
    const source = ref(1)
    const shown = mountShown(source)
    const hidden = mountShown(source)
    report(shown, true)
    report(hidden, false)
    source.value = 2
    await nextTick()
    expect(shown.text()).toBe('2')
    expect(hidden.text()).toBe('1')
    shown.unmount()
    hidden.unmount()
  })

  it('stops waiting when unmounted', async () => {
    const source = ref(1)
    let runs = 0
    const w = mountShown(source, () => runs++)
    report(w, false)
    source.value = 2
    await nextTick()
    const before = runs
    w.unmount()
    await vi.advanceTimersByTimeAsync(2000)
    expect(runs).toBe(before)
  })
})

describe('mergeDatasets (charts updated in place)', () => {
  it('keeps the chart’s dataset objects, matched by label, and writes the new data into them', () => {
    const a: AnyDataset = { label: 'Pack', data: [1, 2], borderDash: [2, 2] }
    const b: AnyDataset = { label: 'Outside air', data: [3, 4] }
    const next = [
      { label: 'Outside air', data: [5, 6] },
      { label: 'Pack', data: [7, 8] },
    ]
    const merged = mergeDatasets([a, b], next)
    expect(merged[0]).toBe(b)
    expect(merged[1]).toBe(a)
    expect(a.data).toEqual([7, 8])
    expect(b.data).toEqual([5, 6])
    // A style the new dataset no longer has is removed, not left behind.
    expect('borderDash' in a).toBe(false)
  })

  it('matches by position when a label changed but the number of datasets did not', () => {
    const limit: AnyDataset = { label: 'Lowest charging temperature (0 °C)', data: [] }
    const merged = mergeDatasets([limit], [{ label: 'Lowest charging temperature (32 °F)', data: [1] }])
    expect(merged[0]).toBe(limit)
    expect(limit.label).toBe('Lowest charging temperature (32 °F)')
  })

  it('with inPlace (parsing: false charts), writes new {x, y} values into the points the chart holds', () => {
    const points = [
      { x: 0, y: 90 },
      { x: 1, y: 80 },
    ]
    const soc: AnyDataset = { label: 'State of charge', data: points }
    const next = [
      { x: 0, y: 95 },
      { x: 1, y: 70 },
    ]
    const [merged] = mergeDatasets([soc], [{ label: 'State of charge', data: next }], { inPlace: true })
    expect(merged).toBe(soc)
    expect(soc.data).toBe(points) // same array and point objects, new values
    expect(points[1]).toEqual({ x: 1, y: 70 })
    // A different length takes the new array as it is; without inPlace the new array is always taken.
    const longer = [...next, { x: 2, y: 60 }]
    mergeDatasets([soc], [{ label: 'State of charge', data: longer }], { inPlace: true })
    expect(soc.data).toBe(longer)
    const plain = [
      { x: 0, y: 1 },
      { x: 1, y: 2 },
      { x: 2, y: 3 },
    ]
    mergeDatasets([soc], [{ label: 'State of charge', data: plain }])
    expect(soc.data).toBe(plain)
  })

  it('prefers a label match over a position match', () => {
    const pack: AnyDataset = { label: 'Pack', data: [1] }
    const air: AnyDataset = { label: 'Outside air', data: [2] }
    const merged = mergeDatasets(
      [pack, air],
      [
        { label: 'New line', data: [3] },
        { label: 'Pack', data: [4] },
      ],
    )
    expect(merged[1]).toBe(pack)
    expect(pack.data).toEqual([4])
    // Position 0 is taken by the label match, so the new line is a new dataset (and the old one goes).
    expect(merged[0]).not.toBe(pack)
    expect(merged[0]).not.toBe(air)
    expect(merged[0]!.label).toBe('New line')
  })

  it('adds new datasets as new objects and drops the ones that are gone', () => {
    const solar: AnyDataset = { label: 'In: Solar', data: [1] }
    const dcdc: AnyDataset = { label: 'In: Alternator (DC-DC)', data: [2] }
    const loads: AnyDataset = { label: 'Out: loads', data: [3] }
    const merged = mergeDatasets(
      [solar, dcdc, loads],
      [
        { label: 'In: Solar', data: [4] },
        { label: 'Out: loads', data: [5] },
        { label: 'Out: heater pad', data: [6] },
      ],
    )
    expect(merged).toHaveLength(3)
    expect(merged[0]).toBe(solar)
    expect(merged[1]).toBe(loads)
    expect(merged[2]).not.toBe(dcdc)
    expect(merged[2]!.label).toBe('Out: heater pad')
  })
})

describe('sameData (a chart is not redrawn for the same figures)', () => {
  it('compares numbers, strings, arrays and plain objects by content and functions by identity', () => {
    const f = (c: number) => c
    expect(sameData([[1, 2, 3], 'C', f], [[1, 2, 3], 'C', f])).toBe(true)
    expect(sameData([{ inWh: { solar: 1 }, heaterWh: 0 }], [{ inWh: { solar: 1 }, heaterWh: 0 }])).toBe(true)
    expect(sameData([[1, 2, 3]], [[1, 2, 3.0001]])).toBe(false)
    expect(sameData([[1, 2]], [[1, 2, 3]])).toBe(false)
    expect(sameData([{ inWh: { solar: 1 } }], [{ inWh: { solar: 1, dcdc: 0 } }])).toBe(false)
    expect(sameData(['C'], ['F'])).toBe(false)
    expect(sameData([f], [(c: number) => c])).toBe(false)
    expect(sameData([[]], [{}])).toBe(false)
    expect(sameData([undefined], [null])).toBe(false)
  })
})

describe('WhenVisible (a costly part of the Outlook gets a copy of its value that waits off screen)', () => {
  beforeEach(() => {
    vi.useFakeTimers()
    vi.stubGlobal('IntersectionObserver', FakeObserver)
  })
  afterEach(() => {
    vi.useRealTimers()
    vi.unstubAllGlobals()
  })

  it('hands its slot the value at once on screen, the latest one later off screen', async () => {
    const { default: WhenVisible } = await import('../../src/components/common/WhenVisible.vue')
    const options = {
      props: { value: 1 },
      slots: { default: ({ value }: { value: number }) => `v${value}` },
      attachTo: document.body,
    }
    // A generic component (<script setup generic="T">): mounted as a plain one with a number for T.
    const w = mount(WhenVisible as unknown as Parameters<typeof mount>[0], options as never)
    await w.setProps({ value: 2 } as never)
    expect(w.text()).toBe('v2')
    report(w, false)
    await w.setProps({ value: 3 } as never)
    expect(w.text()).toBe('v2')
    report(w, true)
    await nextTick()
    expect(w.text()).toBe('v3')
    w.unmount()
  })
})
