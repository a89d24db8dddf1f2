/**
 * The hourly pack loop: thermal step, charge window, bus balance, charge/discharge limits, shedding.
 * Works on a PreparedTrip so searches can run it many times with other capacities or array sizes.
 *
 * Per hour (1 h step, so W and Wh per hour are the same number):
 *   direct   = min(sources, demand)               sources feed loads without passing through the pack
 *   chargeIn = min(surplus, limit·taper, room/η_c) stored: chargeIn·η_c
 *   out      = min(deficit, I_max·V, (E − E_floor)·η_d / f_Peukert)   removed: out·f/η_d
 *   unserved = deficit − out
 * Energy balance: chargeIn − out − losses = ΔE, losses = chargeIn(1 − η_c) + out(f/η_d − 1).
 */
import type { PreparedTrip } from '../prepare.ts'
import { LOAD_CATEGORIES, CATEGORY_INDEX, SOURCE_KINDS } from '../prepare.ts'
import {
  stepPackTemperatureInto,
  type ThermalParams,
  type ThermalStepResult,
} from '../thermal/packTemperature.ts'
import { uValueWPerM2K } from '../thermal/heatLoss.ts'
import { peukertFactor } from './peukert.ts'
import { chargeTaperFactor, oneWayEfficiency } from './charge.ts'

export interface RunOptions {
  /** Pack capacity; mass, box area (^2/3) and current limits scale with it. Default: the plan's. [Ah] */
  capacityAh?: number
  /** Multiplier on every solar array (Wp and controller current together). Default 1. */
  solarScale?: number
  /** false = no charge source at all (autonomy). Default true. */
  sourcesOn?: boolean
  startSocFraction?: number
  /** Fill the hourly series and day rows. Searches pass false. Default true. */
  record?: boolean
  /** Run this many hours, repeating the trip's days. Default: the trip. */
  hours?: number
  /** Stop at the first hour the pack sheds load: at its floor, its current limit or too cold/hot (autonomy). */
  stopAtFirstShortage?: boolean
  /** Stop at the first hour shed at the floor or the current limit (pack-needed search: one is enough). */
  stopAtFirstFloorShortage?: boolean
  /** Stop at the first hour ending below this SOC (the search for a pack with margin: one is enough). [0–1] */
  stopBelowSocFraction?: number
}

export interface HourlySeries {
  /** State of charge at the end of each hour. [0–1] */
  socEndFraction: Float64Array
  /** Pack temperature at the start of each hour (the value the BMS checks). [°C] */
  packTempStartC: Float64Array
  ambientC: Float64Array
  /** GHI after the sky scaling. [W/m²] */
  ghiWPerM2: Float64Array
  sunElevationDeg: Float64Array
  /** Used source power by kind, [kind][hour]. [W] */
  sourceW: Record<(typeof SOURCE_KINDS)[number], Float64Array>
  /** Served power by category, [category][hour]. [W] */
  loadW: Record<(typeof LOAD_CATEGORIES)[number], Float64Array>
  unservedW: Float64Array
  /** Source power that found no use (pack full, charge limit). [W] */
  curtailedW: Float64Array
  /** Source power lost because the pack was outside its charge temperature window. [W] */
  chargeBlockedW: Float64Array
  /** Conversion, Peukert losses in the pack. [W] */
  packLossW: Float64Array
  /** 1 if charging was blocked by cold in that hour, else 0. */
  chargeBlockedCold: Uint8Array
}

export interface DayRow {
  day: number
  date: string
  inWh: Record<(typeof SOURCE_KINDS)[number], number>
  outWh: Record<(typeof LOAD_CATEGORIES)[number], number>
  lowestSocFraction: number
  finalSocFraction: number
  heaterWh: number
  chargeBlockedColdH: number
  chargeBlockedHotH: number
  chargeBlockedWh: number
  unservedWh: number
  curtailedWh: number
  packLossWh: number
  generatorFuelL: number
}

export interface RunTotals {
  startStoredWh: number
  endStoredWh: number
  capacityWh: number
  floorWh: number
  startSocFraction: number
  finalSocFraction: number
  lowestSocFraction: number
  lowestSocHour: number
  /** Highest end-of-hour SOC in the run's last 24 hours (its last local day): did the pack get back to full? */
  lastDayHighestSocFraction: number
  /** Shed because the pack was at its floor or its discharge current limit. [Wh] */
  shortageWh: number
  /** Shed because the pack was outside its discharge temperature window. [Wh] */
  dischargeBlockedWh: number
  /** AC demand above the inverter rating. [Wh] */
  inverterOverloadWh: number
  unservedWh: number
  sourceUsedWh: number
  servedWh: number
  chargeInWh: number
  dischargeOutWh: number
  packLossWh: number
  /** Charge removed from the pack ÷ capacity. */
  equivalentFullCycles: number
  /** First hour the pack shed load (floor, current limit, or outside its discharge temperature window); -1 if none. */
  firstShortageHour: number
  hoursRun: number
  chargeBlockedColdH: number
}

