/**
 * Client calls for the Outlook and Side by side screens: scenarios, their plans, stored results, and
 * saving a "Try a change" as a new scenario. Answers are checked with the shared zod schemas.
 */
import { z } from 'zod'
import { http } from './http'
import { PlanSchema, type Plan } from '@shared/schemas/plan'
import {
  ScenarioListSchema,
  ScenarioSchema,
  type Scenario,
  type ScenarioList,
} from '@shared/schemas/vehicles'
import type { AnalysisJson } from '../composables/useEngineWorker'

export async function fetchScenario(scenarioId: string, signal?: AbortSignal): Promise<Scenario> {
  return ScenarioSchema.parse(await http.get(`/scenarios/${encodeURIComponent(scenarioId)}`, signal))
}

export async function fetchScenarioPlan(scenarioId: string, signal?: AbortSignal): Promise<Plan> {
  return PlanSchema.parse(await http.get(`/scenarios/${encodeURIComponent(scenarioId)}/plan`, signal))
}

/** Every scenario the user can read, across vehicles (first 100, newest first as the server orders them). */
export async function fetchReadableScenarios(signal?: AbortSignal): Promise<ScenarioList> {
  return ScenarioListSchema.parse(await http.get('/scenarios?limit=100', signal)) as ScenarioList
}

/** POST /api/scenarios/:scenarioId/save-change answers with the new scenario and the copied vehicle's id. */
const SavedChangeSchema = z.object({ scenario: ScenarioSchema, vehicleId: z.string() })

/** GET /api/scenarios/:scenarioId/results: the engine's full analysis of the stored plan, as JSON. */
export const ScenarioResultsSchema = z.object({
  scenarioId: z.string(),
  computedInMs: z.number(),
  results: z.looseObject({
    verdict: z.looseObject({ status: z.enum(['carries', 'tight', 'short']) }),
    summary: z.looseObject({}),
    days: z.array(z.unknown()),
  }),
})
export interface ScenarioResults {
  scenarioId: string
  computedInMs: number
  results: AnalysisJson
}

export async function fetchScenarioResults(
  scenarioId: string,
  signal?: AbortSignal,
): Promise<ScenarioResults> {
  const body = await http.get(`/scenarios/${encodeURIComponent(scenarioId)}/results`, signal)
  ScenarioResultsSchema.parse(body)
  return body as ScenarioResults
}

export interface SaveWhatIfInput {
  scenario: Scenario
  /** The plan with the change applied. */
  plan: Plan
  name: string
  /** true: the pack or array changed, which belong to the vehicle: save on a copy of the vehicle. */
  equipmentChanged: boolean
}

export interface SavedWhatIf {
  scenarioId: string
  vehicleId: string
  /** true when a copy of the vehicle was made to hold a different pack or array. */
  vehicleCopied: boolean
}

/**
 * Keep a what-if. A trip-only change (driving, night low, sky) becomes a copy of the scenario in the same
 * vehicle. A pack or array change cannot live in a scenario (both are the vehicle's equipment), so the
 * vehicle is copied with the tried pack and array, and the scenario is created on the copy; a copy made by
 * someone who can change the original is shared with the original's crew. The copy is made by one request,
 * POST /api/scenarios/:id/save-change, in one transaction: a failure leaves no half-made vehicle behind.
 */
export async function saveWhatIf(input: SaveWhatIfInput): Promise<SavedWhatIf> {
  const { scenario, plan, name } = input
  const canWrite = scenario.myRole === 'owner' || scenario.myRole === 'editor'
  if (!input.equipmentChanged && canWrite) {
    // One request: the copy with the tried trip, in one transaction.
    const saved = ScenarioSchema.parse(
      await http.post(`/scenarios/${encodeURIComponent(scenario.id)}/duplicate`, { name, trip: plan.trip }),
    )
    return { scenarioId: saved.id, vehicleId: saved.vehicleId, vehicleCopied: false }
  }
  // One request, one transaction on the server: a copy of the vehicle with the tried equipment and the new
  // scenario on it, or nothing at all. Whoever shares the original (a partner) shares the copy when the saver
  // can change the original; a reader's copy stays their own.
  const saved = SavedChangeSchema.parse(
    await http.post(`/scenarios/${encodeURIComponent(scenario.id)}/save-change`, { name, plan }),
  )
  return { scenarioId: saved.scenario.id, vehicleId: saved.vehicleId, vehicleCopied: true }
}
