/**
 * One streaming pass over an uploaded log: split rows, check each against the mapping, hand good samples
 * to a callback (the import inserts them), and summarise days as they pass. Used by the preview (check
 * only) and by the import.
 */
import { DailySummarizer } from '../../../shared/logs/daily'
import { ErrorList, LogRowValidator, resolveColumns } from '../../../shared/logs/validate'
import {
  LOG_LIMITS,
  type LogDay,
  type LogError,
  type LogMapping,
  type LogSample,
} from '../../../shared/logs/types'
import { uniqueNames } from '../../../shared/logs/detect'
import { readCsvBatches } from './csv'

export interface ScanResult {
  rowCount: number
  /** Every row was read. */
  complete: boolean
  errors: LogError[]
  errorCount: number
  firstTsMs: number | null
  lastTsMs: number | null
  days: LogDay[]
}

export interface ScanOptions {
  /** Called with each good sample while no error has been seen; awaited (backpressure). */
  onSample?: (s: LogSample) => void | Promise<void>
  /** Build daily summaries (the import does; the preview check does not need them). */
  summarise?: boolean
  /** Stop after this many data rows (the preview); the result then says `complete: false`. */
  maxRows?: number
}

export async function scanLog(
  path: string,
  mapping: LogMapping,
  options: ScanOptions = {},
): Promise<ScanResult> {
  const errors = new ErrorList()
  const summary = options.summarise
    ? new DailySummarizer(mapping.utcOffsetMinutes, mapping.maxGapMinutes)
    : null
  let validator: LogRowValidator | null = null
  let line = 0
  let rowCount = 0
  let complete = true
  let firstTsMs: number | null = null
  let lastTsMs: number | null = null

  batches: for await (const batch of readCsvBatches(path, mapping.format.delimiter)) {
    for (const cells of batch) {
      line++
      if (!validator) {
        const columns = mapping.format.hasHeader
          ? uniqueNames(cells.map((c, i) => c.trim() || `Column ${i + 1}`))
          : cells.map((_, i) => `Column ${i + 1}`)
        const resolved = resolveColumns(mapping, columns, cells)
        if (!resolved.ok) {
          errors.add(resolved.errors)
          break batches
        }
        validator = new LogRowValidator(mapping, resolved.index, columns)
        if (mapping.format.hasHeader) continue
      }
      if (options.maxRows !== undefined && rowCount >= options.maxRows) {
        complete = false
        break batches
      }
      rowCount++
      if (rowCount > LOG_LIMITS.maxRows) {
        errors.add([
          {
            row: line,
            column: null,
            code: 'too_many_rows',
            message: `The file has more than ${LOG_LIMITS.maxRows.toLocaleString('en')} rows. Split it into shorter periods.`,
          },
        ])
        break batches
      }
      const r = validator.check(cells, line)
      if (r.errors.length) errors.add(r.errors)
      if (!r.sample) continue
      firstTsMs ??= r.sample.tsMs
      lastTsMs = Math.max(lastTsMs ?? r.sample.tsMs, r.sample.tsMs)
      summary?.add(r.sample)
      if (errors.total === 0 && options.onSample) {
        // Only a flush returns a promise; most rows continue without a trip through the microtask queue.
        const pending = options.onSample(r.sample)
        if (pending) await pending
      }
    }
  }
  if (line === 0) {
    errors.add([{ row: 0, column: null, code: 'empty_file', message: 'The file is empty.' }])
  } else if (validator && rowCount === 0) {
    errors.add([
      { row: 0, column: null, code: 'no_data_rows', message: 'The file has a header but no data rows.' },
    ])
  }
  return {
    rowCount,
    complete,
    errors: errors.items,
    errorCount: errors.total,
    firstTsMs,
    lastTsMs,
    days: summary?.finish() ?? [],
  }
}
