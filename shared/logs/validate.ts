/**
 * Row-level validation of a log against a confirmed mapping: every problem names its row, its column and
 * why. Streaming: the validator keeps only the previous timestamp, so a file of any length passes through it.
 */
import { parseNumber, splitCsvLine } from './detect.ts'
import { parseTimestampMs } from './timestamp.ts'
import { DELIMITERS, LOG_LIMITS, type LogError, type LogMapping, type LogSample } from './types.ts'

export interface ColumnIndex {
  ts: number
  volt: number | null
  current: number
  soc: number | null
  temps: number[]
  cells: number[]
}

const DELIMITER_NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'bar' }

/** "a semicolon (;)" */
export function delimiterName(d: string): string {
  return `${DELIMITER_NAMES[d] ?? d}${d === '\t' ? '' : ` (${d})`}`
}

/**
 * Find the mapped columns in the file's columns. A file that splits into one column while another delimiter
 * would split it is reported as a wrong delimiter, not as a list of missing columns.
 * @param firstCells - the first row as split (the header, or the first data row without one).
 */
export function resolveColumns(
  mapping: LogMapping,
  columns: readonly string[],
  firstCells: readonly string[],
): { ok: true; index: ColumnIndex } | { ok: false; errors: LogError[] } {
  if (firstCells.length === 1) {
    const other = DELIMITERS.find(
      (d) => d !== mapping.format.delimiter && splitCsvLine(firstCells[0]!, d).length >= 2,
    )
    if (other) {
      return {
        ok: false,
        errors: [
          {
            row: 1,
            column: null,
            code: 'wrong_delimiter',
            message: `Row 1 does not split on a ${delimiterName(mapping.format.delimiter)} but does on a ${delimiterName(other)}. Choose ${delimiterName(other)} as the delimiter.`,
          },
        ],
      }
    }
  }
  const errors: LogError[] = []
  const find = (name: string | null, role: string): number | null => {
    if (name === null) return null
    const i = columns.indexOf(name)
    if (i < 0) {
      errors.push({
        row: 1,
        column: name,
        code: 'missing_column',
        message: `The ${role} column “${name}” is not in this file (its columns: ${columns.slice(0, 12).join(', ')}${columns.length > 12 ? ', …' : ''}).`,
      })
      return -1
    }
    return i
  }
  const index: ColumnIndex = {
    ts: find(mapping.timestampColumn, 'time')!,
    volt: find(mapping.packVoltageColumn, 'pack voltage'),
    current: find(mapping.currentColumn, 'current')!,
    soc: find(mapping.socColumn, 'state of charge'),
    temps: mapping.temperatureColumns.map((c) => find(c, 'temperature')!),
    cells: mapping.cellVoltageColumns.map((c, i) => find(c, `cell ${i + 1} voltage`)!),
  }
  return errors.length ? { ok: false, errors } : { ok: true, index }
}

export interface RowResult {
  sample: LogSample | null
  errors: LogError[]
}

const fmt = (n: number) => (Math.abs(n) >= 100 ? n.toFixed(0) : Number(n.toPrecision(4)).toString())

/**
 * Checks each data row in file order and turns it into a sample. Keeps the latest timestamp seen to catch
 * rows out of order, duplicated times and gaps longer than `mapping.maxGapMinutes`.
 */
export class LogRowValidator {
  private lastTsMs = -Infinity
  private lastRow = 0
  private readonly maxGapMs: number

  constructor(
    private readonly mapping: LogMapping,
    private readonly index: ColumnIndex,
    private readonly columns: readonly string[],
  ) {
    this.maxGapMs = mapping.maxGapMinutes * 60_000
  }

