import { computed, reactive, ref, shallowRef, watch, type Ref } from 'vue'
import { simulate, resultsToJson, type Jsonified, type Plan, type SimulationResult } from '@shared/engine'
import { ApiError } from '../api/http'
import { fetchScenario, fetchScenarioPlan } from '../api/results'
import type { Scenario } from '@shared/schemas/vehicles'
import {
  applyWhatIf,
  changesEquipment,
  isChanged,
  whatIfBase,
  type WhatIf,
} from '../components/outlook/whatIf'
import { useEngineWorker, type AnalysisJson } from './useEngineWorker'

export type SimulationJson = Jsonified<SimulationResult>
export type OutlookStatus = 'loading' | 'ready' | 'incomplete' | 'error'

/** Longest trip run on the page's thread on every move; longer trips run in a worker. [days] */
export const SYNC_MAX_DAYS = 92

/** Delay before the sizing searches rerun after a control stops moving. [ms] */
const ANALYSIS_DEBOUNCE_MS = 350

/**
 * The Outlook of one scenario: loads the scenario and its plan, runs the engine on the page's thread for
 * every "Try a change" move (one trip run is fast), and runs the sizing searches (pack needed, solar
 * needed, autonomy) in the worker with progress, debounced, cancelling stale ones.
 */
export function useOutlook(scenarioId: Ref<string>) {
  const status = ref<OutlookStatus>('loading')
  const error = ref<ApiError | Error | null>(null)
  const scenario = shallowRef<Scenario | null>(null)
  const basePlan = shallowRef<Plan | null>(null)
  const whatIf = reactive<WhatIf>({})
  const engine = useEngineWorker()
  const analysis = shallowRef<AnalysisJson | null>(null)
  const analysisError = ref<string | null>(null)
  /** Time of the last trip run on the page's thread (simulate + JSON form). [ms] */
  const lastRunMs = ref(0)

  const base = computed(() => (basePlan.value ? whatIfBase(basePlan.value) : null))
  const changed = computed(() => (base.value ? isChanged(whatIf, base.value) : false))
  const equipmentChanged = computed(() => (base.value ? changesEquipment(whatIf, base.value) : false))
  const plan = computed<Plan | null>(() =>
    basePlan.value ? (changed.value ? applyWhatIf(basePlan.value, { ...whatIf }) : basePlan.value) : null,
  )

  /**
   * One trip run per change. Trips up to SYNC_MAX_DAYS run on the page's thread (a 31-day run plus the chart
   * update fits in a frame: npm run bench:whatif); longer ones go to a second worker so a move never blocks
   * the page, and the previous figures stay on screen until the new ones arrive.
   */
  const syncResult = computed<SimulationJson | null>(() => {
    if (!plan.value || plan.value.trip.days > SYNC_MAX_DAYS) return null
    const t0 = performance.now()
    const r = resultsToJson(simulate(plan.value))
    const t1 = performance.now()
    lastRunMs.value = t1 - t0
    // For npm run bench:whatif (and the browser's performance panel): the engine's share of a move.
    performance.measure?.('ow-simulate', { start: t0, end: t1 })
    return r
  })
  const simWorker = useEngineWorker()
  const asyncResult = shallowRef<SimulationJson | null>(null)
  watch(
    plan,
    (p) => {
      if (!p || p.trip.days <= SYNC_MAX_DAYS) return
      simWorker.simulate(p).then(
        (r) => {
          if (plan.value === p) asyncResult.value = r
        },
        () => {},
      )
    },
    { immediate: true },
  )
  const result = computed<SimulationJson | null>(() => syncResult.value ?? asyncResult.value)
  const resultPending = computed(() => simWorker.running.value)

  const analysisFor = shallowRef<Plan | null>(null)
  /** True while the sizing figures belong to an older version of the change. */
  const analysisStale = computed(
    () => engine.running.value || (analysis.value !== null && analysisFor.value !== plan.value),
  )

  let timer: ReturnType<typeof setTimeout> | null = null
  function scheduleAnalysis(immediate = false): void {
    if (timer) clearTimeout(timer)
    const run = () => {
      const p = plan.value
      if (!p) return
      analysisError.value = null
      engine.analyse(p).then(
        (a) => {
          if (plan.value !== p) return
          analysis.value = a
          analysisFor.value = p
        },
        (e: Error) => {
          if (e.name !== 'AbortError') analysisError.value = e.message
        },
      )
    }
    if (immediate) run()
    else timer = setTimeout(run, ANALYSIS_DEBOUNCE_MS)
  }

  watch(plan, (p, old) => {
    if (p && old) scheduleAnalysis()
  })

  async function load(): Promise<void> {
    status.value = 'loading'
    error.value = null
    analysis.value = null
    asyncResult.value = null
    for (const k of Object.keys(whatIf) as (keyof WhatIf)[]) delete whatIf[k]
    try {
      const [s, p] = await Promise.all([fetchScenario(scenarioId.value), fetchScenarioPlan(scenarioId.value)])
      scenario.value = s
      basePlan.value = p
      status.value = 'ready'
      scheduleAnalysis(true)
    } catch (e) {
      error.value = e as Error
      status.value = e instanceof ApiError && e.code === 'plan_incomplete' ? 'incomplete' : 'error'
    }
  }

  function reset(): void {
    for (const k of Object.keys(whatIf) as (keyof WhatIf)[]) delete whatIf[k]
  }

  watch(scenarioId, () => void load(), { immediate: true })

  return {
    status,
    error,
    scenario,
    basePlan,
    base,
    whatIf,
    changed,
    equipmentChanged,
    plan,
    result,
    resultPending,
    analysis,
    analysisStale,
    analysisError,
    progress: engine.progress,
    lastRunMs,
    reload: load,
    reset,
  }
}
