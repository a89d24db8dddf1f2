/**
 * Sizing by search over battery runs on one PreparedTrip (the sun, loads and chargers are computed once).
 */
import type { PreparedTrip } from '../prepare.ts'
import { runPack } from '../battery/run.ts'
import { TIGHT_MARGIN_FRACTION } from '../margin.ts'

/** A whole number with thousands separators for the reasons' words: 100000 → "100,000". */
function grouped(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ',')
}

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

/**
 * Smallest whole number n in (lo, max] with ok(n), for an ok that fails below some n and holds from it on:
 * bracket by doubling from `start`, then bisect. null when even ok(max) fails. Every search here uses it.
 */
export function smallestPassing(
  ok: (n: number) => boolean,
  start: number,
  max: number,
  lo = 0,
): number | null {
  let hi = Math.min(max, Math.max(lo + 1, Math.round(start)))
  while (!ok(hi)) {
    if (hi >= max) return null
    lo = hi
    hi = Math.min(max, hi * 2)
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2)
    if (ok(mid)) hi = mid
    else lo = mid
  }
  return hi
}

export interface PackNeededResult {
  /** Smallest capacity with no load shed for lack of charge all trip; null if not reachable. [Ah] */
  capacityAh: number | null
  reason: string | null
  /**
   * Smallest capacity that also keeps `marginFraction` of SOC above the floor at the lowest point, which is
   * what the verdict calls a plain "carries" (not "tight"); null if not reachable. [Ah]
   */
  withMarginCapacityAh: number | null
  withMarginReason: string | null
  /** The margin asked for: the verdict's tight threshold. [0–1] */
  marginFraction: number
  runs: number
}

const PACK_MAX_AH = 100_000

/**
 * Smallest capacity (1 Ah resolution) keeping the pack above its floor all trip, by bisection; then the
 * smallest that keeps the verdict's margin above the floor too (the same search, starting from the first).
 * Mass, box area and current limits scale with capacity; the heater pad stays as planned.
 */
export function packNeeded(prep: PreparedTrip): PackNeededResult {
  const b = prep.plan.battery
  const margin = TIGHT_MARGIN_FRACTION
  let runs = 0
  const ok = (ah: number) => {
    runs++
    return (
      runPack(prep, { capacityAh: ah, record: false, stopAtFirstFloorShortage: true }).totals.shortageWh <=
      1e-6
    )
  }
  const bare = smallestPassing(ok, Math.max(1, b.capacityAh), PACK_MAX_AH)
  if (bare === null) {
    const reason = `no pack up to ${grouped(PACK_MAX_AH)} Ah keeps the loads running`
    return {
      capacityAh: null,
      reason,
      withMarginCapacityAh: null,
      withMarginReason: reason,
      marginFraction: margin,
      runs,
    }
  }
  const startMargin = prep.plan.trip.startSocFraction - b.socFloorFraction
  if (startMargin < margin) {
    return {
      capacityAh: bare,
      reason: null,
      withMarginCapacityAh: null,
      withMarginReason: `the trip starts only ${Math.round(startMargin * 100)} SOC points above the floor, less than the ${Math.round(margin * 100)} the verdict asks for`,
      marginFraction: margin,
      runs,
    }
  }
  // The same test as the verdict's (lowest − floor against the margin), so the answer is a plain "carries".
  const okMargin = (ah: number) => {
    runs++
    const t = runPack(prep, {
      capacityAh: ah,
      record: false,
      stopAtFirstFloorShortage: true,
      stopBelowSocFraction: b.socFloorFraction + margin - 1e-9,
    }).totals
    return t.shortageWh <= 1e-6 && t.lowestSocFraction - b.socFloorFraction >= margin
  }
  const withMargin = smallestPassing(okMargin, bare, PACK_MAX_AH, bare - 1)
  return {
    capacityAh: bare,
    reason: null,
    withMarginCapacityAh: withMargin,
    withMarginReason:
      withMargin === null
        ? `no pack up to ${grouped(PACK_MAX_AH)} Ah keeps ${Math.round(margin * 100)} SOC points above the floor`
        : null,
    marginFraction: margin,
    runs,
  }
}

export interface SolarNeededResult {
  /**
   * Smallest total array with which no load is shed at the floor all trip and the pack is back to full
   * (within SOLAR_FULL_TOLERANCE_FRACTION of its ceiling) on the last day or ends no lower than it started;
   * null if not reachable. [Wp]
   */
  peakPowerWp: number | null
  reason: string | null
  /** The pack capacity the answer is for: the plan's own, or Pack needed when the plan's pack sheds load whatever the array. [Ah] */
  capacityAh: number
  /** Why the plan's own pack could not do it, when the answer is for Pack needed instead. */
  ownPackReason: string | null
  runs: number
}

const SOLAR_MAX_SCALE_WP = 100_000

