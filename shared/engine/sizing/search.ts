/**
 * Sizing by search over battery runs on one PreparedTrip (the sun, loads and chargers are computed once).
 */
import type { PreparedTrip } from '../prepare.ts'
import { runPack } from '../battery/run.ts'

/** Autonomy may be longer than the trip: the trip's days are repeated up to this many days. */
export const AUTONOMY_MAX_DAYS = 366

export interface AutonomyResult {
  /** Days from the ceiling to the floor with no charging; null if the floor is never reached. [day] */
  days: number | null
  /** Checked up to this many days. */
  horizonDays: number
}

/** Days from full (the SOC ceiling) to the floor with every charge source off, heater and loads as planned. */
export function autonomy(prep: PreparedTrip): AutonomyResult {
  const r = runPack(prep, {
    sourcesOn: false,
    startSocFraction: prep.plan.battery.socCeilingFraction,
    record: false,
    hours: AUTONOMY_MAX_DAYS * 24,
    stopAtFirstShortage: true,
  })
  const h = r.totals.firstShortageHour
  return { days: h < 0 ? null : h / 24, horizonDays: AUTONOMY_MAX_DAYS }
}

export interface PackNeededResult {
  /** Smallest capacity with no load shed for lack of charge all trip; null if not reachable. [Ah] */
  capacityAh: number | null
  reason: string | null
  runs: number
}

const PACK_MAX_AH = 100_000

/**
 * Smallest capacity (1 Ah resolution) keeping the pack above its floor all trip, by bisection.
 * Mass, box area and current limits scale with capacity; the heater pad stays as planned.
 */
export function packNeeded(prep: PreparedTrip): PackNeededResult {
  let runs = 0
  const ok = (ah: number) => {
    runs++
    return (
      runPack(prep, { capacityAh: ah, record: false, stopAtFirstFloorShortage: true }).totals.shortageWh <=
      1e-6
    )
  }
  let hi = Math.max(1, Math.round(prep.plan.battery.capacityAh))
  let lo = 0
  while (!ok(hi)) {
    if (hi >= PACK_MAX_AH)
      return { capacityAh: null, reason: `no pack up to ${PACK_MAX_AH} Ah keeps the loads running`, runs }
    lo = hi
    hi = Math.min(PACK_MAX_AH, hi * 2)
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2)
    if (mid > 0 && ok(mid)) hi = mid
    else lo = mid
  }
  return { capacityAh: hi, reason: null, runs }
}

export interface SolarNeededResult {
  /** Smallest total array ending the trip no lower than it started; null if not reachable. [Wp] */
  peakPowerWp: number | null
  reason: string | null
  runs: number
}

const SOLAR_MAX_SCALE_WP = 100_000

/**
 * Smallest total Wp (all arrays scaled together, controller currents with them) ending the trip at or above
 * its starting SOC, by bisection to 1 Wp. With no array in the plan, nothing can be scaled: not reachable.
 */
export function solarNeeded(prep: PreparedTrip): SolarNeededResult {
  const plan = prep.plan
  const wp = plan.sources.solar.reduce((s, a) => s + a.peakPowerWp, 0)
  if (wp <= 0) return { peakPowerWp: null, reason: 'the plan has no solar array to scale', runs: 0 }
  const start = plan.trip.startSocFraction
  let runs = 0
  const ok = (totalWp: number) => {
    runs++
    const r = runPack(prep, { solarScale: totalWp / wp, record: false })
    return r.totals.finalSocFraction >= start - 1e-9
  }
  if (ok(0)) return { peakPowerWp: 0, reason: null, runs }
  // Bracket by doubling from the plan's own size, then bisect to 1 Wp.
  let lo = 0
  let hi = Math.max(1, Math.round(wp))
  while (!ok(hi)) {
    if (hi >= SOLAR_MAX_SCALE_WP) return { peakPowerWp: null, reason: whySolarFails(prep, wp), runs }
    lo = hi
    hi = Math.min(SOLAR_MAX_SCALE_WP, hi * 2)
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2)
    if (ok(mid)) hi = mid
    else lo = mid
  }
  return { peakPowerWp: hi, reason: null, runs }
}

/** Plain-words reason why even the largest array cannot end the trip at its starting charge. */
function whySolarFails(prep: PreparedTrip, wp: number): string {
  let sun = 0
  for (let i = 0; i < prep.hours; i++) sun += prep.solarW[i]!
  if (sun <= 0) return 'the panels get no sun here on these days (polar night, or facing away from the sun)'
  const r = runPack(prep, { solarScale: SOLAR_MAX_SCALE_WP / wp })
  const t = r.totals
  const pct = (x: number) => `${Math.round(x * 100)} %`
  if (t.chargeBlockedColdH > 0)
    return `charging is blocked by cold for ${t.chargeBlockedColdH} h even with ${SOLAR_MAX_SCALE_WP} Wp (a larger heater pad or better insulation would help)`
  const soc = r.series!.socEndFraction
  let lastDayMax = 0
  for (let i = prep.hours - 24; i < prep.hours; i++) lastDayMax = Math.max(lastDayMax, soc[i]!)
  const ceiling = prep.plan.battery.socCeilingFraction
  if (lastDayMax >= ceiling - 0.002)
    return `the pack is full on the last afternoon, but the loads after sunset take it to ${pct(t.finalSocFraction)} by midnight, below the starting ${pct(t.startSocFraction)}: more solar cannot help`
  return `even ${SOLAR_MAX_SCALE_WP} Wp does not end the trip at its starting charge (the charge current limit or the lead-acid taper holds it back)`
}