export interface RunResult {
  totals: RunTotals
  series: HourlySeries | null
  dayRows: DayRow[] | null
}

const NCAT = LOAD_CATEGORIES.length
const HEATER = CATEGORY_INDEX.heater

/** Flat recording buffers: loads as [category * hours + hour], so each category is a contiguous view. */
interface Recorder {
  soc: Float64Array
  packT: Float64Array
  load: Float64Array
  source: Float64Array
  unserved: Float64Array
  curtailed: Float64Array
  blocked: Float64Array
  loss: Float64Array
  blockedCold: Uint8Array
}

function newRecorder(n: number): Recorder {
  // One allocation for all the Float64 series (they are views into it).
  const buf = new Float64Array(n * (6 + NCAT + SOURCE_KINDS.length))
  let at = 0
  const take = (len: number) => buf.subarray(at, (at += len))
  return {
    soc: take(n),
    packT: take(n),
    load: take(n * NCAT),
    source: take(n * SOURCE_KINDS.length),
    unserved: take(n),
    curtailed: take(n),
    blocked: take(n),
    loss: take(n),
    blockedCold: new Uint8Array(n),
  }
}

function seriesFrom(prep: PreparedTrip, r: Recorder): HourlySeries {
  const n = prep.hours
  const view = (buf: Float64Array, k: number) => buf.subarray(k * n, (k + 1) * n)
  return {
    socEndFraction: r.soc,
    packTempStartC: r.packT,
    ambientC: prep.ambientC,
    ghiWPerM2: prep.ghiWPerM2,
    sunElevationDeg: prep.sun.elevationDeg,
    sourceW: {
      solar: view(r.source, 0),
      dcdc: view(r.source, 1),
      shore: view(r.source, 2),
      generator: view(r.source, 3),
    },
    loadW: Object.fromEntries(LOAD_CATEGORIES.map((c, k) => [c, view(r.load, k)])) as HourlySeries['loadW'],
    unservedW: r.unserved,
    curtailedW: r.curtailed,
    chargeBlockedW: r.blocked,
    packLossW: r.loss,
    chargeBlockedCold: r.blockedCold,
  }
}

/** Day rows from the hourly record: sums and extremes per local day. */
function dayRowsFrom(
  prep: PreparedTrip,
  r: Recorder,
  startSoc: number,
  fuelLPerH: number,
  b: { chargeMinC: number; chargeMaxC: number },
): DayRow[] {
  const n = prep.hours
  const rows: DayRow[] = []
  let prevSoc = startSoc
  for (let d = 0; d < prep.days; d++) {
    const row = newDayRow(d, prep.sun.dates[d]!, prevSoc)
    for (let i = d * 24; i < d * 24 + 24; i++) {
      const soc = r.soc[i]!
      if (soc < row.lowestSocFraction) row.lowestSocFraction = soc
      row.inWh.solar += r.source[i]!
      row.inWh.dcdc += r.source[n + i]!
      row.inWh.shore += r.source[2 * n + i]!
      row.inWh.generator += r.source[3 * n + i]!
      if (r.blocked[i]! > 0) {
        if (r.packT[i]! < b.chargeMinC) row.chargeBlockedColdH++
        else if (r.packT[i]! > b.chargeMaxC) row.chargeBlockedHotH++
      }
      row.chargeBlockedWh += r.blocked[i]!
      row.unservedWh += r.unserved[i]!
      row.curtailedWh += r.curtailed[i]!
      row.packLossWh += r.loss[i]!
      row.generatorFuelL += prep.generatorRunH[i]! * fuelLPerH
    }
    for (let c = 0; c < NCAT; c++) {
      let sum = 0
      for (let i = d * 24; i < d * 24 + 24; i++) sum += r.load[c * n + i]!
      row.outWh[LOAD_CATEGORIES[c]!] = sum
    }
    row.heaterWh = row.outWh.heater
    row.finalSocFraction = r.soc[d * 24 + 23]!
    prevSoc = row.finalSocFraction
    rows.push(row)
  }
  return rows
}

function newDayRow(day: number, date: string, soc: number): DayRow {
  return {
    day,
    date,
    inWh: { solar: 0, dcdc: 0, shore: 0, generator: 0 },
    outWh: {
      fridge: 0,
      lighting: 0,
      cooking: 0,
      heating: 0,
      electronics: 0,
      water: 0,
      ventilation: 0,
      other: 0,
      inverter: 0,
      bms: 0,
      heater: 0,
    },
    lowestSocFraction: soc,
    finalSocFraction: soc,
    heaterWh: 0,
    chargeBlockedColdH: 0,
    chargeBlockedHotH: 0,
    chargeBlockedWh: 0,
    unservedWh: 0,
    curtailedWh: 0,
    packLossWh: 0,
    generatorFuelL: 0,
  }
}

