/**
 * The capacity-independent part of a simulation: sun, irradiance, PV output per array, charger output from
 * the day plan, ambient temperature and the daily load profile. Computed once per plan and reused by every
 * battery run (the simulation itself, autonomy, pack-needed and solar-needed searches).
 */
import { APPLIANCE_CATEGORIES } from '../schemas/plan.ts'
import type { ResolvedPlan } from './presets.ts'
import { sunPosition } from './sun/position.ts'
import { localMidnightUtcMs } from './sun/localTime.ts'
import { dayOfYearUtc } from './sun/declination.ts'
import { extraterrestrialNormalSpencerWPerM2 } from './irradiance/extraterrestrial.ts'
import { clearSkyGhiHaurwitzWPerM2 } from './irradiance/clearSky.ts'
import { diffuseFractionErbs1982 } from './irradiance/erbs.ts'
import { cellTempNoctC, pvwattsDcW, CONTROLLER_FACTOR } from './pv/module.ts'
import { ambientTempC } from './thermal/ambient.ts'
import { applianceDayProfileW, overlapWithWindowH } from './loads/profile.ts'

/** Where energy leaves the pack or the bus: the appliance categories, then the system's own draws. */
export const LOAD_CATEGORIES = [...APPLIANCE_CATEGORIES, 'inverter', 'bms', 'heater'] as const
export type LoadCategory = (typeof LOAD_CATEGORIES)[number]
export const SOURCE_KINDS = ['solar', 'dcdc', 'shore', 'generator'] as const
export type SourceKind = (typeof SOURCE_KINDS)[number]

export const CATEGORY_INDEX = Object.fromEntries(LOAD_CATEGORIES.map((c, i) => [c, i])) as Record<
  LoadCategory,
  number
>
const HEATER_INDEX = CATEGORY_INDEX.heater

/** Sun series for a place and a run of days; depends only on (start date, days, place, time zone). */
export interface SunSeries {
  dayStartUtcMs: Float64Array
  /** Apparent elevation at each hour's midpoint. [°] */
  elevationDeg: Float64Array
  /** From north, clockwise. [°] */
  azimuthDeg: Float64Array
  /** G_on. [W/m²] */
  extraNormalWPerM2: Float64Array
  /** Haurwitz clear-sky GHI. [W/m²] */
  clearSkyGhiWPerM2: Float64Array
  /** First local hour with the sun up, per day (24 in polar night). [h] */
  sunriseHour: Float64Array
  /** Local calendar date of each day, YYYY-MM-DD. */
  dates: string[]
}

const SUN_CACHE_SIZE = 8
const sunCache = new Map<string, SunSeries>()

/**
 * Sun series, memoised on its inputs (a small bounded cache: the browser recomputes a trip on every edit,
 * and most edits do not move the trip in time or space). The result is a pure function of the inputs.
 */
export function sunSeriesFor(
  startDate: string,
  days: number,
  latitudeDeg: number,
  longitudeDeg: number,
  timeZone: string,
): SunSeries {
  const key = `${startDate}|${days}|${latitudeDeg}|${longitudeDeg}|${timeZone}`
  const hit = sunCache.get(key)
  if (hit) return hit
  const series = computeSunSeries(startDate, days, latitudeDeg, longitudeDeg, timeZone)
  if (sunCache.size >= SUN_CACHE_SIZE) sunCache.delete(sunCache.keys().next().value as string)
  sunCache.set(key, series)
  return series
}

export function computeSunSeries(
  startDate: string,
  days: number,
  latitudeDeg: number,
  longitudeDeg: number,
  timeZone: string,
): SunSeries {
  const n = days * 24
  const s: SunSeries = {
    dayStartUtcMs: new Float64Array(days),
    elevationDeg: new Float64Array(n),
    azimuthDeg: new Float64Array(n),
    extraNormalWPerM2: new Float64Array(n),
    clearSkyGhiWPerM2: new Float64Array(n),
    sunriseHour: new Float64Array(days),
    dates: [],
  }
  for (let d = 0; d < days; d++) {
    const start = localMidnightUtcMs(startDate, d, timeZone)
    s.dayStartUtcMs[d] = start
    s.dates.push(new Date(start + 12 * 3_600_000).toISOString().slice(0, 10))
    const gon = extraterrestrialNormalSpencerWPerM2(dayOfYearUtc(start + 12 * 3_600_000))
    let sunrise = 24
    for (let k = 0; k < 24; k++) {
      const i = d * 24 + k
      const pos = sunPosition(start + (k + 0.5) * 3_600_000, latitudeDeg, longitudeDeg)
      s.elevationDeg[i] = pos.elevationDeg
      s.azimuthDeg[i] = pos.azimuthDeg
      s.extraNormalWPerM2[i] = gon
      s.clearSkyGhiWPerM2[i] = clearSkyGhiHaurwitzWPerM2(90 - pos.elevationDeg)
      if (sunrise === 24 && pos.elevationDeg > 0) sunrise = k
    }
    s.sunriseHour[d] = sunrise
  }
  return s
}

