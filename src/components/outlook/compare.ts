/**
 * Side by side: the key figures of 2–4 scenarios and which value is better. Pure, for the page and tests.
 */
import type { AnalysisJson } from '../../composables/useEngineWorker'
import { formatDays, formatEnergy, formatHours, formatPercent, formatAh, formatWp } from './format'
import { verdictView } from './verdict'

export type Better = 'higher' | 'lower' | null

export interface CompareRow {
  key: string
  label: string
  /** Which direction is better; null = not ranked. */
  better: Better
  /** Numbers used for ranking (null = missing, ranks last). */
  values: (number | null)[]
  texts: string[]
  /** Index of every column holding the best value (empty when not ranked or all equal). */
  best: number[]
}

function bestOf(values: (number | null)[], better: Better): number[] {
  if (!better) return []
  const present = values.filter((v): v is number => v !== null)
  if (present.length < 2 && values.length > 1 && present.length === 0) return []
  const target = better === 'higher' ? Math.max(...present) : Math.min(...present)
  const hits = values
    .map((v, i) => (v !== null && Math.abs(v - target) < 1e-9 ? i : -1))
    .filter((i) => i >= 0)
  return hits.length === values.length ? [] : hits
}

function row(
  key: string,
  label: string,
  better: Better,
  values: (number | null)[],
  fmt: (v: number | null) => string,
): CompareRow {
  return { key, label, better, values, texts: values.map(fmt), best: bestOf(values, better) }
}

export function compareRows(results: AnalysisJson[]): CompareRow[] {
  const rs = results
  const autonomy = rs.map((r) => (r.autonomy.days === null ? Number.POSITIVE_INFINITY : r.autonomy.days))
  const energyIn = rs.map((r) => {
    const e = r.summary.energyInWh
    return e.solar + e.dcdc + e.shore + e.generator
  })
  const rows: CompareRow[] = [
    {
      key: 'verdict',
      label: 'Verdict',
      better: null,
      values: rs.map((r) => (r.verdict.status === 'short' ? 0 : r.verdict.status === 'tight' ? 1 : 2)),
      texts: rs.map((r) => verdictView(r).headline),
      best: [],
    },
    row(
      'days',
      'Trip length',
      null,
      rs.map((r) => r.days.length),
      (v) => formatDays(v),
    ),
    row(
      'lowest',
      'Lowest charge',
      'higher',
      rs.map((r) => r.summary.lowestSocFraction),
      formatPercent,
    ),
    row(
      'margin',
      'Margin above the floor',
      'higher',
      rs.map((r) => r.verdict.marginFraction),
      formatPercent,
    ),
    row(
      'final',
      'Charge at the end',
      'higher',
      rs.map((r) => r.summary.finalSocFraction),
      formatPercent,
    ),
    {
      ...row('autonomy', 'Autonomy (no charging)', 'higher', autonomy, (v) => formatDays(v)),
      texts: rs.map((r) =>
        r.autonomy.days === null ? `more than ${r.autonomy.horizonDays} days` : formatDays(r.autonomy.days),
      ),
    },
    row(
      'capacity',
      'Pack',
      null,
      rs.map((r) => r.plan.battery.capacityAh),
      formatAh,
    ),
    row(
      'packNeeded',
      'Pack needed',
      'lower',
      rs.map((r) => r.packNeeded.capacityAh),
      (v) => (v === null ? 'not reachable' : formatAh(v)),
    ),
    row(
      'array',
      'Solar array',
      null,
      rs.map((r) => r.plan.sources.solar.reduce((s, a) => s + a.peakPowerWp, 0)),
      formatWp,
    ),
    row(
      'solarNeeded',
      'Solar needed',
      'lower',
      rs.map((r) => r.solarNeeded.peakPowerWp),
      (v) => (v === null ? 'not reachable' : formatWp(v)),
    ),
    row('in', 'Energy in', null, energyIn, formatEnergy),
    row(
      'out',
      'Energy used',
      null,
      rs.map((r) => r.summary.energyOutWh),
      formatEnergy,
    ),
    // In − used − lost in the pack = change in the pack (energy balance of the hourly run).
    row(
      'loss',
      'Lost in the pack',
      null,
      rs.map((r) => r.summary.packLossWh),
      formatEnergy,
    ),
    row(
      'change',
      'Change in the pack',
      null,
      rs.map((r) => r.totals.endStoredWh - r.totals.startStoredWh),
      (v) => (v !== null && Math.round(v) > 0 ? `+${formatEnergy(v)}` : formatEnergy(v)),
    ),
    // Not ranked: less heater energy is not better when it is less because the pad was shed at the floor
    // (a small pack that runs short heats less than a bigger one that carries).
    row(
      'heater',
      'Heater pad',
      null,
      rs.map((r) => r.summary.heaterWh),
      formatEnergy,
    ),
    row(
      'blocked',
      'Charging blocked by cold',
      'lower',
      rs.map((r) => r.summary.chargeBlockedColdH),
      formatHours,
    ),
    row(
      'unserved',
      'Loads not served',
      'lower',
      rs.map((r) => r.summary.unservedWh),
      formatEnergy,
    ),
  ]
  return rows
}
