/**
 * Appliance loads spread over their windows on the local clock.
 * Energy balance; no empirical model.
 */
import { windowLengthH } from '../../schemas/plan.ts'
import type { ResolvedAppliance } from '../presets.ts'

/** Hours of [hour, hour+1) that fall inside a window which may wrap midnight. [h] */
export function overlapWithWindowH(hour: number, startHour: number, endHour: number): number {
  const len = windowLengthH(startHour, endHour)
  if (len >= 24) return 1
  // The window as [a, b] on the clock, and the same shifted back a day (for the part past midnight).
  const a = startHour % 24
  const b = a + len
  const first = Math.max(0, Math.min(hour + 1, b) - Math.max(hour, a))
  const second = Math.max(0, Math.min(hour + 1, b - 24) - Math.max(hour, a - 24))
  return Math.min(1, first + second)
}

/**
 * Average power of one appliance in each hour of the local day (24 values).
 * On-time (hoursPerDay) is spread evenly over the window; standby is drawn for the rest of the time.
 *   P(h) = q · [P_on · duty · f(h) + P_standby · (1 − f(h))],  f(h) = overlap(h) · hoursPerDay / windowLength
 * Daily energy = q · (P_on · duty · hoursPerDay + P_standby · (24 − hoursPerDay)).
 * @returns 24 hourly powers [W]
 */
export function applianceDayProfileW(a: ResolvedAppliance): Float64Array {
  const out = new Float64Array(24)
  if (a.quantity === 0) return out
  const onShare = a.hoursPerDay / windowLengthH(a.startHour, a.endHour)
  for (let h = 0; h < 24; h++) {
    const f = overlapWithWindowH(h, a.startHour, a.endHour) * onShare
    out[h] = a.quantity * (a.powerW * a.dutyCycleFraction * f + a.standbyW * (1 - f))
  }
  return out
}

/** Daily energy of one appliance. [Wh] */
export function applianceDailyWh(a: ResolvedAppliance): number {
  return a.quantity * (a.powerW * a.dutyCycleFraction * a.hoursPerDay + a.standbyW * (24 - a.hoursPerDay))
}
