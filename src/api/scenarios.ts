/** Scenarios (trips) of a vehicle (docs/api.md), parsed with the shared contract. */
import { z } from 'zod'
import {
  ScenarioListSchema,
  ScenarioSchema,
  type ScenarioCreate,
  type ScenarioPatch,
} from '@shared/schemas/vehicles'
import { http } from './http'

const s = (scenarioId: string) => `/scenarios/${encodeURIComponent(scenarioId)}`
const parse =
  <S extends z.ZodType>(schema: S) =>
  (body: unknown): z.output<S> =>
    schema.parse(body)

export const scenariosApi = {
  /** Every scenario I can read, across vehicles (or one vehicle's). */
  list: (opts: { vehicleId?: string; limit?: number; offset?: number } = {}) => {
    const q = new URLSearchParams({ limit: String(opts.limit ?? 100), offset: String(opts.offset ?? 0) })
    if (opts.vehicleId) q.set('vehicleId', opts.vehicleId)
    return http.get(`/scenarios?${q}`).then(parse(ScenarioListSchema))
  },
  get: (scenarioId: string) => http.get(s(scenarioId)).then(parse(ScenarioSchema)),
  create: (vehicleId: string, input: ScenarioCreate) =>
    http.post(`/vehicles/${encodeURIComponent(vehicleId)}/scenarios`, input).then(parse(ScenarioSchema)),
  patch: (scenarioId: string, patch: ScenarioPatch) =>
    http.patch(s(scenarioId), patch).then(parse(ScenarioSchema)),
  remove: (scenarioId: string, version: number) => http.del<void>(`${s(scenarioId)}?version=${version}`),
  duplicate: (scenarioId: string, name: string) =>
    http.post(`${s(scenarioId)}/duplicate`, { name }).then(parse(ScenarioSchema)),
}