  /** @param row - the spreadsheet line number of this row (header = 1). */
  check(cells: readonly string[], row: number): RowResult {
    const errors: LogError[] = []
    const m = this.mapping
    if (cells.length !== this.columns.length) {
      const hint =
        cells.length === 1 ? ` Check the delimiter (now ${delimiterName(m.format.delimiter)}).` : ''
      errors.push({
        row,
        column: null,
        code: 'column_count',
        message: `Row ${row} has ${cells.length} cells; the file has ${this.columns.length} columns.${hint}`,
      })
      return { sample: null, errors }
    }
    // Time
    const tsText = cells[this.index.ts]!
    let tsMs: number | null = null
    if (tsText.trim() === '') {
      errors.push({
        row,
        column: this.columns[this.index.ts]!,
        code: 'missing_value',
        message: 'The time is empty.',
      })
    } else {
      tsMs = parseTimestampMs(tsText, m.timestampFormat, m.utcOffsetMinutes)
      if (tsMs === null) {
        errors.push({
          row,
          column: this.columns[this.index.ts]!,
          code: 'bad_timestamp',
          message: `“${tsText.slice(0, 40)}” is not a time in the chosen format (${m.timestampFormat}).`,
        })
      } else if (tsMs === this.lastTsMs) {
        errors.push({
          row,
          column: this.columns[this.index.ts]!,
          code: 'timestamp_duplicate',
          message: `Row ${row} has the same time as row ${this.lastRow} (${tsText.trim()}).`,
        })
      } else if (tsMs < this.lastTsMs) {
        errors.push({
          row,
          column: this.columns[this.index.ts]!,
          code: 'timestamp_out_of_order',
          message: `Row ${row} (${tsText.trim()}) is earlier than row ${this.lastRow}; rows must run forward in time.`,
        })
      } else if (this.lastRow > 0 && tsMs - this.lastTsMs > this.maxGapMs) {
        const gapMin = (tsMs - this.lastTsMs) / 60_000
        errors.push({
          row,
          column: this.columns[this.index.ts]!,
          code: 'gap',
          message: `No samples for ${gapMin >= 120 ? `${fmt(gapMin / 60)} h` : `${fmt(gapMin)} min`} between row ${this.lastRow} and row ${row} (allowed: ${m.maxGapMinutes} min). If the monitor was off, raise the allowed gap.`,
        })
      }
      if (tsMs !== null && tsMs > this.lastTsMs) {
        this.lastTsMs = tsMs
        this.lastRow = row
      }
    }

    // Current, positive into the pack
    let currentA = this.num(cells, row, errors, this.index.current, true, 'current')
    if (currentA !== null) {
      if (m.currentUnit === 'mA') currentA /= 1000
      if (m.currentSign === 'discharge-positive') currentA = -currentA
      if (Math.abs(currentA) > LOG_LIMITS.currentAbsAMax) {
        this.impossible(
          errors,
          row,
          this.index.current,
          `A current of ${fmt(currentA)} A is not possible here (limit ±${LOG_LIMITS.currentAbsAMax} A). Is the column in milliamps?`,
        )
      }
    }

    // Cells
    let cellVoltagesV: number[] | null = null
    if (this.index.cells.length) {
      const values: number[] = []
      for (const [k, i] of this.index.cells.entries()) {
        let v = this.num(cells, row, errors, i, false, `cell ${k + 1} voltage`)
        if (v === null) continue
        if (m.cellVoltageUnit === 'mV') v /= 1000
        if (v < LOG_LIMITS.cellVoltageVMin || v > LOG_LIMITS.cellVoltageVMax) {
          this.impossible(
            errors,
            row,
            i,
            `A cell voltage of ${fmt(v)} V is not possible (${LOG_LIMITS.cellVoltageVMin}–${LOG_LIMITS.cellVoltageVMax} V).${v > LOG_LIMITS.cellVoltageVMax ? ' Is the column in millivolts?' : ''}`,
          )
          continue
        }
        values.push(v)
      }
      cellVoltagesV = values.length === this.index.cells.length ? values : null
    }

    // Pack voltage (or the sum of the cells)
    let packVoltageV: number | null = null
    if (this.index.volt !== null) {
      packVoltageV = this.num(cells, row, errors, this.index.volt, true, 'pack voltage')
      if (packVoltageV !== null) {
        if (m.packVoltageUnit === 'mV') packVoltageV /= 1000
        if (packVoltageV <= 0 || packVoltageV > LOG_LIMITS.packVoltageVMax) {
          this.impossible(
            errors,
            row,
            this.index.volt,
            `A pack voltage of ${fmt(packVoltageV)} V is not possible for a 12–48 V pack (0–${LOG_LIMITS.packVoltageVMax} V).${packVoltageV > LOG_LIMITS.packVoltageVMax ? ' Is the column in millivolts?' : ''}`,
          )
          packVoltageV = null
        }
      }
    } else if (cellVoltagesV) {
      packVoltageV = cellVoltagesV.reduce((a, b) => a + b, 0)
    } else if (this.index.cells.length) {
      errors.push({
        row,
        column: null,
        code: 'missing_value',
        message: 'Without a pack voltage column every cell voltage is needed to add them up.',
      })
    }

    // State of charge
    let socFraction: number | null = null
    if (this.index.soc !== null) {
      const v = this.num(cells, row, errors, this.index.soc, false, 'state of charge')
      if (v !== null) {
        socFraction = m.socUnit === 'percent' ? v / 100 : v
        if (socFraction < 0 || socFraction > 1) {
          this.impossible(
            errors,
            row,
            this.index.soc,
            `A state of charge of ${m.socUnit === 'percent' ? `${fmt(v)} %` : fmt(v)} is not possible (0–${m.socUnit === 'percent' ? '100 %' : '1'}).`,
          )
          socFraction = null
        }
      }
    }

    // Temperatures
    let temperaturesC: number[] | null = null
    if (this.index.temps.length) {
      const values: number[] = []
      for (const i of this.index.temps) {
        let v = this.num(cells, row, errors, i, false, 'temperature')
        if (v === null) continue
        if (m.temperatureUnit === 'F') v = ((v - 32) * 5) / 9
        if (v < LOG_LIMITS.temperatureCMin || v > LOG_LIMITS.temperatureCMax) {
          this.impossible(
            errors,
            row,
            i,
            `A temperature of ${fmt(v)} °C is not possible here (${LOG_LIMITS.temperatureCMin} to ${LOG_LIMITS.temperatureCMax} °C).`,
          )
          continue
        }
        values.push(v)
      }
      temperaturesC = values.length ? values : null
    }

    if (errors.length || tsMs === null || currentA === null || packVoltageV === null)
      return { sample: null, errors }
    return { sample: { tsMs, packVoltageV, currentA, socFraction, temperaturesC, cellVoltagesV }, errors }
  }