/**
 * "Back to full" means within this many SOC points of the ceiling: a lead-acid pack's absorption tapers
 * towards the ceiling and only reaches it slowly. Common practice, no source.
 */
export const SOLAR_FULL_TOLERANCE_FRACTION = 0.01

interface SolarSearch {
  peakPowerWp: number | null
  reason: string | null
  /** Even the largest array leaves loads shed at the floor: the pack, not the array, is the limit. */
  packLimited: boolean
  runs: number
}

/**
 * The array test: every load served (nothing shed at the floor or the discharge limit), and on the last day
 * the pack is back to full, or it ends the trip no lower than it started. Why not only "ends no lower than it
 * started": a trip starts at local midnight, so one that starts full can never end full at midnight once the
 * evening's loads follow the last sunset, however large the array. Common practice, no source.
 */
function solarSearch(prep: PreparedTrip, capacityAh: number): SolarSearch {
  const plan = prep.plan
  const wp = plan.sources.solar.reduce((s, a) => s + a.peakPowerWp, 0)
  if (wp <= 0)
    return { peakPowerWp: null, reason: 'the plan has no solar array to scale', packLimited: false, runs: 0 }
  const full = plan.battery.socCeilingFraction - SOLAR_FULL_TOLERANCE_FRACTION
  let runs = 0
  const ok = (totalWp: number) => {
    runs++
    const t = runPack(prep, {
      capacityAh,
      solarScale: totalWp / wp,
      record: false,
      stopAtFirstFloorShortage: true,
    }).totals
    if (t.shortageWh > 1e-6) return false
    return t.lastDayHighestSocFraction >= full - 1e-9 || t.finalSocFraction >= t.startSocFraction - 1e-9
  }
  if (ok(0)) return { peakPowerWp: 0, reason: null, packLimited: false, runs }
  const found = smallestPassing(ok, wp, SOLAR_MAX_SCALE_WP)
  if (found !== null) return { peakPowerWp: found, reason: null, packLimited: false, runs }
  const why = whySolarFails(prep, wp, capacityAh)
  return { peakPowerWp: null, reason: why.reason, packLimited: why.packLimited, runs: runs + 1 }
}

/**
 * Smallest total Wp (all arrays scaled together, controller currents with them), by bisection to 1 Wp, for
 * the plan's pack. When that pack sheds load whatever the array (it runs out in the hours without sun) and a
 * larger Pack needed is known, the answer is given for that pack instead, and says so. With no array in the
 * plan, nothing can be scaled: not reachable.
 */
export function solarNeeded(prep: PreparedTrip, packNeededAh: number | null = null): SolarNeededResult {
  const own = prep.plan.battery.capacityAh
  const first = solarSearch(prep, own)
  if (first.peakPowerWp !== null || !first.packLimited || packNeededAh === null || packNeededAh <= own)
    return {
      peakPowerWp: first.peakPowerWp,
      reason: first.reason,
      capacityAh: own,
      ownPackReason: null,
      runs: first.runs,
    }
  const bigger = solarSearch(prep, packNeededAh)
  return {
    peakPowerWp: bigger.peakPowerWp,
    reason: bigger.reason,
    capacityAh: packNeededAh,
    ownPackReason: first.reason,
    runs: first.runs + bigger.runs,
  }
}

/** Plain-words reason why even the largest array cannot pass the array test (see solarSearch). */
function whySolarFails(
  prep: PreparedTrip,
  wp: number,
  capacityAh: number,
): { reason: string; packLimited: boolean } {
  let sun = 0
  for (let i = 0; i < prep.hours; i++) sun += prep.solarW[i]!
  if (sun <= 0)
    return {
      reason: 'the panels get no sun here on these days (polar night, or facing away from the sun)',
      packLimited: false,
    }
  const r = runPack(prep, { capacityAh, solarScale: SOLAR_MAX_SCALE_WP / wp, record: false })
  const t = r.totals
  if (t.shortageWh > 1e-6) {
    const day = Math.floor(t.firstShortageHour / 24) + 1
    return {
      reason: `even with ${grouped(SOLAR_MAX_SCALE_WP)} Wp the ${grouped(Math.round(capacityAh))} Ah pack runs down to its floor in the hours without sun (first on day ${day}): the pack, not the array, is too small`,
      packLimited: true,
    }
  }
  if (t.chargeBlockedColdH > 0)
    return {
      reason: `charging is blocked by cold for ${t.chargeBlockedColdH} h even with ${grouped(SOLAR_MAX_SCALE_WP)} Wp (a larger heater pad or better insulation would help)`,
      packLimited: false,
    }
  return {
    reason: `even ${grouped(SOLAR_MAX_SCALE_WP)} Wp does not bring the pack back to full on the last day (the charge current limit or the lead-acid taper holds it back)`,
    packLimited: false,
  }
}
