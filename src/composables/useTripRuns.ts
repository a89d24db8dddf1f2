/**
 * The Outlook's trip runs, one per "Try a change" move. A trip up to `pageMaxDays` runs on the page's
 * thread, in the move's own task (a 31-day run takes about 1 ms, far less than copying its hourly figures
 * back from a worker, and the page renders the move once instead of twice: npm run bench:whatif measured
 * both ways). Longer trips run in a worker of their own (a second instance of src/workers/engine.worker.ts,
 * beside the one that runs the sizing searches), so a move on a long trip never blocks the page:
 *
 * - At most one run is in flight; while it runs, further moves wait and only the latest is sent (a drag
 *   shows each run's figures as they come, never an older one after a newer one).
 * - The stored plan's figures are kept: "Back to stored" shows them again without a new run.
 * - Where module workers are missing (component tests) or the worker fails, every run happens on the page.
 * - `pending` turns true only when a run has taken longer than PENDING_SHOW_MS, so a quick run never
 *   flashes an "Updating…" line.
 */
import { onScopeDispose, ref, shallowRef, watch, type Ref, type ShallowRef } from 'vue'
import { resultsToJson, simulate, type Jsonified, type Plan, type SimulationResult } from '@shared/engine'
import type { EngineJob, EngineReply } from '../workers/engine.worker'
import { cancelIdle, requestIdle } from './idle'

export type SimulationJson = Jsonified<SimulationResult>

/** A run still going after this long shows as pending. [ms] */
export const PENDING_SHOW_MS = 250
/**
 * Throwaway runs of the stored plan in idle time once its figures are on show, one per idle period, so the
 * engine's code is compiled before the first move (a cold run took 2–3.4 ms, a warm one 0.5–1 ms:
 * npm run bench:whatif). Only for trips that run on the page. Marks `ow-warm` when done.
 */
export const WARM_RUNS = 4

export interface TripRuns {
  /** The figures on show: the latest run that has finished. */
  result: ShallowRef<SimulationJson | null>
  /** The plan `result` belongs to (it lags `plan` while a run is in flight). */
  resultPlan: ShallowRef<Plan | null>
  /** A run has been going for longer than PENDING_SHOW_MS. */
  pending: Ref<boolean>
  /** Why the latest run failed (the figures on show stay those of the run before), or null. */
  error: Ref<string | null>
  /** Time of the last run on the page's thread (simulate + JSON form), 0 when none ran there. [ms] */
  lastPageRunMs: Ref<number>
}

/** `performance.measure` for the bench and the browser's performance panel; absent in some test setups. */
function measure(name: string, start: number, end: number): void {
  performance.measure?.(name, { start: Math.max(0, start), end: Math.max(0, end) })
}

