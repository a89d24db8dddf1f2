import { onScopeDispose, ref } from 'vue'
import { analysePlan, resultsToJson, type Analysis, type Jsonified, type Plan } from '@shared/engine'
import type { EngineJob, EngineReply } from '../workers/engine.worker'

export type AnalysisJson = Jsonified<Analysis>

export interface EngineProgress {
  fraction: number
  stage: string
  /** Plain words for the stage. */
  label: string
}

const STAGE_LABELS: Record<string, string> = {
  prepare: 'Working out the sun and the loads',
  simulate: 'Running the trip hour by hour',
  autonomy: 'Counting days without charging',
  packNeeded: 'Searching for the smallest pack that works',
  solarNeeded: 'Searching for the smallest array that works',
  comparisons: 'Comparing chemistries',
  done: 'Done',
}

/**
 * The engine's long searches in a web worker, one job at a time: a new request cancels the running one
 * (the worker is stopped and started again, since a synchronous search cannot be interrupted otherwise).
 * Falls back to the page's thread, after a yield, where workers are missing (component tests).
 */
export function useEngineWorker() {
  const progress = ref<EngineProgress | null>(null)
  const running = ref(false)
  let worker: Worker | null = null
  let seq = 0
  let pending: { id: number; resolve: (r: unknown) => void; reject: (e: Error) => void } | null = null

  function spawn(): Worker {
    const w = new Worker(new URL('../workers/engine.worker.ts', import.meta.url), { type: 'module' })
    w.onmessage = (e: MessageEvent<EngineReply>) => {
      const m = e.data
      if (!pending || m.id !== pending.id) return
      if (m.type === 'progress') {
        progress.value = { fraction: m.fraction, stage: m.stage, label: STAGE_LABELS[m.stage] ?? m.stage }
        return
      }
      const p = pending
      pending = null
      running.value = false
      progress.value = null
      if (m.type === 'done') p.resolve(m.result)
      else p.reject(new Error(m.message))
    }
    w.onerror = (e) => {
      const p = pending
      pending = null
      running.value = false
      progress.value = null
      worker?.terminate()
      worker = null
      p?.reject(new Error(e.message || 'The computation stopped unexpectedly.'))
    }
    return w
  }

  /** Cancel the running job, if any (its promise rejects with an AbortError). */
  function cancel(): void {
    if (pending) {
      const err = new Error('cancelled')
      err.name = 'AbortError'
      pending.reject(err)
      pending = null
      worker?.terminate()
      worker = null
    }
    running.value = false
    progress.value = null
  }

  /** The full analysis (trip run + sizing searches), with progress. */
  function analyse(plan: Plan): Promise<AnalysisJson> {
    return run(plan) as Promise<AnalysisJson>
  }

  function run(plan: Plan): Promise<unknown> {
    cancel()
    const id = ++seq
    running.value = true
    progress.value = { fraction: 0, stage: 'prepare', label: STAGE_LABELS.prepare! }
    if (typeof Worker === 'undefined') {
      return new Promise((resolve, reject) => {
        setTimeout(() => {
          if (id !== seq) return
          try {
            const r = resultsToJson(analysePlan(plan))
            running.value = false
            progress.value = null
            resolve(r)
          } catch (e) {
            running.value = false
            reject(e as Error)
          }
        }, 0)
      })
    }
    worker ??= spawn()
    return new Promise((resolve, reject) => {
      pending = { id, resolve, reject }
      const job: EngineJob = { id, kind: 'analyse', plan: JSON.parse(JSON.stringify(plan)) as Plan }
      worker!.postMessage(job)
    })
  }

  onScopeDispose(() => {
    cancel()
    worker?.terminate()
    worker = null
  })

  return { analyse, cancel, progress, running }
}
