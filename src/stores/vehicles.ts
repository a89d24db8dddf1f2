import { acceptHMRUpdate, defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { BatteryBank, Inverter } from '@shared/schemas/plan'
import type {
  ApplianceCreate,
  AppliancePatch,
  ApplianceRecord,
  BatteryRecord,
  ChargeSourceCreate,
  ChargeSourcePatch,
  ChargeSourceRecord,
  InverterRecord,
  Vehicle,
  VehicleCreate,
  VehicleDetail,
  VehiclePatch,
} from '@shared/schemas/vehicles'
import { WRITE_ROLES } from '@shared/schemas/vehicles'
import type { ApiError } from '../api/http'
import { vehiclesApi } from '../api/vehicles'
import { toApiError, type LoadStatus } from './loadStatus'

/**
 * The user's vehicles, and the one vehicle open on the vehicle page with its equipment.
 * Actions that write reject with ApiError (a 409 carries the current record); the page decides how to
 * show it. No toasts here.
 */
export const useVehiclesStore = defineStore('vehicles', () => {
  const vehicles = ref<Vehicle[]>([])
  const total = ref(0)
  const status = ref<LoadStatus>('idle')
  const error = ref<ApiError | null>(null)

  const current = ref<VehicleDetail | null>(null)
  const battery = ref<BatteryRecord | null>(null)
  const inverter = ref<InverterRecord | null>(null)
  const appliances = ref<ApplianceRecord[]>([])
  const sources = ref<ChargeSourceRecord[]>([])
  const detailStatus = ref<LoadStatus>('idle')
  const detailError = ref<ApiError | null>(null)

  const canWrite = computed(() => !!current.value && WRITE_ROLES.includes(current.value.myRole))

  // A second caller awaits the running request instead of starting another one.
  let inFlight: Promise<void> | null = null
  function load(): Promise<void> {
    inFlight ??= (async () => {
      status.value = 'loading'
      error.value = null
      try {
        const page = await vehiclesApi.list()
        vehicles.value = page.items
        total.value = page.total
        status.value = 'success'
      } catch (e) {
        error.value = toApiError(e)
        status.value = 'error'
      } finally {
        inFlight = null
      }
    })()
    return inFlight
  }

  async function create(input: VehicleCreate): Promise<VehicleDetail> {
    const created = await vehiclesApi.create(input)
    vehicles.value = [created, ...vehicles.value.filter((x) => x.id !== created.id)]
    total.value += 1
    return created
  }

  let detailFor: string | null = null
  let detailInFlight: Promise<void> | null = null
  function loadVehicle(vehicleId: string): Promise<void> {
    if (detailInFlight && detailFor === vehicleId) return detailInFlight
    detailFor = vehicleId
    detailInFlight = (async () => {
      detailStatus.value = 'loading'
      detailError.value = null
      try {
        const [v, b, inv, a, s] = await Promise.all([
          vehiclesApi.get(vehicleId),
          vehiclesApi.battery(vehicleId),
          vehiclesApi.inverter(vehicleId),
          vehiclesApi.appliances(vehicleId),
          vehiclesApi.sources(vehicleId),
        ])
        if (detailFor !== vehicleId) return
        current.value = v
        battery.value = b
        inverter.value = inv
        appliances.value = a.items
        sources.value = s.items
        detailStatus.value = 'success'
      } catch (e) {
        if (detailFor !== vehicleId) return
        detailError.value = toApiError(e)
        detailStatus.value = 'error'
      } finally {
        detailInFlight = null
      }
    })()
    return detailInFlight
  }

  function vehicleId(): string {
    if (!current.value) throw new Error('No vehicle is open')
    return current.value.id
  }

  async function patchVehicle(patch: VehiclePatch): Promise<void> {
    current.value = await vehiclesApi.patch(vehicleId(), patch)
    vehicles.value = vehicles.value.map((x) => (x.id === current.value!.id ? current.value! : x))
  }
  async function removeVehicle(version?: number): Promise<void> {
    const v = current.value!
    await vehiclesApi.remove(v.id, version ?? v.version)
    vehicles.value = vehicles.value.filter((x) => x.id !== v.id)
    current.value = null
  }
  async function reloadVehicle(): Promise<void> {
    current.value = await vehiclesApi.get(vehicleId())
  }

  async function saveBattery(bank: BatteryBank, version: number): Promise<void> {
    battery.value = await vehiclesApi.putBattery(vehicleId(), { version, battery: bank })
  }
  async function reloadBattery(): Promise<void> {
    battery.value = await vehiclesApi.battery(vehicleId())
  }
  async function saveInverter(inv: Inverter | null, version: number): Promise<void> {
    inverter.value = await vehiclesApi.putInverter(vehicleId(), { version, inverter: inv })
  }
  async function reloadInverter(): Promise<void> {
    inverter.value = await vehiclesApi.inverter(vehicleId())
  }

  async function addAppliance(input: ApplianceCreate): Promise<ApplianceRecord> {
    const row = await vehiclesApi.createAppliance(vehicleId(), input)
    appliances.value = [...appliances.value, row]
    return row
  }
  async function patchAppliance(applianceId: string, patch: AppliancePatch): Promise<void> {
    const row = await vehiclesApi.patchAppliance(vehicleId(), applianceId, patch)
    appliances.value = appliances.value.map((a) => (a.id === row.id ? row : a))
  }
  async function removeAppliance(applianceId: string, version: number): Promise<void> {
    await vehiclesApi.removeAppliance(vehicleId(), applianceId, version)
    appliances.value = appliances.value.filter((a) => a.id !== applianceId)
  }
  async function reloadAppliances(): Promise<void> {
    appliances.value = (await vehiclesApi.appliances(vehicleId())).items
  }

  async function addSource(input: ChargeSourceCreate): Promise<ChargeSourceRecord> {
    const row = await vehiclesApi.createSource(vehicleId(), input)
    sources.value = [...sources.value, row]
    return row
  }
  async function patchSource(sourceId: string, patch: ChargeSourcePatch): Promise<void> {
    const row = await vehiclesApi.patchSource(vehicleId(), sourceId, patch)
    sources.value = sources.value.map((s) => (s.id === row.id ? row : s))
  }
  async function removeSource(sourceId: string, version: number): Promise<void> {
    await vehiclesApi.removeSource(vehicleId(), sourceId, version)
    sources.value = sources.value.filter((s) => s.id !== sourceId)
  }
  async function reloadSources(): Promise<void> {
    sources.value = (await vehiclesApi.sources(vehicleId())).items
  }

  return {
    vehicles,
    total,
    status,
    error,
    current,
    battery,
    inverter,
    appliances,
    sources,
    detailStatus,
    detailError,
    canWrite,
    load,
    create,
    loadVehicle,
    patchVehicle,
    removeVehicle,
    reloadVehicle,
    saveBattery,
    reloadBattery,
    saveInverter,
    reloadInverter,
    addAppliance,
    patchAppliance,
    removeAppliance,
    reloadAppliances,
    addSource,
    patchSource,
    removeSource,
    reloadSources,
  }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useVehiclesStore, import.meta.hot))
