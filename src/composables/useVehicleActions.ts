import { ref } from 'vue'
import { useQuasar } from 'quasar'
import { useRouter } from 'vue-router'
import type { BatteryBank, Inverter } from '@shared/schemas/plan'
import type {
  ApplianceCreate,
  AppliancePatch,
  ApplianceRecord,
  ChargeSourceCreate,
  ChargeSourceKind,
  ChargeSourceRecord,
  VehicleCreate,
} from '@shared/schemas/vehicles'
import { ApiError } from '../api/http'
import { vehiclesApi } from '../api/vehicles'
import VehicleApplianceImportDialog from '../components/vehicle/VehicleApplianceImportDialog.vue'
import VehicleApplianceLibraryDialog from '../components/vehicle/VehicleApplianceLibraryDialog.vue'
import VehicleFormDialog from '../components/vehicle/VehicleFormDialog.vue'
import VehicleSourceDialog from '../components/vehicle/VehicleSourceDialog.vue'
import { newSource } from '../components/vehicle/sourceWords'
import { useVehiclesStore } from '../stores/vehicles'
import { useConflictDialog } from './useConflictDialog'

/**
 * Everything the vehicle page does that writes: each save carries the version it started from, and a
 * 409 opens the conflict dialog (load theirs, or apply my edit again). Errors other than conflicts are
 * shown as a notification, and field messages are kept for the forms.
 */
