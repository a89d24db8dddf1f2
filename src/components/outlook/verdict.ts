/**
 * The one-line answer (Verdict) in plain words, built from the engine's verdict and trip summary.
 * Pure: the component and the Side by side table both use it.
 */
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
}

export interface VerdictView {
  status: 'carries' | 'tight' | 'short'
  tone: VerdictTone
  icon: string
  /** "Carries the trip with 23 % to spare" / "Runs short on day 4 at 06:00". */
  headline: string
  /** Lowest SOC and when, against the floor. */
  detail: string
  /** The margin in words and energy, or what was not served. */
  margin: string
}

export function verdictView(r: VerdictInput): VerdictView {
  const s = r.summary
  const floor = r.plan.battery.socFloorFraction
  const lowestWhen = s.lowestSocHour >= 0 ? ` on ${formatTripMoment(s.lowestSocHour, true)}` : ''
  const detail = `Lowest charge ${formatPercent(s.lowestSocFraction)}${lowestWhen}; the floor you set is ${formatPercent(floor)}.`
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
      headline: `Carries the trip, but only ${pct} to spare`,
      detail,
      margin,
    }
  }
  return {
    status: 'carries',
    tone: 'positive',
    icon: 'check_circle',
    headline: `Carries the trip with ${pct} to spare`,
    detail,
    margin,
  }
}
