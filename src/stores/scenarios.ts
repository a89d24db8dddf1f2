import { acceptHMRUpdate, defineStore } from 'pinia'
import { ref } from 'vue'
import type { Scenario, ScenarioCreate, ScenarioPatch, ScenarioSummary } from '@shared/schemas/vehicles'
import type { ApiError } from '../api/http'
import { scenariosApi } from '../api/scenarios'
import { toApiError, type LoadStatus } from './loadStatus'

/**
 * Scenario lists (all of mine, or one vehicle's) and the scenario open in the editor.
 * Writes reject with ApiError (409 carries `current`); the page shows it.
 */
export const useScenariosStore = defineStore('scenarios', () => {
  const scenarios = ref<ScenarioSummary[]>([])
  const total = ref(0)
  /** The vehicle the list is filtered to; null = every vehicle. */
  const listVehicleId = ref<string | null>(null)
  const status = ref<LoadStatus>('idle')
  const error = ref<ApiError | null>(null)

  const current = ref<Scenario | null>(null)
  const currentStatus = ref<LoadStatus>('idle')
  const currentError = ref<ApiError | null>(null)

  let inFlight: Promise<void> | null = null
  let inFlightKey: string | null = null
  function load(vehicleId: string | null = null): Promise<void> {
    const key = vehicleId ?? '*'
    if (inFlight && inFlightKey === key) return inFlight
    inFlightKey = key
    inFlight = (async () => {
      status.value = 'loading'
      error.value = null
      try {
        const page = await scenariosApi.list(vehicleId ? { vehicleId } : {})
        if (inFlightKey !== key) return
        scenarios.value = page.items
        total.value = page.total
        listVehicleId.value = vehicleId
        status.value = 'success'
      } catch (e) {
        if (inFlightKey !== key) return
        error.value = toApiError(e)
        status.value = 'error'
      } finally {
        inFlight = null
      }
    })()
    return inFlight
  }

  let openFor: string | null = null
  async function open(scenarioId: string): Promise<void> {
    openFor = scenarioId
    currentStatus.value = 'loading'
    currentError.value = null
    try {
      const s = await scenariosApi.get(scenarioId)
      if (openFor !== scenarioId) return
      current.value = s
      currentStatus.value = 'success'
    } catch (e) {
      if (openFor !== scenarioId) return
      currentError.value = toApiError(e)
      currentStatus.value = 'error'
    }
  }
  function close(): void {
    openFor = null
    current.value = null
    currentStatus.value = 'idle'
  }

  function upsertSummary(s: Scenario): void {
    const summary: ScenarioSummary = {
      id: s.id,
      vehicleId: s.vehicleId,
      vehicleName: s.vehicleName,
      myRole: s.myRole,
      name: s.name,
      placeName: s.placeName,
      createdAt: s.createdAt,
      startDate: s.trip.startDate,
      days: s.trip.days,
      latitudeDeg: s.trip.latitudeDeg,
      longitudeDeg: s.trip.longitudeDeg,
      timeZone: s.trip.timeZone,
      nightLowC: s.trip.nightLowC,
      dayHighC: s.trip.dayHighC,
      version: s.version,
      updatedAt: s.updatedAt,
      updatedBy: s.updatedBy,
    }
    const i = scenarios.value.findIndex((x) => x.id === s.id)
    if (i >= 0) scenarios.value.splice(i, 1, summary)
    else {
      scenarios.value.unshift(summary)
      total.value += 1
    }
  }

  async function create(vehicleId: string, input: ScenarioCreate): Promise<Scenario> {
    const s = await scenariosApi.create(vehicleId, input)
    current.value = s
    openFor = s.id
    currentStatus.value = 'success'
    upsertSummary(s)
    return s
  }
  async function patch(scenarioId: string, p: ScenarioPatch): Promise<Scenario> {
    const s = await scenariosApi.patch(scenarioId, p)
    if (current.value?.id === s.id) current.value = s
    upsertSummary(s)
    return s
  }
  async function duplicate(scenarioId: string, name: string): Promise<Scenario> {
    const s = await scenariosApi.duplicate(scenarioId, name)
    upsertSummary(s)
    return s
  }
  async function remove(scenarioId: string, version: number): Promise<void> {
    await scenariosApi.remove(scenarioId, version)
    scenarios.value = scenarios.value.filter((x) => x.id !== scenarioId)
    total.value = Math.max(0, total.value - 1)
    if (current.value?.id === scenarioId) close()
  }

  return {
    scenarios,
    total,
    listVehicleId,
    status,
    error,
    current,
    currentStatus,
    currentError,
    load,
    open,
    close,
    create,
    patch,
    duplicate,
    remove,
  }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useScenariosStore, import.meta.hot))