export interface PreparedTrip {
  plan: ResolvedPlan
  days: number
  hours: number
  sun: SunSeries
  /** GHI after the sky scaling. [W/m²] */
  ghiWPerM2: Float64Array
  ambientC: Float64Array
  /** Solar power available at the pack from all arrays at their own size (scale 1). [W] */
  solarW: Float64Array
  dcdcW: Float64Array
  shoreW: Float64Array
  generatorW: Float64Array
  /** Generator running time per hour (for fuel). [h] */
  generatorRunH: Float64Array
  /** DC-side demand by category for each hour of the local day, [hourOfDay * nCat + cat], heater excluded. [W] */
  demandByCategoryW: Float64Array
  /** Sum over categories per hour of day (heater excluded). [W] */
  demandW: Float64Array
  /** AC demand above the inverter rating, shed every day at this hour of day. [W] */
  inverterOverloadW: Float64Array
}

/** Sky scaling per day: min(1, K / K_clear,day), K_clear,day = ΣGHI_clear / Σ(G_on cos z). */
function skyFactors(sun: SunSeries, days: number, clearness: number): Float64Array {
  const f = new Float64Array(days)
  for (let d = 0; d < days; d++) {
    let ghi = 0
    let etr = 0
    for (let k = 0; k < 24; k++) {
      const i = d * 24 + k
      const el = sun.elevationDeg[i]!
      if (el <= 0) continue
      ghi += sun.clearSkyGhiWPerM2[i]!
      etr += sun.extraNormalWPerM2[i]! * Math.sin((el * Math.PI) / 180)
    }
    f[d] = ghi > 0 ? Math.min(1, clearness / (ghi / etr)) : 1
  }
  return f
}

function solarAvailable(
  plan: ResolvedPlan,
  sun: SunSeries,
  ghi: Float64Array,
  ambient: Float64Array,
): Float64Array {
  const n = ghi.length
  const out = new Float64Array(n)
  const arrays = plan.sources.solar
  if (arrays.length === 0) return out
  const vCharge = plan.battery.chargeVoltageV
  const albedo = plan.trip.groundAlbedoFraction
  const DEG = Math.PI / 180
  // Per-array constants, so the hourly loop does no allocation (this runs for every hour of a year).
  const cosTilt = arrays.map((a) => Math.cos(a.tiltDeg * DEG))
  const sinTilt = arrays.map((a) => Math.sin(a.tiltDeg * DEG))
  for (let i = 0; i < n; i++) {
    const g = ghi[i]!
    if (g <= 0) continue
    const zen = 90 - sun.elevationDeg[i]!
    const cosZ = Math.cos(zen * DEG)
    const sinZ = Math.sin(zen * DEG)
    // Erbs split (erbs.ts, splitErbs1982), inlined to keep the hourly loop free of allocation.
    // Below 3° of sun everything counts as diffuse, as in splitErbs1982.
    const low = zen > 87
    const kt = low ? 0 : Math.min(1, g / (sun.extraNormalWPerM2[i]! * Math.max(cosZ, 0.065)))
    const dhi = low ? g : g * diffuseFractionErbs1982(kt)
    const dni = low ? 0 : (g - dhi) / cosZ
    let w = 0
    for (let k = 0; k < arrays.length; k++) {
      const a = arrays[k]!
      // Isotropic transposition (transposition.ts, planeOfArrayIsotropicWPerM2), inlined.
      const cosAoi =
        cosZ * cosTilt[k]! + sinZ * sinTilt[k]! * Math.cos((sun.azimuthDeg[i]! - a.azimuthDeg) * DEG)
      const poa =
        dni * Math.max(0, cosAoi) + (dhi * (1 + cosTilt[k]!)) / 2 + (g * albedo * (1 - cosTilt[k]!)) / 2
      const dc = pvwattsDcW(poa, cellTempNoctC(poa, ambient[i]!, a.noctC), a.peakPowerWp, a.tempCoeffPerC)
      const atPack = dc * (1 - a.lossesFraction) * CONTROLLER_FACTOR[a.controller]
      w += Math.min(atPack, a.maxCurrentA * vCharge)
    }
    out[i] = w
  }
  return out
}

function chargersAvailable(plan: ResolvedPlan, hours: number) {
  // One allocation for the four series (large typed arrays are costly to allocate one by one).
  const buf = new Float64Array(hours * 4)
  const dcdcW = buf.subarray(0, hours)
  const shoreW = buf.subarray(hours, 2 * hours)
  const generatorW = buf.subarray(2 * hours, 3 * hours)
  const generatorRunH = buf.subarray(3 * hours)
  const v = plan.battery.chargeVoltageV
  const dcdcA = plan.sources.dcdc.reduce((s, c) => s + c.currentA, 0)
  const shoreA = plan.sources.shore.reduce((s, c) => s + c.currentA, 0)
  const genA = plan.sources.generator.reduce((s, c) => s + c.currentA, 0)
  plan.trip.dayPlan.forEach((day, d) => {
    for (let k = 0; k < 24; k++) {
      const i = d * 24 + k
      const drive =
        day.drivingHours > 0
          ? overlapWithWindowH(k, day.drivingStartHour, day.drivingStartHour + day.drivingHours)
          : 0
      const gen =
        day.generatorHours > 0
          ? overlapWithWindowH(k, day.generatorStartHour, day.generatorStartHour + day.generatorHours)
          : 0
      dcdcW[i] = dcdcA * v * drive
      shoreW[i] = day.hookup ? shoreA * v : 0
      generatorW[i] = genA * v * gen
      generatorRunH[i] = plan.sources.generator.length > 0 ? gen : 0
    }
  })
  return { dcdcW, shoreW, generatorW, generatorRunH }
}

