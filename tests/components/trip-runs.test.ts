/**
 * How the Outlook runs the trip on each "Try a change" move (src/composables/useTripRuns.ts): a trip up to
 * the page limit runs on the page's thread in the move itself; a longer one goes to the trip worker, one run
 * at a time with only the latest move waiting, never showing an older run after a newer one; a slow run
 * shows as pending only after a moment; a failed run keeps the figures on show; a dead worker hands the
 * latest move to the page. The worker is a stand-in that records what it is sent and answers as the test
 * says (vitest's vi.stubGlobal), so these tests check the messages, not the engine.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { effectScope, nextTick, shallowRef, type EffectScope } from 'vue'
import { resultsToJson, simulate, type Plan } from '../../shared/engine'
import type { EngineJob, EngineReply } from '../../src/workers/engine.worker'
import {
  PENDING_SHOW_MS,
  WARM_RUNS,
  useTripRuns,
  type SimulationJson,
} from '../../src/composables/useTripRuns'
import { examplePlan } from '../api/results.fixture'

// The engine itself, with its trip runs counted (vitest's vi.mock; every call goes to the real simulate).
vi.mock('../../shared/engine', async (importOriginal) => {
  const engine = await importOriginal<typeof import('../../shared/engine')>()
  return { ...engine, simulate: vi.fn(engine.simulate) }
})
const runsOfEngine = () => vi.mocked(simulate).mock.calls.length

class FakeWorker {
  static all: FakeWorker[] = []
  sent: EngineJob[] = []
  terminated = false
  onmessage: ((e: { data: EngineReply }) => void) | null = null
  onerror: ((e: { message: string; preventDefault?: () => void }) => void) | null = null
  constructor() {
    FakeWorker.all.push(this)
  }
  postMessage(m: EngineJob): void {
    // Like the real thing: what is posted is a copy.
    this.sent.push(structuredClone(m))
  }
  terminate(): void {
    this.terminated = true
  }
  /** Answers job `i` (in the order sent) with a result tagged `tag`. */
  done(i: number, tag: string): void {
    const id = this.sent[i]!.id
    this.onmessage?.({ data: { id, type: 'done', result: { tag }, ms: 1, endEpochMs: Date.now() } })
  }
}
const worker = () => FakeWorker.all[0]!
const tag = (r: SimulationJson | null) => (r as unknown as { tag?: string } | null)?.tag

/** The trip with the pack capacity changed, as a "Try a change" move makes a new plan. */
const withCapacity = (p: Plan, ah: number): Plan => ({ ...p, battery: { ...p.battery, capacityAh: ah } })

function longTrip(): Plan {
  const p = examplePlan('summer-month-andalusia')
  return { ...p, trip: { ...p.trip, days: 120 } }
}

let scope: EffectScope | null = null
function start(first: Plan, pageMaxDays = 92) {
  const stored = shallowRef<Plan | null>(first)
  const plan = shallowRef<Plan | null>(first)
  scope = effectScope()
  const runs = scope.run(() => useTripRuns(plan, stored, pageMaxDays))!
  return { plan, stored, runs }
}

