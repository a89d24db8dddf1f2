/**
 * Detection of a log file's shape from its first lines: delimiter, header row and decimal mark.
 * Works on a text sample (the server reads the first few tens of kilobytes), never the whole file.
 */
import { DELIMITERS, type Delimiter, type LogFormat } from './types.ts'

/** Split one CSV line on a delimiter, honouring double quotes ("a;b" stays one cell, "" is a quote). */
export function splitCsvLine(line: string, delimiter: string): string[] {
  const out: string[] = []
  let cell = ''
  let quoted = false
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!
    if (quoted) {
      if (ch === '"') {
        if (line[i + 1] === '"') {
          cell += '"'
          i++
        } else quoted = false
      } else cell += ch
    } else if (ch === '"' && cell === '') quoted = true
    else if (ch === delimiter) {
      out.push(cell)
      cell = ''
    } else cell += ch
  }
  out.push(cell)
  return out
}

/** Lines of a text sample, without a trailing partial line when the sample was cut mid-file. */
export function sampleLines(text: string, complete: boolean, max = 60): string[] {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text
  const lines = body.split(/\r\n|\n|\r/)
  if (!complete && lines.length > 1) lines.pop()
  return lines.filter((l) => l.trim() !== '').slice(0, max)
}

function mode(values: number[]): { value: number; count: number } {
  const counts = new Map<number, number>()
  for (const v of values) counts.set(v, (counts.get(v) ?? 0) + 1)
  let best = { value: 0, count: 0 }
  for (const [value, count] of counts)
    if (count > best.count || (count === best.count && value > best.value)) best = { value, count }
  return best
}

/**
 * The delimiter that splits the lines into the same number (≥ 2) of columns most often.
 * Returns null when no candidate gives two or more columns.
 */
export function detectDelimiter(lines: readonly string[]): Delimiter | null {
  let best: { d: Delimiter; score: number } | null = null
  for (const d of DELIMITERS) {
    const counts = lines.map((l) => splitCsvLine(l, d).length)
    const m = mode(counts)
    if (m.value < 2) continue
    // Consistency first, then more columns (a ';' file with decimal commas splits on ',' less regularly).
    const score = m.count * 1000 + m.value
    if (!best || score > best.score) best = { d, score }
  }
  return best?.d ?? null
}

const NUMBER_DOT = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/
const NUMBER_COMMA = /^[+-]?\d+,\d+$/

/** Is this cell a number under the given decimal mark? */
export function looksNumeric(cell: string, decimalSeparator: '.' | ',' = '.'): boolean {
  const s = cell.trim()
  if (s === '') return false
  return NUMBER_DOT.test(s) || (decimalSeparator === ',' && NUMBER_COMMA.test(s))
}

/** Parse a number cell; NaN when it is not one. Empty text → null. */
export function parseNumber(cell: string, decimalSeparator: '.' | ','): number | null {
  // Fast path for the common case (a plain decimal with a point), without regular expressions.
  if (decimalSeparator === '.' && cell.length > 0 && cell.length < 24) {
    const c0 = cell.charCodeAt(0)
    const c1 = cell.charCodeAt(cell.length - 1)
    if ((c0 === 45 || (c0 >= 48 && c0 <= 57)) && c1 >= 48 && c1 <= 57 && !/[^0-9.eE+-]/.test(cell)) {
      const n = Number(cell)
      if (Number.isFinite(n)) return n
    }
  }
  const s = cell.trim()
  if (s === '') return null
  if (NUMBER_DOT.test(s)) {
    // With a decimal comma a dot is not a decimal mark: "1.234" would be a thousands group, which we refuse.
    if (decimalSeparator === ',' && s.includes('.')) return Number.NaN
    return Number(s)
  }
  if (decimalSeparator === ',' && NUMBER_COMMA.test(s)) return Number(s.replace(',', '.'))
  return Number.NaN
}

function looksLikeTime(cell: string): boolean {
  return /^\d{1,4}[-/.]\d{1,2}[-/.]\d{1,4}/.test(cell.trim())
}

export interface DetectedShape {
  format: LogFormat
  /** Column names: the header's, or "Column 1", "Column 2", … without one. */
  columns: string[]
  /** Up to `max` data rows split by the detected delimiter (for the preview and mapping proposal). */
  rows: string[][]
  /** Why the result may be wrong, in plain words (empty when sure). */
  notes: string[]
}

/**
 * Delimiter, header and decimal mark from a text sample.
 * @param complete - true when `text` is the whole file (otherwise its last, cut line is dropped).
 */
export function detectShape(text: string, complete: boolean): DetectedShape | null {
  const lines = sampleLines(text, complete)
  if (lines.length === 0) return null
  const notes: string[] = []
  let delimiter = detectDelimiter(lines)
  if (!delimiter) {
    delimiter = ','
    notes.push('Every line has one column only; the delimiter could not be found.')
  }
  const split = lines.map((l) => splitCsvLine(l, delimiter).map((c) => c.trim()))
  const first = split[0]!
  const second = split[1]

  // Decimal comma: only possible when the delimiter is not a comma.
  let decimalSeparator: '.' | ',' = '.'
  if (delimiter !== ',') {
    const cells = split.slice(1).flat()
    const comma = cells.filter((c) => NUMBER_COMMA.test(c)).length
    const dot = cells.filter((c) => /^[+-]?\d+\.\d+$/.test(c)).length
    if (comma > dot) decimalSeparator = ','
  }

  // Header: the first row has fewer number/time cells than the second.
  const dataLike = (row: string[]) =>
    row.filter((c) => looksNumeric(c, decimalSeparator) || looksLikeTime(c)).length
  const hasHeader = second ? dataLike(first) < dataLike(second) : dataLike(first) === 0
  const width = Math.max(...split.map((r) => r.length))
  const columns = hasHeader
    ? uniqueNames(first.map((c, i) => c || `Column ${i + 1}`))
    : Array.from({ length: width }, (_, i) => `Column ${i + 1}`)
  return {
    format: { delimiter, hasHeader, decimalSeparator },
    columns,
    rows: hasHeader ? split.slice(1) : split,
    notes,
  }
}

/** Make header names unique ("Temp", "Temp" → "Temp", "Temp (2)") so a mapping can name each one. */
export function uniqueNames(names: readonly string[]): string[] {
  const seen = new Map<string, number>()
  return names.map((n) => {
    const count = (seen.get(n) ?? 0) + 1
    seen.set(n, count)
    return count === 1 ? n : `${n} (${count})`
  })
}