export function useTripRuns(plan: Ref<Plan | null>, stored: Ref<Plan | null>, pageMaxDays: number): TripRuns {
  const result = shallowRef<SimulationJson | null>(null)
  const resultPlan = shallowRef<Plan | null>(null)
  const pending = ref(false)
  const error = ref<string | null>(null)
  const lastPageRunMs = ref(0)

  /** Every request gets the next number; a result is shown only if it is newer than the one on show. */
  let requested = 0
  let shown = 0
  /** The stored plan's figures, once run (on the page or in the worker). */
  let storedRun: { plan: Plan; result: SimulationJson } | null = null

  let worker: Worker | null = null
  let workerFailed = typeof Worker === 'undefined'
  let inFlight: { seq: number; plan: Plan } | null = null
  let waiting: { seq: number; plan: Plan } | null = null
  let pendingTimer: ReturnType<typeof setTimeout> | null = null

  function show(seq: number, p: Plan, r: SimulationJson): void {
    if (seq <= shown) return
    shown = seq
    if (p === stored.value) storedRun = { plan: p, result: r }
    error.value = null
    result.value = r
    resultPlan.value = p
  }
  function settlePending(): void {
    if (inFlight || waiting) return
    if (pendingTimer) clearTimeout(pendingTimer)
    pendingTimer = null
    pending.value = false
  }

  function runOnPage(seq: number, p: Plan): void {
    const t0 = performance.now()
    let r: SimulationJson
    try {
      r = resultsToJson(simulate(p))
    } catch (e) {
      if (seq > shown) error.value = e instanceof Error ? e.message : String(e)
      return
    }
    const t1 = performance.now()
    lastPageRunMs.value = t1 - t0
    // The engine's share of a move (npm run bench:whatif).
    measure('ow-simulate', t0, t1)
    show(seq, p, r)
    if (!warmed && p === stored.value) warmUp(p)
  }

  let warmed = false
  let warmId: number | null = null
  function warmUp(p: Plan): void {
    warmed = true
    let left = WARM_RUNS
    const step = () => {
      warmId = null
      // A new stored plan (another scenario) or a failing run: the moves warm the engine themselves.
      if (stored.value !== p) return
      try {
        resultsToJson(simulate(p))
      } catch {
        return
      }
      if (--left > 0) warmId = requestIdle(step)
      else performance.mark?.('ow-warm')
    }
    warmId = requestIdle(step)
  }

  function spawn(): Worker {
    const w = new Worker(new URL('../workers/engine.worker.ts', import.meta.url), { type: 'module' })
    w.onmessage = (e: MessageEvent<EngineReply>) => {
      const m = e.data
      if (!inFlight || m.id !== inFlight.seq || m.type === 'progress') return
      // For the bench: when the figures reached the page, before Vue's update.
      performance.mark?.('ow-result-received')
      const job = inFlight
      inFlight = null
      if (m.type === 'done') {
        const end = m.endEpochMs - performance.timeOrigin
        measure('ow-simulate', end - m.ms, end)
        show(job.seq, job.plan, m.result as SimulationJson)
      } else if (job.seq > shown) {
        error.value = m.message
      }
      if (waiting) {
        const next = waiting
        waiting = null
        post(next.seq, next.plan)
      }
      settlePending()
    }
    w.onerror = (e) => {
      // The worker could not start or died: every run on the page from now on, starting with the latest.
      e.preventDefault?.()
      console.error('trip runs: on the page from now on', e.message)
      workerFailed = true
      w.terminate()
      worker = null
      const latest = waiting ?? inFlight
      inFlight = null
      waiting = null
      if (latest) runOnPage(latest.seq, latest.plan)
      settlePending()
    }
    return w
  }

  function post(seq: number, p: Plan): void {
    worker ??= spawn()
    inFlight = { seq, plan: p }
    const job: EngineJob = { id: seq, kind: 'simulate', plan: p }
    try {
      worker.postMessage(job)
    } catch (e) {
      // A plan that cannot be copied to the worker (it should always be plain JSON): run it here.
      console.error('trip runs: could not post the plan', e)
      inFlight = null
      runOnPage(seq, p)
      return
    }
    pendingTimer ??= setTimeout(() => {
      pendingTimer = null
      if (inFlight || waiting) pending.value = true
    }, PENDING_SHOW_MS)
  }

  function request(p: Plan | null): void {
    const seq = ++requested
    if (!p) {
      shown = seq
      result.value = null
      resultPlan.value = null
      return
    }
    if (storedRun && storedRun.plan === p) {
      // Back to stored: the figures are at hand; an older run still in flight will not replace them.
      waiting = null
      show(seq, p, storedRun.result)
      settlePending()
      return
    }
    if (workerFailed || p.trip.days <= pageMaxDays) {
      waiting = null
      runOnPage(seq, p)
      settlePending()
      return
    }
    if (inFlight) waiting = { seq, plan: p }
    else post(seq, p)
  }

  watch(
    stored,
    () => {
      storedRun = null
    },
    { flush: 'sync' },
  )
  watch(plan, request, { immediate: true })

  onScopeDispose(() => {
    if (pendingTimer) clearTimeout(pendingTimer)
    if (warmId !== null) cancelIdle(warmId)
    worker?.terminate()
    worker = null
    inFlight = null
    waiting = null
  })

  return { result, resultPlan, pending, error, lastPageRunMs }
}