  private impossible(errors: LogError[], row: number, i: number, message: string): void {
    errors.push({ row, column: this.columns[i]!, code: 'impossible_value', message })
  }

  private num(
    cells: readonly string[],
    row: number,
    errors: LogError[],
    i: number,
    required: boolean,
    what: string,
  ): number | null {
    const text = cells[i]!
    const d = this.mapping.format.decimalSeparator
    const v = parseNumber(text, d)
    if (v === null) {
      if (required)
        errors.push({
          row,
          column: this.columns[i]!,
          code: 'missing_value',
          message: `The ${what} is empty.`,
        })
      return null
    }
    if (!Number.isFinite(v)) {
      const hint =
        d === '.' && /^[+-]?\d+,\d+$/.test(text.trim())
          ? ' It uses a decimal comma: choose “,” as the decimal mark.'
          : ''
      errors.push({
        row,
        column: this.columns[i]!,
        code: 'not_a_number',
        message: `“${text.slice(0, 40)}” is not a number (${what}).${hint}`,
      })
      return null
    }
    return v
  }
}

/** Collects errors up to a listing limit while counting them all. */
export class ErrorList {
  readonly items: LogError[] = []
  total = 0
  constructor(private readonly limit: number = LOG_LIMITS.maxErrorsListed) {}
  add(errors: readonly LogError[]): void {
    for (const e of errors) {
      this.total++
      if (this.items.length < this.limit) this.items.push(e)
    }
  }
}