/** Run the pack over the prepared trip. */
export function runPack(prep: PreparedTrip, opt: RunOptions = {}): RunResult {
  const b = prep.plan.battery
  const capAh = opt.capacityAh ?? b.capacityAh
  const scale = capAh / b.capacityAh
  const solarScale = opt.solarScale ?? 1
  const sourcesOn = opt.sourcesOn ?? true
  const record = opt.record ?? true
  const hoursToRun = opt.hours ?? prep.hours
  const vNom = b.nominalVoltageV
  const capWh = capAh * vNom
  const floorWh = capWh * b.socFloorFraction
  const ceilWh = capWh * b.socCeilingFraction
  const etaC = oneWayEfficiency(b.roundTripEfficiencyFraction)
  const etaD = etaC
  const maxChargeW = b.maxChargeCurrentA * scale * b.chargeVoltageV
  const maxDischargeW = b.maxDischargeCurrentA * scale * vNom
  const massKg = b.massKg * scale
  const areaM2 = b.enclosure.areaM2 * Math.cbrt(scale * scale)
  const thermal: ThermalParams = {
    heatCapacityJPerK: massKg * b.specificHeatJPerKgK,
    conductanceWPerK: uValueWPerM2K(b.enclosure.thicknessM, b.enclosure.conductivityWPerMK) * areaM2,
    heaterPowerW: b.heater?.powerW ?? 0,
    heaterOnBelowC: b.heater?.onBelowC ?? -Infinity,
    heaterOffAboveC: b.heater?.offAboveC ?? -Infinity,
  }
  const startSoc = opt.startSocFraction ?? prep.plan.trip.startSocFraction
  const fuelLPerH = prep.plan.sources.generator.reduce((s, g) => s + g.fuelLPerH, 0)

  let stored = startSoc * capWh
  // The pack starts the trip at the air temperature, or held at its thermostat's off point if it has a pad.
  let packT = b.heater ? Math.max(prep.ambientC[0]!, b.heater.offAboveC) : prep.ambientC[0]!
  let heaterOn = false
  const t: RunTotals = {
    startStoredWh: stored,
    endStoredWh: stored,
    capacityWh: capWh,
    floorWh,
    startSocFraction: startSoc,
    finalSocFraction: startSoc,
    lowestSocFraction: startSoc,
    lowestSocHour: -1,
    lastDayHighestSocFraction: 0,
    shortageWh: 0,
    dischargeBlockedWh: 0,
    inverterOverloadWh: 0,
    unservedWh: 0,
    sourceUsedWh: 0,
    servedWh: 0,
    chargeInWh: 0,
    dischargeOutWh: 0,
    packLossWh: 0,
    equivalentFullCycles: 0,
    firstShortageHour: -1,
    hoursRun: 0,
    chargeBlockedColdH: 0,
  }
  const rec = record ? newRecorder(prep.hours) : null
  const n = prep.hours
  let removedWh = 0
  const thStep: ThermalStepResult = { endTempC: 0, heaterOnEnd: false, heaterOnH: 0 }
  const lastDayFrom = hoursToRun - 24
  const stopBelow = opt.stopBelowSocFraction ?? -Infinity

  for (let h = 0; h < hoursToRun; h++) {
    const i = h % prep.hours
    const hod = i % 24
    const ambient = prep.ambientC[i]!
    const t0 = packT
    const chargeCold = t0 < b.chargeMinC
    const chargeHot = t0 > b.chargeMaxC
    const dischargeOk = t0 >= b.dischargeMinC && t0 <= b.dischargeMaxC

    // Thermal step: the heater is a load like any other.
    const th = stepPackTemperatureInto(thStep, thermal, t0, heaterOn, ambient, 1)
    let heaterW = thermal.heaterPowerW * th.heaterOnH
    const baseW = prep.demandW[hod]!
    const demand = baseW + heaterW

    let srcAvail = 0
    let sol = 0
    let dcdc = 0
    let shore = 0
    let gen = 0
    if (sourcesOn) {
      sol = prep.solarW[i]! * solarScale
      dcdc = prep.dcdcW[i]!
      shore = prep.shoreW[i]!
      gen = prep.generatorW[i]!
      srcAvail = sol + dcdc + shore + gen
    }
    const srcTotal = srcAvail
    let blockedW = 0
    let direct: number
    let heaterFirst = false
    if ((chargeCold || chargeHot) && srcAvail > 0) {
      // Charge path open: the sources are cut off from the pack and the load bus; their energy is lost to the
      // plan, except what the heater pad takes (pads are fed from the charge side so a cold pack can warm up
      // and accept charge again; without that a pack at its floor in the cold could never recover).
      direct = Math.min(srcAvail, heaterW)
      blockedW = srcAvail - direct
      srcAvail = direct
      heaterFirst = true
    } else {
      direct = Math.min(srcAvail, demand)
    }
    const surplus = srcAvail - direct
    const deficit = demand - direct

    let chargeIn = 0
    if (surplus > 0) {
      const taper = chargeTaperFactor(stored / capWh, b.chargeTaperStartSocFraction, b.socCeilingFraction)
      chargeIn = Math.min(surplus, maxChargeW * taper, Math.max(0, ceilWh - stored) / etaC)
      stored += chargeIn * etaC
    }
    const curtailed = surplus - chargeIn

    let out = 0
    let f = 1
    let shortage = 0
    let dischargeBlocked = 0
    if (deficit > 0) {
      if (!dischargeOk) {
        dischargeBlocked = deficit
      } else {
        const want = Math.min(deficit, maxDischargeW)
        f = peukertFactor(capAh, b.ratedDischargeH, want / vNom, b.peukertExponent)
        const avail = (Math.max(0, stored - floorWh) * etaD) / f
        out = Math.min(want, avail)
        stored -= (out * f) / etaD
        shortage = deficit - out
      }
    }
    if (stored < 0) stored = 0 // numerical guard; the floor check above keeps it ≥ floor
    const unserved = deficit - out
    // Who got what: normally the bus shares direct supply and pack output in proportion to demand; while the
    // charge path is open the sources' share went to the heater pad first.
    const restFraction = deficit > 0 ? out / deficit : 1
    const heaterServedW = heaterFirst
      ? direct + (heaterW - direct) * restFraction
      : demand > 0
        ? (heaterW * (direct + out)) / demand
        : heaterW
    const otherFraction = heaterFirst ? restFraction : demand > 0 ? (direct + out) / demand : 1
    if (heaterServedW < heaterW - 1e-12) {
      // The pad got only part of its power: redo the thermal step with what it really got.
      stepPackTemperatureInto(
        th,
        { ...thermal, heaterPowerW: (thermal.heaterPowerW * heaterServedW) / heaterW },
        t0,
        heaterOn,
        ambient,
        1,
      )
    }
    heaterW = heaterServedW
    packT = th.endTempC
    heaterOn = th.heaterOnEnd

    const loss = chargeIn * (1 - etaC) + out * (f / etaD - 1)
    removedWh += (out * f) / etaD
    const soc = stored / capWh
    const used = direct + chargeIn
    const overload = prep.inverterOverloadW[hod]!

    t.sourceUsedWh += used
    t.servedWh += direct + out
    t.chargeInWh += chargeIn
    t.dischargeOutWh += out
    t.packLossWh += loss
    t.shortageWh += shortage
    t.dischargeBlockedWh += dischargeBlocked
    t.inverterOverloadWh += overload
    t.unservedWh += unserved + overload
    if (chargeCold && blockedW > 0) t.chargeBlockedColdH++
    if (soc < t.lowestSocFraction) {
      t.lowestSocFraction = soc
      t.lowestSocHour = h
    }
    if (h >= lastDayFrom && soc > t.lastDayHighestSocFraction) t.lastDayHighestSocFraction = soc
    t.hoursRun = h + 1
    if (opt.stopAtFirstFloorShortage && t.shortageWh > 1e-6) break
    if (soc < stopBelow) break
    if ((shortage > 1e-9 || dischargeBlocked > 1e-9) && t.firstShortageHour < 0) {
      t.firstShortageHour = h
      if (opt.stopAtFirstShortage) break
    }

    if (rec && h < n) {
      rec.soc[i] = soc
      rec.packT[i] = t0
      const share = srcTotal > 0 ? used / srcTotal : 0
      rec.source[i] = sol * share
      rec.source[n + i] = dcdc * share
      rec.source[2 * n + i] = shore * share
      rec.source[3 * n + i] = gen * share
      const base = hod * NCAT
      for (let c = 0; c < NCAT; c++) rec.load[c * n + i] = prep.demandByCategoryW[base + c]! * otherFraction
      rec.load[HEATER * n + i] = heaterW
      rec.unserved[i] = unserved + overload
      rec.curtailed[i] = curtailed
      rec.blocked[i] = blockedW
      rec.loss[i] = loss
      rec.blockedCold[i] = chargeCold && blockedW > 0 ? 1 : 0
    }
  }
  t.endStoredWh = stored
  t.finalSocFraction = stored / capWh
  t.equivalentFullCycles = removedWh / capWh
  if (!rec) return { totals: t, series: null, dayRows: null }
  return { totals: t, series: seriesFrom(prep, rec), dayRows: dayRowsFrom(prep, rec, startSoc, fuelLPerH, b) }
}
