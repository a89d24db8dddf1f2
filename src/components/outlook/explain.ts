/** One sentence on why the classic sizing method and the hourly run disagree, from their own numbers. */
import { formatAh } from './format'

interface ClassicInput {
  packNeeded: { capacityAh: number | null }
  classicSizing: { capacityAh: number; autonomyDays: number }
  summary: { heaterWh: number; chargeBlockedColdH: number }
}

export function classicComparisonSentence(a: ClassicInput): string {
  const classic = a.classicSizing.capacityAh
  const ours = a.packNeeded.capacityAh
  const days = a.classicSizing.autonomyDays
  if (ours === null) {
    return `The classic method asks for ${formatAh(classic)} from the average daily load; no pack size carries this trip hour by hour, because the loads outrun everything the charge sources can put back.`
  }
  const ratio = classic / Math.max(1, ours)
  if (ratio > 1.1) {
    return `The classic method sizes for ${days} days with no charging at all and adds margins for ageing and cold; the hourly run counts what your sun, driving and hook-ups put back each day, so this trip needs less.`
  }
  if (ratio < 0.9) {
    const extra =
      a.summary.heaterWh > 0 || a.summary.chargeBlockedColdH > 0
        ? ' and leaves out the heater pad and the hours the cold blocks charging'
        : ''
    return `The classic method works from the average daily load${extra}; the hourly run follows the worst stretch of this trip (long nights, dull days), so it needs more.`
  }
  return `The two agree within 10 %: on this trip the classic method's ${days} days of reserve and its margins happen to match what the hourly run needs.`
}
