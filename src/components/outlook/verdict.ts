/**
 * The one-line answer (Verdict) in plain words, built from the engine's verdict and trip summary.
 * Pure: the component and the Side by side table both use it.
 */
import { TIGHT_MARGIN_FRACTION } from '@shared/engine/margin'
import { formatEnergy, formatPercent, formatTripMoment } from './format'

export type VerdictTone = 'positive' | 'warning' | 'negative'

/** The fields of a simulation result the verdict reads (works on engine output and its JSON form). */
export interface VerdictInput {
  verdict: {
    status: 'carries' | 'tight' | 'short'
    marginFraction: number
    marginWh: number
    message: string
  }
  summary: {
    lowestSocFraction: number
    lowestSocHour: number
    finalSocFraction: number
    startSocFraction: number
    unservedWh: number
    shortageWh: number
  }
  totals: { firstShortageHour: number }
  plan: { battery: { socFloorFraction: number } }
  /** Hours in the trip, to say when a moment is the trip's end. */
  hours?: number
}

export interface VerdictView {
  status: 'carries' | 'tight' | 'short'
  tone: VerdictTone
  icon: string
  /** "Carries the trip with 23 % to spare" / "Runs short on day 4 at 06:00". */
  headline: string
  /** Lowest SOC and when, against the floor. */
  detail: string
  /** Lowest SOC and when, short ("Lowest charge 38 % on day 4 at 10:00"), for one line. */
  lowest: string
  /** The margin in words and energy, or what was not served. */
  margin: string
}

/** "day 7 at 24:00, the end of the trip" for the trip's last hour; the clock is the end of the hour (format.ts). */
function when(hourIndex: number, hours: number | undefined): string {
  const at = formatTripMoment(hourIndex)
  return hours !== undefined && hourIndex === hours - 1 ? `${at}, the end of the trip` : at
}

export function verdictView(r: VerdictInput): VerdictView {
  const s = r.summary
  const floor = r.plan.battery.socFloorFraction
  const atFloor = formatPercent(s.lowestSocFraction) === formatPercent(floor)
  const lowestWhen = s.lowestSocHour >= 0 ? ` on ${when(s.lowestSocHour, r.hours)}` : ''
  const detail = atFloor
    ? `Lowest charge ${formatPercent(s.lowestSocFraction)}, the floor you set,${lowestWhen}.`
    : `Lowest charge ${formatPercent(s.lowestSocFraction)}${lowestWhen}; the floor you set is ${formatPercent(floor)}.`
  const lowest = `Lowest charge ${formatPercent(s.lowestSocFraction)}${lowestWhen}`
  if (r.verdict.status === 'short') {
    const first = r.totals.firstShortageHour
    const headline =
      first >= 0 ? `Runs short on ${formatTripMoment(first)}` : 'Cannot serve every load on this trip'
    return {
      status: 'short',
      tone: 'negative',
      icon: 'battery_alert',
      headline,
      detail,
      lowest,
      margin: `${formatEnergy(s.unservedWh)} of loads would go unserved over the trip.`,
    }
  }
  const pct = formatPercent(r.verdict.marginFraction)
  const margin = `${pct} of the pack (${formatEnergy(r.verdict.marginWh)}) stays above the floor at the lowest point.`
  if (r.verdict.status === 'tight') {
    return {
      status: 'tight',
      tone: 'warning',
      icon: 'warning',
      headline:
        pct === '0 %'
          ? 'Carries the trip, with nothing to spare'
          : `Carries the trip, but only ${pct} to spare`,
      detail,
      lowest,
      margin: `${margin} A plain “carries” keeps at least ${formatPercent(TIGHT_MARGIN_FRACTION)} in reserve, for a colder night or a duller day than planned.`,
    }
  }
  return {
    status: 'carries',
    tone: 'positive',
    icon: 'check_circle',
    headline: `Carries the trip with ${pct} to spare`,
    detail,
    lowest,
    margin,
  }
}
