import { computed, reactive, ref, shallowRef, watch, type Ref } from 'vue'
import type { Plan } from '@shared/engine'
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
import { useTripRuns, type SimulationJson } from './useTripRuns'

export type { SimulationJson }
export type OutlookStatus = 'loading' | 'ready' | 'incomplete' | 'error'

/** Longest trip run on the page's thread on every move; longer trips run in a worker (useTripRuns). [days] */
export const SYNC_MAX_DAYS = 92

/** Delay before the sizing searches rerun after a control stops moving. [ms] */
const ANALYSIS_DEBOUNCE_MS = 350

/**
 * The Outlook of one scenario: loads the scenario and its plan, runs the trip once per "Try a change" move
 * (useTripRuns: on the page's thread, in a worker for long trips), and runs the sizing searches (pack needed, solar needed,
 * autonomy) in another worker with progress, debounced, cancelling stale ones.
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

  const base = computed(() => (basePlan.value ? whatIfBase(basePlan.value) : null))
  const changed = computed(() => (base.value ? isChanged(whatIf, base.value) : false))
  const equipmentChanged = computed(() => (base.value ? changesEquipment(whatIf, base.value) : false))
  const plan = computed<Plan | null>(() =>
    basePlan.value ? (changed.value ? applyWhatIf(basePlan.value, { ...whatIf }) : basePlan.value) : null,
  )

  // One trip run per change: on the page's thread up to SYNC_MAX_DAYS, in a worker beyond (latest move wins).
  const runs = useTripRuns(plan, basePlan, SYNC_MAX_DAYS)
  const result = runs.result
  const resultPending = runs.pending

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
    resultError: runs.error,
    reload: load,
    reset,
  }
}
