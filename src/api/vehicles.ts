/**
 * Vehicles and their equipment (docs/api.md). Every answer is parsed with the shared contract, so a
 * server that breaks it fails here, not three components later.
 */
import { z } from 'zod'
import {
  ApplianceLibrarySchema,
  ApplianceRecordSchema,
  ApplianceListSchema,
  BatteryRecordSchema,
  ChargeSourceListSchema,
  ChargeSourceRecordSchema,
  HistoryListSchema,
  ImportPreviewSchema,
  ImportResultSchema,
  InverterRecordSchema,
  VehicleDetailSchema,
  VehicleListSchema,
  type ApplianceCreate,
  type AppliancePatch,
  type ApplianceImportRequest,
  type BatteryPut,
  type ChargeSourceCreate,
  type ChargeSourcePatch,
  type InverterPut,
  type VehicleCreate,
  type VehiclePatch,
} from '@shared/schemas/vehicles'
import { http } from './http'

const v = (vehicleId: string) => `/vehicles/${encodeURIComponent(vehicleId)}`
const parse =
  <S extends z.ZodType>(schema: S) =>
  (body: unknown): z.output<S> =>
    schema.parse(body)

export const vehiclesApi = {
  list: (limit = 100, offset = 0) =>
    http.get(`/vehicles?limit=${limit}&offset=${offset}`).then(parse(VehicleListSchema)),
  get: (vehicleId: string) => http.get(v(vehicleId)).then(parse(VehicleDetailSchema)),
  create: (input: VehicleCreate) => http.post('/vehicles', input).then(parse(VehicleDetailSchema)),
  patch: (vehicleId: string, patch: VehiclePatch) =>
    http.patch(v(vehicleId), patch).then(parse(VehicleDetailSchema)),
  remove: (vehicleId: string, version: number) => http.del<void>(`${v(vehicleId)}?version=${version}`),

  battery: (vehicleId: string) => http.get(`${v(vehicleId)}/battery`).then(parse(BatteryRecordSchema)),
  putBattery: (vehicleId: string, body: BatteryPut) =>
    http.put(`${v(vehicleId)}/battery`, body).then(parse(BatteryRecordSchema)),
  inverter: (vehicleId: string) => http.get(`${v(vehicleId)}/inverter`).then(parse(InverterRecordSchema)),
  putInverter: (vehicleId: string, body: InverterPut) =>
    http.put(`${v(vehicleId)}/inverter`, body).then(parse(InverterRecordSchema)),

  appliances: (vehicleId: string) => http.get(`${v(vehicleId)}/appliances`).then(parse(ApplianceListSchema)),
  createAppliance: (vehicleId: string, input: ApplianceCreate) =>
    http.post(`${v(vehicleId)}/appliances`, input).then(parse(ApplianceRecordSchema)),
  patchAppliance: (vehicleId: string, applianceId: string, patch: AppliancePatch) =>
    http
      .patch(`${v(vehicleId)}/appliances/${encodeURIComponent(applianceId)}`, patch)
      .then(parse(ApplianceRecordSchema)),
  removeAppliance: (vehicleId: string, applianceId: string, version: number) =>
    http.del<void>(`${v(vehicleId)}/appliances/${encodeURIComponent(applianceId)}?version=${version}`),
  previewImport: (vehicleId: string, req: Omit<ApplianceImportRequest, 'confirm'>) =>
    http
      .post(`${v(vehicleId)}/appliances/import`, { ...req, confirm: false })
      .then(parse(ImportPreviewSchema)),
  confirmImport: (vehicleId: string, req: Omit<ApplianceImportRequest, 'confirm'>) =>
    http.post(`${v(vehicleId)}/appliances/import`, { ...req, confirm: true }).then(parse(ImportResultSchema)),
  /** Where the browser downloads the inventory as CSV (a plain link, so the browser saves the file). */
  csvUrl: (vehicleId: string) => `/api${v(vehicleId)}/appliances.csv`,

  sources: (vehicleId: string) => http.get(`${v(vehicleId)}/sources`).then(parse(ChargeSourceListSchema)),
  createSource: (vehicleId: string, input: ChargeSourceCreate) =>
    http.post(`${v(vehicleId)}/sources`, input).then(parse(ChargeSourceRecordSchema)),
  patchSource: (vehicleId: string, sourceId: string, patch: ChargeSourcePatch) =>
    http
      .patch(`${v(vehicleId)}/sources/${encodeURIComponent(sourceId)}`, patch)
      .then(parse(ChargeSourceRecordSchema)),
  removeSource: (vehicleId: string, sourceId: string, version: number) =>
    http.del<void>(`${v(vehicleId)}/sources/${encodeURIComponent(sourceId)}?version=${version}`),

  history: (vehicleId: string, limit = 20, offset = 0) =>
    http.get(`${v(vehicleId)}/history?limit=${limit}&offset=${offset}`).then(parse(HistoryListSchema)),
  library: () => http.get('/appliance-library').then(parse(ApplianceLibrarySchema)),
}
