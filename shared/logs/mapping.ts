/**
 * A proposed column mapping from the header names and the values' ranges. The user confirms or corrects it.
 * Rules of thumb here (names, ranges) are common practice, no source.
 */
import { parseNumber, type DetectedShape } from './detect.ts'
import { detectTimestampFormat } from './timestamp.ts'
import { LOG_LIMITS, LogMappingSchema, type LogMapping } from './types.ts'

/** A mapping that may still lack its required columns (timestamp, current). */
export type LogMappingDraft = Omit<LogMapping, 'timestampColumn' | 'currentColumn'> & {
  timestampColumn: string | null
  currentColumn: string | null
}

export interface MappingProposal {
  mapping: LogMappingDraft
  /** Why each choice was made, in plain words, by mapping field. */
  reasons: Partial<Record<keyof LogMappingDraft, string>>
  /** Things the user must settle before importing. */
  missing: string[]
}

const norm = (s: string) =>
  s
    .toLowerCase()
    .replace(/[_\s]+/g, ' ')
    .trim()

const CELL = /(cell|zelle|cellule|celda|^c)\s*#?\s*(\d{1,2})\b|^v\s*(\d{1,2})$|^u\s*(\d{1,2})$/
const TIME = /time|date|timestamp|^ts$|zeit|datum|heure|tiempo|fecha/
const SOC = /\bsoc\b|state of charge|ladezustand|charge level|^soc|soc ?%|soc \(/
const CURRENT = /current|amp|strom|courant|corriente|^i\b|^i ?\(|^a$|\bcurrent\b/
const VOLT = /volt|spannung|tension|^v$|^v ?\(|^u$|^u ?\(|pack ?v|batt(ery)? ?v|^voltage/
const TEMP = /temp|°c|°f|\bdeg|^t ?\d|ntc|mosfet|mos\b/

/** Numbers of one column in the sample rows (NaN and empty cells dropped). */
function columnNumbers(shape: DetectedShape, index: number): number[] {
  const out: number[] = []
  for (const row of shape.rows) {
    const v = parseNumber(row[index] ?? '', shape.format.decimalSeparator)
    if (v !== null && Number.isFinite(v)) out.push(v)
  }
  return out
}

function median(values: number[]): number {
  if (values.length === 0) return Number.NaN
  const s = [...values].sort((a, b) => a - b)
  const mid = s.length >> 1
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}

/**
 * Propose a mapping for a detected file shape.
 * @param remembered - the vehicle's last confirmed mapping; used when every column it names exists here.
 */
export function proposeMapping(shape: DetectedShape, remembered?: LogMapping | null): MappingProposal {
  if (remembered && rememberedFits(remembered, shape)) {
    return {
      mapping: { ...remembered, format: shape.format },
      reasons: { timestampColumn: 'Same columns as the last confirmed upload of this vehicle.' },
      missing: [],
    }
  }
  const names = shape.columns.map(norm)
  const reasons: MappingProposal['reasons'] = {}
  const taken = new Set<number>()
  const pick = (test: (n: string, i: number) => boolean): number => {
    const i = names.findIndex((n, idx) => !taken.has(idx) && test(n, idx))
    if (i >= 0) taken.add(i)
    return i
  }

  // Cells first, so "Cell 1 voltage" never becomes the pack voltage.
  const cells: { index: number; n: number }[] = []
  names.forEach((n, i) => {
    const m = CELL.exec(n)
    const num = m ? Number(m[2] ?? m[3] ?? m[4]) : NaN
    if (m && num >= 1 && !TEMP.test(n)) cells.push({ index: i, n: num })
  })
  cells.sort((a, b) => a.n - b.n)
  for (const c of cells) taken.add(c.index)

  let ts = pick((n) => TIME.test(n))
  if (ts < 0) {
    ts = pick((_n, i) => detectTimestampFormat(shape.rows.map((r) => r[i] ?? '')) !== null)
    if (ts >= 0) reasons.timestampColumn = 'Its values read as dates and times.'
  } else reasons.timestampColumn = 'Its name says time or date.'
  const tsValues = ts >= 0 ? shape.rows.map((r) => r[ts] ?? '') : []
  const tsFormat = detectTimestampFormat(tsValues)
  if (tsFormat) {
    reasons.timestampFormat = tsFormat.ambiguous
      ? 'Day and month could not be told apart (every part is 12 or less); check it.'
      : 'Read from the values.'
  }

  const soc = pick((n) => SOC.test(n))
  const current = pick((n) => CURRENT.test(n) && !/limit|max|min/.test(n))
  const volt = pick((n) => VOLT.test(n) && !/limit|max|min|cell/.test(n))
  const temps: number[] = []
  names.forEach((n, i) => {
    if (!taken.has(i) && TEMP.test(n) && temps.length < LOG_LIMITS.maxTemperatureColumns) {
      temps.push(i)
      taken.add(i)
    }
  })

  const col = (i: number) => (i >= 0 ? shape.columns[i]! : null)
  const header = (i: number) => (i >= 0 ? names[i]! : '')

  // Volts or millivolts: a 12–48 V pack never reads above 100 V; cells never above 5 V.
  const packMedian = volt >= 0 ? median(columnNumbers(shape, volt)) : NaN
  const packVoltageUnit: 'V' | 'mV' = /\bmv\b|\(mv\)/.test(header(volt)) || packMedian > 200 ? 'mV' : 'V'
  if (volt >= 0)
    reasons.packVoltageUnit =
      packVoltageUnit === 'mV'
        ? 'Values around ' + Math.round(packMedian) + ': millivolts.'
        : 'Values are in the range of volts.'
  const cellMedian = cells.length ? median(columnNumbers(shape, cells[0]!.index)) : NaN
  const cellVoltageUnit: 'V' | 'mV' =
    /\bmv\b|\(mv\)/.test(header(cells[0]?.index ?? -1)) || cellMedian > 10 ? 'mV' : 'V'
  if (cells.length)
    reasons.cellVoltageUnit =
      cellVoltageUnit === 'mV' ? 'Values in the thousands: millivolts.' : 'Values of a few volts.'
  const currentUnit: 'A' | 'mA' = /\bma\b|\(ma\)/.test(header(current)) ? 'mA' : 'A'

  const socValues = soc >= 0 ? columnNumbers(shape, soc) : []
  const socUnit: 'percent' | 'fraction' =
    socValues.length && Math.max(...socValues) <= 1 ? 'fraction' : 'percent'

  const sign = current >= 0 ? guessCurrentSign(shape, current, soc, volt) : null
  if (sign) reasons.currentSign = sign.reason
  const temperatureUnit: 'C' | 'F' = temps.some((i) => /°f|\(f\)|fahrenheit/.test(header(i))) ? 'F' : 'C'

  const mapping: LogMappingDraft = {
    format: shape.format,
    timestampColumn: col(ts),
    timestampFormat: tsFormat?.format ?? 'ymd',
    utcOffsetMinutes: tsFormat?.explicitOffsetMinutes ?? 0,
    packVoltageColumn: col(volt),
    packVoltageUnit,
    currentColumn: col(current),
    currentUnit,
    currentSign: sign?.sign ?? 'charge-positive',
    socColumn: col(soc),
    socUnit,
    temperatureColumns: temps.map((i) => shape.columns[i]!),
    temperatureUnit,
    cellVoltageColumns: cells.map((c) => shape.columns[c.index]!),
    cellVoltageUnit,
    maxGapMinutes: LOG_LIMITS.maxGapMinutesDefault,
  }
  const missing: string[] = []
  if (ts < 0) missing.push('Which column holds the time of each sample?')
  if (current < 0) missing.push('Which column holds the pack current?')
  if (volt < 0 && cells.length === 0) missing.push('Which column holds the pack voltage?')
  return { mapping, reasons, missing }
}

function rememberedFits(m: LogMapping, shape: DetectedShape): boolean {
  const have = new Set(shape.columns)
  const used = [
    m.timestampColumn,
    m.packVoltageColumn,
    m.currentColumn,
    m.socColumn,
    ...m.temperatureColumns,
    ...m.cellVoltageColumns,
  ]
  return used.every((c) => c === null || have.has(c))
}

/**
 * Sign convention of the current column: while charging, state of charge (or else pack voltage) rises.
 * Correlate current with the change of SOC between samples; fall back to current vs voltage
 * (the pack's internal resistance lifts the voltage under charge current).
 */
function guessCurrentSign(
  shape: DetectedShape,
  current: number,
  soc: number,
  volt: number,
): { sign: LogMapping['currentSign']; reason: string } | null {
  const d = shape.format.decimalSeparator
  const num = (row: string[] | undefined, i: number) => (i >= 0 && row ? parseNumber(row[i] ?? '', d) : null)
  let score = 0
  let used = 0
  if (soc >= 0) {
    for (let r = 1; r < shape.rows.length; r++) {
      const i = num(shape.rows[r], current)
      const s0 = num(shape.rows[r - 1], soc)
      const s1 = num(shape.rows[r], soc)
      if (i === null || s0 === null || s1 === null || !Number.isFinite(i + s0 + s1) || s1 === s0) continue
      score += Math.sign(i) * Math.sign(s1 - s0)
      used++
    }
    if (used >= 3 && Math.abs(score) >= used * 0.3) {
      return score > 0
        ? { sign: 'charge-positive', reason: 'Current is positive while state of charge rises.' }
        : { sign: 'discharge-positive', reason: 'Current is positive while state of charge falls.' }
    }
  }
  if (volt >= 0) {
    const pairs: [number, number][] = []
    for (const row of shape.rows) {
      const i = num(row, current)
      const v = num(row, volt)
      if (i !== null && v !== null && Number.isFinite(i + v)) pairs.push([i, v])
    }
    const r = correlation(pairs)
    if (pairs.length >= 5 && Math.abs(r) > 0.3) {
      return r > 0
        ? {
            sign: 'charge-positive',
            reason: 'Voltage is higher when the current is positive (charging lifts it).',
          }
        : {
            sign: 'discharge-positive',
            reason: 'Voltage is lower when the current is positive (a load pulls it down).',
          }
    }
  }
  return {
    sign: 'charge-positive',
    reason: 'Most monitors count charging as positive; the values did not tell. Check it.',
  }
}

function correlation(pairs: [number, number][]): number {
  const n = pairs.length
  if (n < 2) return 0
  let sx = 0,
    sy = 0
  for (const [x, y] of pairs) {
    sx += x
    sy += y
  }
  const mx = sx / n,
    my = sy / n
  let sxy = 0,
    sxx = 0,
    syy = 0
  for (const [x, y] of pairs) {
    sxy += (x - mx) * (y - my)
    sxx += (x - mx) ** 2
    syy += (y - my) ** 2
  }
  return sxx > 0 && syy > 0 ? sxy / Math.sqrt(sxx * syy) : 0
}

/** Validate a draft as a full mapping (field errors keyed by path), e.g. before an import. */
export function completeMapping(
  draft: LogMappingDraft,
): { ok: true; mapping: LogMapping } | { ok: false; fields: Record<string, string[]> } {
  const r = LogMappingSchema.safeParse(draft)
  if (r.success) return { ok: true, mapping: r.data }
  const fields: Record<string, string[]> = {}
  for (const issue of r.error.issues) (fields[issue.path.join('.') || '_'] ??= []).push(issue.message)
  return { ok: false, fields }
}
