/**
 * Reports and plan files (issue 10): download links for the PDF report, the plan file and the hourly CSV,
 * and importing a plan file into a vehicle as a new scenario. Downloads are plain GET links (the browser
 * sends the session cookie and saves the file the server names).
 */
import { http } from './http'
import type { Scenario } from '@shared/schemas/vehicles'

const enc = encodeURIComponent

export const reportPdfUrl = (scenarioId: string) => `/api/scenarios/${enc(scenarioId)}/report.pdf`
export const planFileUrl = (scenarioId: string) => `/api/scenarios/${enc(scenarioId)}/export.json`
export const hourlyCsvUrl = (scenarioId: string) => `/api/scenarios/${enc(scenarioId)}/hourly.csv`

export interface PlanImportResult {
  scenario: Scenario
  equipmentCreated: boolean
  upgradedFrom: number | null
  notes: string[]
}

/** POST the parsed file; 400 `import_invalid` comes back as an ApiError with `fields`. */
export async function importPlanFile(
  vehicleId: string,
  file: unknown,
  name?: string,
): Promise<PlanImportResult> {
  const q = name?.trim() ? `?name=${enc(name.trim())}` : ''
  return http.post<PlanImportResult>(`/vehicles/${enc(vehicleId)}/scenarios/import${q}`, file)
}