function loadProfiles(plan: ResolvedPlan) {
  const nCat = LOAD_CATEGORIES.length
  const byCat = new Float64Array(24 * nCat)
  const total = new Float64Array(24)
  const overload = new Float64Array(24)
  const acByCat = new Float64Array(24 * nCat)
  for (const a of plan.appliances) {
    const profile = applianceDayProfileW(a)
    const c = CATEGORY_INDEX[a.category]
    const target = a.supply === 'dc' ? byCat : acByCat
    for (let h = 0; h < 24; h++) target[h * nCat + c] = target[h * nCat + c]! + profile[h]!
  }
  const inv = plan.inverter
  for (let h = 0; h < 24; h++) {
    let ac = 0
    for (let c = 0; c < nCat; c++) ac += acByCat[h * nCat + c]!
    if (inv) {
      const on =
        inv.alwaysOn ||
        ac > 0 ||
        (inv.onStartHour !== inv.onEndHour && overlapWithWindowH(h, inv.onStartHour, inv.onEndHour) > 0)
      const served = Math.min(ac, inv.ratedW)
      const share = ac > 0 ? served / ac : 0
      for (let c = 0; c < nCat; c++)
        byCat[h * nCat + c] = byCat[h * nCat + c]! + acByCat[h * nCat + c]! * share
      overload[h] = ac - served
      byCat[h * nCat + CATEGORY_INDEX.inverter] =
        byCat[h * nCat + CATEGORY_INDEX.inverter]! +
        (on ? inv.idleW : 0) +
        served * (1 / inv.efficiencyFraction - 1)
    }
    byCat[h * nCat + CATEGORY_INDEX.bms] =
      byCat[h * nCat + CATEGORY_INDEX.bms]! + plan.battery.bmsSelfConsumptionW
    let sum = 0
    for (let c = 0; c < nCat; c++) if (c !== HEATER_INDEX) sum += byCat[h * nCat + c]!
    total[h] = sum
  }
  return { demandByCategoryW: byCat, demandW: total, inverterOverloadW: overload }
}

/** Build every capacity-independent series for a resolved plan. */
export function prepareTrip(plan: ResolvedPlan): PreparedTrip {
  const t = plan.trip
  const days = t.days
  const hours = days * 24
  const sun = sunSeriesFor(t.startDate, days, t.latitudeDeg, t.longitudeDeg, t.timeZone)
  const factors = skyFactors(sun, days, t.clearnessIndexFraction)
  const buf = new Float64Array(hours * 2)
  const ghi = buf.subarray(0, hours)
  const ambient = buf.subarray(hours)
  for (let i = 0; i < hours; i++) {
    const d = Math.floor(i / 24)
    ghi[i] = sun.clearSkyGhiWPerM2[i]! * factors[d]!
    ambient[i] = ambientTempC((i % 24) + 0.5, sun.sunriseHour[d]!, t.nightLowC, t.dayHighC)
  }
  return {
    plan,
    days,
    hours,
    sun,
    ghiWPerM2: ghi,
    ambientC: ambient,
    solarW: solarAvailable(plan, sun, ghi, ambient),
    ...chargersAvailable(plan, hours),
    ...loadProfiles(plan),
  }
}

/** What prepareTrip reads of the battery bank (a test holds it to this list). */
export const PREPARE_BATTERY_FIELDS = ['chargeVoltageV', 'bmsSelfConsumptionW'] as const

let lastPrepared: { key: string; prep: PreparedTrip } | null = null

/**
 * prepareTrip, reusing the previous answer when only the battery bank changed in ways prepareTrip does not
 * read (its size, mass, limits, heater…). "Try a change" moves the pack's capacity on every key press and each
 * move used to rebuild the sun, load and charger series (about 1 ms of a 31-day move). One entry only; the
 * key is the plan itself (as JSON) without the battery fields prepareTrip ignores, so any other change
 * prepares anew. The series are shared, never written after preparation.
 */
export function prepareTripReusing(plan: ResolvedPlan): PreparedTrip {
  const { battery, ...rest } = plan
  const key = JSON.stringify([rest, PREPARE_BATTERY_FIELDS.map((f) => battery[f])])
  if (lastPrepared?.key === key) return { ...lastPrepared.prep, plan }
  const prep = prepareTrip(plan)
  lastPrepared = { key, prep }
  return prep
}
