import { http } from './http'
import type {
  LogCalibrateAnswer,
  LogCheckResult,
  LogCompareAnswer,
  LogDaysAnswer,
  LogUpload,
} from '@shared/logs/api'
import type { LogMapping } from '@shared/logs/types'

/** Logs area (docs/logs.md). The upload itself goes through QUploader to `previewUrl`. */
export const logsApi = {
  previewUrl: (vehicleId: string) => `/api/vehicles/${vehicleId}/logs/preview`,
  list: (vehicleId: string) => http.get<{ items: LogUpload[] }>(`/vehicles/${vehicleId}/logs`),
  check: (vehicleId: string, uploadId: string, mapping: LogMapping) =>
    http.post<LogCheckResult>(`/vehicles/${vehicleId}/logs/${uploadId}/check`, { mapping }),
  import: (vehicleId: string, uploadId: string, mapping: LogMapping) =>
    http.post<LogUpload>(`/vehicles/${vehicleId}/logs/${uploadId}/import`, { mapping }),
  days: (uploadId: string) => http.get<LogDaysAnswer>(`/logs/${uploadId}/days`),
  compare: (uploadId: string, scenarioId: string) =>
    http.get<LogCompareAnswer>(`/logs/${uploadId}/compare?scenarioId=${encodeURIComponent(scenarioId)}`),
  calibrate: (uploadId: string, scenarioId: string) =>
    http.post<LogCalibrateAnswer>(`/logs/${uploadId}/calibrate`, { scenarioId }),
  remove: (uploadId: string) => http.del<void>(`/logs/${uploadId}`),
  vehicle: (vehicleId: string) =>
    http.get<{ id: string; name: string; myRole: string }>(`/vehicles/${vehicleId}`),
  scenarios: (vehicleId: string) =>
    http.get<{ items: { id: string; name: string; startDate: string; days: number }[] }>(
      `/vehicles/${vehicleId}/scenarios?limit=100`,
    ),
}
