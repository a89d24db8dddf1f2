/**
 * API contract of the Logs area (docs/logs.md). Requests are parsed with these schemas on the server;
 * answers are typed for the client.
 */
import { z } from 'zod'
import type { Comparison, PlannedDay } from './compare.ts'
import type { LogMappingDraft } from './mapping.ts'
import type { SpreadTrend } from './trend.ts'
import { LogMappingSchema, type LogDay, type LogError, type LogFormat, type LogMapping } from './types.ts'

/** POST /api/vehicles/:vehicleId/logs/:uploadId/check and …/import */
export const LogMappingRequestSchema = z.strictObject({ mapping: LogMappingSchema })
export type LogMappingRequest = z.infer<typeof LogMappingRequestSchema>

/** GET /api/logs/:uploadId/compare?scenarioId= */
export const LogCompareQuerySchema = z.object({ scenarioId: z.uuid({ error: 'must be a scenario id' }) })

/** POST /api/logs/:uploadId/calibrate */
export const LogCalibrateRequestSchema = z.strictObject({
  scenarioId: z.uuid({ error: 'must be a scenario id' }),
  name: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters').optional(),
})
export type LogCalibrateRequest = z.infer<typeof LogCalibrateRequestSchema>

export interface LogCheckResult {
  /** Data rows read. */
  rowCount: number
  /** false when only the first LOG_LIMITS.checkRows rows were read (the import reads them all). */
  complete: boolean
  errors: LogError[]
  /** All errors, including those not listed. */
  errorCount: number
  firstTs: string | null
  lastTs: string | null
}

/** Answer of POST /api/vehicles/:vehicleId/logs/preview (multipart field `file`). */
export interface LogPreview {
  uploadId: string
  fileName: string
  sizeBytes: number
  detected: LogFormat
  columns: string[]
  /** Doubts about the detection, in plain words. */
  notes: string[]
  proposal: {
    mapping: LogMappingDraft
    reasons: Partial<Record<string, string>>
    missing: string[]
    source: 'detected' | 'remembered'
  }
  /** The first rows as split with the detected format; `row` is the spreadsheet line. */
  rows: { row: number; cells: string[] }[]
  /** The whole file checked against the proposed mapping (null while the proposal is incomplete). */
  check: LogCheckResult | null
}

export interface LogUpload {
  id: string
  vehicleId: string
  fileName: string
  sizeBytes: number
  rowCount: number
  firstTs: string
  lastTs: string
  dayCount: number
  mapping: LogMapping
  spreadTrend: SpreadTrend
  createdAt: string
  createdBy: { id: string; displayName: string } | null
}

/** GET /api/logs/:uploadId/days */
export interface LogDaysAnswer {
  upload: LogUpload
  days: LogDay[]
}

/** GET /api/logs/:uploadId/compare?scenarioId= */
export interface LogCompareAnswer extends Comparison {
  scenario: { id: string; name: string; vehicleId: string }
  planDays: PlannedDay[]
}

/** POST /api/logs/:uploadId/calibrate → 201 */
export interface LogCalibrateAnswer {
  scenario: { id: string; name: string; vehicleId: string; version: number }
  ratio: number
  /** Appliances that could not be scaled fully (window full, duty cycle 1). */
  capped: string[]
}

/** 400 body of a failed import: nothing was stored. */
export interface LogImportInvalidBody {
  error: { code: 'import_invalid'; message: string; errors: LogError[]; errorCount: number }
}
