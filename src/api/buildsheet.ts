import {
  BuildSheetResponseSchema,
  BuildSheetSettingsRecordSchema,
  PartRecordSchema,
  type BuildSheetResponse,
  type BuildSheetSettingsPut,
  type BuildSheetSettingsRecord,
  type PartCreate,
  type PartPatch,
  type PartRecord,
} from '@shared/buildsheet/schema'
import { http } from './http'

const base = (vehicleId: string) => `/vehicles/${encodeURIComponent(vehicleId)}`

/** The build sheet and parts list of a vehicle (docs/build-sheet.md). Responses are checked against the contract. */
export const buildSheetApi = {
  async get(vehicleId: string, scenarioId?: string): Promise<BuildSheetResponse> {
    const q = scenarioId ? `?scenarioId=${encodeURIComponent(scenarioId)}` : ''
    return BuildSheetResponseSchema.parse(await http.get(`${base(vehicleId)}/build-sheet${q}`))
  },
  async putSettings(vehicleId: string, body: BuildSheetSettingsPut): Promise<BuildSheetSettingsRecord> {
    return BuildSheetSettingsRecordSchema.parse(
      await http.put(`${base(vehicleId)}/build-sheet/settings`, body),
    )
  },
  async createPart(vehicleId: string, body: PartCreate): Promise<PartRecord> {
    return PartRecordSchema.parse(await http.post(`${base(vehicleId)}/parts`, body))
  },
  async patchPart(vehicleId: string, partId: string, body: PartPatch): Promise<PartRecord> {
    return PartRecordSchema.parse(await http.patch(`${base(vehicleId)}/parts/${partId}`, body))
  },
  async deletePart(vehicleId: string, partId: string, version: number): Promise<void> {
    await http.del(`${base(vehicleId)}/parts/${partId}?version=${version}`)
  },
}