export function useVehicleActions() {
  const $q = useQuasar()
  const store = useVehiclesStore()
  const router = useRouter()
  const { saveWithConflicts } = useConflictDialog()
  const batteryError = ref<ApiError | null>(null)
  const inverterError = ref<ApiError | null>(null)
  const savingBattery = ref(false)
  const savingInverter = ref(false)

  const ok = (message: string) => $q.notify({ type: 'positive', message, icon: 'check_circle' })
  const fail = (e: unknown, what: string) =>
    $q.notify({
      type: 'negative',
      icon: 'error_outline',
      message: `${what}: ${e instanceof ApiError ? e.message : String(e)}`,
    })

  async function saveBattery(bank: BatteryBank): Promise<void> {
    const rec = store.battery!
    savingBattery.value = true
    batteryError.value = null
    try {
      const saved = await saveWithConflicts({
        what: 'The battery bank',
        base: rec,
        mine: bank,
        version: rec.version,
        whole: true,
        compare: (r) => r.battery,
        attempt: (version, body) => store.saveBattery(body, version),
        reload: store.reloadBattery,
      })
      if (saved) ok('Battery bank saved')
    } catch (e) {
      if (e instanceof ApiError && Object.keys(e.fields).length) batteryError.value = e
      fail(e, 'The battery bank was not saved')
    } finally {
      savingBattery.value = false
    }
  }

  async function saveInverter(inv: Inverter | null): Promise<void> {
    const rec = store.inverter!
    savingInverter.value = true
    inverterError.value = null
    try {
      const saved = await saveWithConflicts({
        what: 'The inverter',
        base: rec,
        mine: inv,
        version: rec.version,
        whole: true,
        compare: (r) => r.inverter,
        attempt: (version, body) => store.saveInverter(body, version),
        reload: store.reloadInverter,
      })
      if (saved) ok(inv ? 'Inverter saved' : 'Inverter removed')
    } catch (e) {
      if (e instanceof ApiError && Object.keys(e.fields).length) inverterError.value = e
      fail(e, 'The inverter was not saved')
    } finally {
      savingInverter.value = false
    }
  }

  async function patchAppliance(row: ApplianceRecord, patch: Omit<AppliancePatch, 'version'>): Promise<void> {
    try {
      await saveWithConflicts({
        what: `“${row.name}”`,
        base: row,
        mine: patch,
        version: row.version,
        attempt: (version, body) => store.patchAppliance(row.id, { ...body, version }),
        reload: store.reloadAppliances,
      })
    } catch (e) {
      const msg = e instanceof ApiError ? Object.values(e.fields).flat()[0] : undefined
      fail(msg ? new ApiError(400, 'validation_failed', msg) : e, `“${row.name}” was not changed`)
    }
  }

  function removeAppliance(row: ApplianceRecord): void {
    $q.dialog({
      title: `Remove “${row.name}”?`,
      message: 'It also leaves every scenario of this vehicle.',
      cancel: { flat: true, noCaps: true, label: 'Keep it' },
      ok: { color: 'negative', unelevated: true, noCaps: true, label: 'Remove' },
    }).onOk(async () => {
      try {
        await saveWithConflicts({
          what: `“${row.name}”`,
          base: row,
          mine: {},
          version: row.version,
          attempt: (version) => store.removeAppliance(row.id, version),
          reload: store.reloadAppliances,
        })
      } catch (e) {
        fail(e, `“${row.name}” was not removed`)
      }
    })
  }

  async function addBlankAppliance(): Promise<void> {
    const input: ApplianceCreate = {
      name: 'New appliance',
      category: 'other',
      supply: 'dc',
      powerW: 10,
      quantity: 1,
      hoursPerDay: 1,
      startHour: 0,
      endHour: 0,
    }
    try {
      await store.addAppliance(input)
      ok('Row added: tap a value to change it')
    } catch (e) {
      fail(e, 'The appliance was not added')
    }
  }

  async function addFromLibrary(): Promise<void> {
    let library
    try {
      library = await vehiclesApi.library()
    } catch (e) {
      fail(e, 'The library could not be loaded')
      return
    }
    $q.dialog({ component: VehicleApplianceLibraryDialog, componentProps: { library } }).onOk(
      async (items: ApplianceCreate[]) => {
        let added = 0
        try {
          for (const item of items) {
            await store.addAppliance(item)
            added++
          }
          ok(`${added} appliance${added === 1 ? '' : 's'} added`)
        } catch (e) {
          fail(e, `${added} of ${items.length} added; the rest were not`)
        }
      },
    )
  }

  function importCsv(): void {
    const id = store.current!.id
    $q.dialog({
      component: VehicleApplianceImportDialog,
      componentProps: {
        preview: (csv: string, mode: 'append' | 'replace') => vehiclesApi.previewImport(id, { csv, mode }),
        confirm: (csv: string, mode: 'append' | 'replace') => vehiclesApi.confirmImport(id, { csv, mode }),
      },
    }).onOk(async (r: { created: unknown[]; removed: number }) => {
      await store.reloadAppliances()
      ok(`${r.created.length} imported${r.removed ? `, ${r.removed} replaced` : ''}`)
    })
  }

  function editSource(kindOrSource: ChargeSourceKind | ChargeSourceRecord): void {
    const existing = typeof kindOrSource === 'string' ? null : kindOrSource
    const initial: ChargeSourceCreate = existing ?? newSource(kindOrSource as ChargeSourceKind)
    $q.dialog({
      component: VehicleSourceDialog,
      componentProps: {
        initial: existing ? stripMeta(existing) : initial,
        submit: async (s: ChargeSourceCreate) => {
          if (!existing) return void (await store.addSource(s))
          const { kind: _k, ...fields } = s
          await saveWithConflicts({
            what: `“${existing.name}”`,
            base: existing,
            mine: fields,
            version: existing.version,
            attempt: (version, body) => store.patchSource(existing.id, { ...body, version }),
            reload: store.reloadSources,
          })
        },
      },
    }).onOk(() => ok(existing ? 'Charge source saved' : 'Charge source added'))
  }

  function removeSource(s: ChargeSourceRecord): void {
    $q.dialog({
      title: `Remove “${s.name}”?`,
      cancel: { flat: true, noCaps: true, label: 'Keep it' },
      ok: { color: 'negative', unelevated: true, noCaps: true, label: 'Remove' },
    }).onOk(async () => {
      try {
        await saveWithConflicts({
          what: `“${s.name}”`,
          base: s,
          mine: {},
          version: s.version,
          attempt: (version) => store.removeSource(s.id, version),
          reload: store.reloadSources,
        })
      } catch (e) {
        fail(e, `“${s.name}” was not removed`)
      }
    })
  }

  function editVehicle(): void {
    const v = store.current!
    $q.dialog({
      component: VehicleFormDialog,
      componentProps: {
        title: 'Vehicle details',
        initial: { name: v.name, kind: v.kind, systemVoltageV: v.systemVoltageV, notes: v.notes },
        submit: (input: VehicleCreate) =>
          saveWithConflicts({
            what: 'The vehicle',
            base: v,
            mine: input,
            version: v.version,
            attempt: (version, body) => store.patchVehicle({ ...body, version }),
            reload: store.reloadVehicle,
          }),
      },
    })
  }

  /** Owner only: the vehicle with its equipment, scenarios and history. Asks for the name first. */
  function deleteVehicle(): void {
    const v = store.current!
    $q.dialog({
      title: `Delete “${v.name}”?`,
      message: `This removes its battery bank, appliances, charging, all ${v.scenarioCount} scenario(s) and its history, for every crew member. Type the vehicle's name to confirm.`,
      prompt: { model: '', type: 'text', outlined: true, isValid: (t: string) => t.trim() === v.name.trim() },
      cancel: { flat: true, noCaps: true, label: 'Keep it' },
      ok: { color: 'negative', unelevated: true, noCaps: true, label: 'Delete' },
    }).onOk(async () => {
      try {
        const gone = await saveWithConflicts({
          what: 'The vehicle',
          base: v,
          mine: {},
          version: v.version,
          attempt: (version) => store.removeVehicle(version),
          reload: store.reloadVehicle,
        })
        if (gone) {
          ok(`“${v.name}” deleted`)
          await router.push('/vehicles')
        }
      } catch (e) {
        fail(e, 'The vehicle was not deleted')
      }
    })
  }

  return {
    deleteVehicle,
    batteryError,
    inverterError,
    savingBattery,
    savingInverter,
    saveBattery,
    saveInverter,
    patchAppliance,
    removeAppliance,
    addBlankAppliance,
    addFromLibrary,
    importCsv,
    editSource,
    removeSource,
    editVehicle,
  }
}

function stripMeta(s: ChargeSourceRecord): ChargeSourceCreate {
  const { id: _id, vehicleId: _v, version: _ver, updatedAt: _u, updatedBy: _b, ...fields } = s
  return fields as ChargeSourceCreate
}
