/**
 * Hourly results as CSV: one row per simulated hour, SI units in the column names (the same words as the
 * engine's series, see shared/engine/GLOSSARY.md). Pure, so the server's download and a test build the
 * same text from the same results.
 */
import { LOAD_CATEGORIES, SOURCE_KINDS } from '../engine/prepare.ts'
import type { Analysis, Jsonified } from '../engine/index.ts'

type Results = Pick<Jsonified<Analysis>, 'hours' | 'series' | 'days'>

export const HOURLY_CSV_COLUMNS: readonly string[] = [
  'hour',
  'date',
  'hourOfDay',
  'socEndFraction',
  'packTempStartC',
  'ambientC',
  'ghiWPerM2',
  ...SOURCE_KINDS.map((k) => `source_${k}_W`),
  ...LOAD_CATEGORIES.map((c) => `load_${c}_W`),
  'unservedW',
  'curtailedW',
  'chargeBlockedW',
  'packLossW',
  'chargeBlockedCold',
]

/** Numbers with enough digits to rebuild the curves, without float noise (0.1 + 0.2 → 0.3). */
function num(x: number | null | undefined, digits: number): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return ''
  const r = Number(x.toFixed(digits))
  return String(Object.is(r, -0) ? 0 : r)
}

export function hourlyCsv(results: Results): string {
  const s = results.series
  const lines = [HOURLY_CSV_COLUMNS.join(',')]
  for (let h = 0; h < results.hours; h++) {
    const day = results.days[Math.floor(h / 24)]
    const row = [
      String(h),
      day?.date ?? '',
      String(h % 24),
      num(s.socEndFraction[h], 5),
      num(s.packTempStartC[h], 2),
      num(s.ambientC[h], 2),
      num(s.ghiWPerM2[h], 1),
      ...SOURCE_KINDS.map((k) => num(s.sourceW[k][h], 2)),
      ...LOAD_CATEGORIES.map((c) => num(s.loadW[c][h], 2)),
      num(s.unservedW[h], 2),
      num(s.curtailedW[h], 2),
      num(s.chargeBlockedW[h], 2),
      num(s.packLossW[h], 2),
      String(s.chargeBlockedCold[h] ?? 0),
    ]
    lines.push(row.join(','))
  }
  return lines.join('\r\n') + '\r\n'
}