describe('trip runs of the Outlook', () => {
  beforeEach(() => {
    FakeWorker.all = []
    vi.stubGlobal('Worker', FakeWorker)
  })
  afterEach(() => {
    scope?.stop()
    scope = null
    vi.unstubAllGlobals()
    vi.useRealTimers()
  })

  it('runs a trip up to the page limit on the page, in the move itself, with the same engine', async () => {
    const stored = examplePlan('summer-month-andalusia')
    const { plan, runs } = start(stored)
    expect(runs.result.value).toEqual(resultsToJson(simulate(stored)))
    const tried = withCapacity(stored, 400)
    plan.value = tried
    await nextTick()
    expect(runs.resultPlan.value).toBe(tried)
    expect(runs.result.value).toEqual(resultsToJson(simulate(tried)))
    expect(FakeWorker.all).toHaveLength(0)
    expect(runs.pending.value).toBe(false)
  })

  it('sends a long trip to the worker, one run at a time, only the latest move waiting', async () => {
    const stored = longTrip()
    const { plan, runs } = start(stored)
    expect(worker().sent).toHaveLength(1)
    expect(worker().sent[0]!.kind).toBe('simulate')
    expect(worker().sent[0]!.plan.trip.days).toBe(120)
    expect(runs.result.value).toBeNull()

    for (const ah of [250, 300, 350]) {
      plan.value = withCapacity(stored, ah)
      await nextTick()
    }
    // The first run is still in flight: nothing more was sent.
    expect(worker().sent).toHaveLength(1)
    worker().done(0, 'stored')
    expect(tag(runs.result.value)).toBe('stored')
    expect(runs.resultPlan.value).toBe(stored)
    // Then only the latest move (350 Ah); 250 and 300 were passed over.
    expect(worker().sent).toHaveLength(2)
    expect(worker().sent[1]!.plan.battery.capacityAh).toBe(350)
    worker().done(1, '350')
    expect(tag(runs.result.value)).toBe('350')
    expect(worker().sent).toHaveLength(2)
    expect(worker().terminated).toBe(false)
  })

  it('goes back to the stored figures at once, and a run still in flight does not replace them', async () => {
    const stored = longTrip()
    const { plan, runs } = start(stored)
    worker().done(0, 'stored')
    plan.value = withCapacity(stored, 300)
    await nextTick()
    expect(worker().sent).toHaveLength(2)
    plan.value = stored
    await nextTick()
    expect(tag(runs.result.value)).toBe('stored')
    // The 300 Ah run comes back after "Back to stored": it is older, so it is not shown.
    worker().done(1, '300')
    expect(tag(runs.result.value)).toBe('stored')
    expect(worker().sent).toHaveLength(2)
  })

  it('shows a run as pending only once it has taken a moment', async () => {
    vi.useFakeTimers()
    const { runs } = start(longTrip())
    expect(runs.pending.value).toBe(false)
    vi.advanceTimersByTime(PENDING_SHOW_MS - 10)
    expect(runs.pending.value).toBe(false)
    vi.advanceTimersByTime(20)
    expect(runs.pending.value).toBe(true)
    worker().done(0, 'stored')
    expect(runs.pending.value).toBe(false)
  })

  it('keeps the figures on show when a run fails, and says why', async () => {
    const stored = longTrip()
    const { plan, runs } = start(stored)
    worker().done(0, 'stored')
    plan.value = withCapacity(stored, 300)
    await nextTick()
    const id = worker().sent[1]!.id
    worker().onmessage?.({ data: { id, type: 'error', message: 'capacityAh: too large' } })
    expect(tag(runs.result.value)).toBe('stored')
    expect(runs.error.value).toBe('capacityAh: too large')
    // The next run that works clears it.
    plan.value = withCapacity(stored, 310)
    await nextTick()
    worker().done(2, '310')
    expect(runs.error.value).toBeNull()
  })

  it('warms the engine in idle time with throwaway runs of the stored plan, the figures on show untouched', async () => {
    vi.useFakeTimers()
    const marks = vi.spyOn(performance, 'mark')
    const stored = examplePlan('summer-month-andalusia')
    const before = runsOfEngine()
    const { runs } = start(stored)
    const shown = runs.result.value
    expect(runsOfEngine() - before).toBe(1)
    // One run per idle period (a 50 ms timer where requestIdleCallback is missing, as here).
    vi.advanceTimersByTime(60)
    expect(runsOfEngine() - before).toBe(2)
    await vi.runAllTimersAsync()
    expect(runsOfEngine() - before).toBe(1 + WARM_RUNS)
    expect(vi.mocked(simulate).mock.calls.at(-1)![0]).toBe(stored)
    expect(runs.result.value).toBe(shown)
    expect(marks.mock.calls.filter(([name]) => name === 'ow-warm')).toHaveLength(1)
    // Later moves do not warm again.
    await vi.runAllTimersAsync()
    expect(runsOfEngine() - before).toBe(1 + WARM_RUNS)
  })

  it('stops warming when another plan is stored, and never warms for a trip run in the worker', async () => {
    vi.useFakeTimers()
    const first = examplePlan('summer-month-andalusia')
    const before = runsOfEngine()
    const { stored, plan } = start(first)
    vi.advanceTimersByTime(60)
    expect(runsOfEngine() - before).toBe(2)
    // Another scenario opens in the same page: its run is the only one; the warm-up of the first stops.
    const next = withCapacity(first, 260)
    stored.value = next
    plan.value = next
    await nextTick()
    await vi.runAllTimersAsync()
    expect(runsOfEngine() - before).toBe(3)
    scope?.stop()

    const long = longTrip()
    const atLong = runsOfEngine()
    start(long)
    worker().done(0, 'stored')
    await vi.runAllTimersAsync()
    expect(runsOfEngine()).toBe(atLong)
  })

  it('runs the latest move on the page when the worker dies, and every move after it', async () => {
    const stored = { ...longTrip(), trip: { ...longTrip().trip, days: 40 } }
    // A page limit below the trip, so the runs go to the worker.
    const { plan, runs } = start(stored, 30)
    const tried = withCapacity(stored, 320)
    plan.value = tried
    await nextTick()
    worker().onerror?.({ message: 'worker script failed', preventDefault: () => {} })
    expect(worker().terminated).toBe(true)
    expect(runs.resultPlan.value).toBe(tried)
    expect(runs.result.value).toEqual(resultsToJson(simulate(tried)))
    const next = withCapacity(stored, 330)
    plan.value = next
    await nextTick()
    expect(runs.result.value).toEqual(resultsToJson(simulate(next)))
    expect(FakeWorker.all).toHaveLength(1)
  })
})
