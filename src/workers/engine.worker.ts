/**
 * The engine in a module worker: the pack-needed and solar-needed searches (tens of full-trip runs) and
 * the trip runs of "Try a change" (src/composables/useTripRuns.ts, a second instance of this worker), off
 * the page's thread so the page never freezes. Progress is posted
 * between the search stages.
 *
 * Messages in:  { id, kind: 'analyse' | 'simulate', plan }     (plan: a validated Plan as plain JSON)
 * Messages out: { id, type: 'progress', fraction, stage } | { id, type: 'done', result } | { id, type: 'error', message }
 */
import { analysePlan, simulate, resultsToJson, type Plan } from '@shared/engine'

export type EngineJob = { id: number; kind: 'analyse' | 'simulate'; plan: Plan }
export type EngineReply =
  | { id: number; type: 'progress'; fraction: number; stage: string }
  /** ms: the job's time in the worker; endEpochMs: when it ended (performance.timeOrigin + now). */
  | { id: number; type: 'done'; result: unknown; ms: number; endEpochMs: number }
  | { id: number; type: 'error'; message: string }

const post = (m: EngineReply) => (self as unknown as Worker).postMessage(m)

self.onmessage = (e: MessageEvent<EngineJob>) => {
  const { id, kind, plan } = e.data
  const started = performance.now()
  try {
    const result =
      kind === 'simulate'
        ? simulate(plan)
        : analysePlan(plan, {
            onProgress: (fraction, stage) => post({ id, type: 'progress', fraction, stage }),
          })
    const json = resultsToJson(result)
    const ended = performance.now()
    post({ id, type: 'done', result: json, ms: ended - started, endEpochMs: performance.timeOrigin + ended })
  } catch (err) {
    post({ id, type: 'error', message: err instanceof Error ? err.message : String(err) })
  }
}
