/**
 * simulate(plan): one hourly run of the plan as given, with daily rows, a trip summary and a verdict.
 * analysePlan(plan): the same, plus autonomy, pack needed, solar needed, the classic sizing figure and the
 * chemistry comparison. This is the one function the CLI, the server and the browser call.
 */
import type { Plan } from '../schemas/plan.ts'
import { fillPlanDefaults, type ResolvedPlan } from './presets.ts'
import { prepareTripReusing, SOURCE_KINDS, type PreparedTrip, type SourceKind } from './prepare.ts'
import { runPack, type DayRow, type HourlySeries, type RunTotals } from './battery/run.ts'
import {
  autonomy,
  packNeeded,
  solarNeeded,
  type AutonomyResult,
  type PackNeededResult,
  type SolarNeededResult,
} from './sizing/search.ts'
import {
  classicBatterySizing,
  temperatureCorrectionIeee485,
  type ClassicSizingResult,
} from './sizing/classic.ts'
import { compareChemistries, type ChemistryOption } from './sizing/chemistry.ts'
import { TIGHT_MARGIN_FRACTION } from './margin.ts'

export { TIGHT_MARGIN_FRACTION }

export interface TripSummary {
  startSocFraction: number
  finalSocFraction: number
  lowestSocFraction: number
  /** Hour index (from the trip start, local midnight) of the lowest SOC; -1 if it never fell. */
  lowestSocHour: number
  /** Local date of the lowest SOC. */
  lowestSocDate: string
  /** Days whose final SOC is at (within 0.001) or below the floor. */
  daysEndingBelowFloor: number
  unservedWh: number
  /** Unserved because the pack hit its floor or discharge current limit. [Wh] */
  shortageWh: number
  dischargeBlockedWh: number
  inverterOverloadWh: number
  energyInWh: Record<SourceKind, number>
  /** Share of the used energy from each source. [0–1] */
  sourceShareFraction: Record<SourceKind, number>
  energyOutWh: number
  heaterWh: number
  chargeBlockedColdH: number
  chargeBlockedWh: number
  curtailedWh: number
  packLossWh: number
  generatorFuelL: number
  equivalentFullCycles: number
}

export type VerdictStatus = 'carries' | 'tight' | 'short'

export interface Verdict {
  status: VerdictStatus
  /** Lowest SOC minus the floor. [0–1] */
  marginFraction: number
  /** The same margin as energy. [Wh] */
  marginWh: number
  /** Plain-words reason. */
  message: string
}

export interface SimulationResult {
  plan: ResolvedPlan
  hours: number
  series: HourlySeries
  days: DayRow[]
  summary: TripSummary
  verdict: Verdict
  /** Raw totals of the pack run (energy balance terms). */
  totals: RunTotals
}

export interface Analysis extends SimulationResult {
  autonomy: AutonomyResult
  packNeeded: PackNeededResult
  solarNeeded: SolarNeededResult
  classicSizing: ClassicSizingResult
  chemistryComparison: ChemistryOption[]
}

export interface SimulateOptions {
  /** Called between stages of analysePlan with a fraction done and a stage name. */
  onProgress?: (fraction: number, stage: string) => void
}

function summarise(prep: PreparedTrip, totals: RunTotals, days: DayRow[]): TripSummary {
  const b = prep.plan.battery
  const energyInWh = { solar: 0, dcdc: 0, shore: 0, generator: 0 }
  let out = 0
  let heater = 0
  let blockedH = 0
  let blockedWh = 0
  let curtailed = 0
  let fuel = 0
  let below = 0
  for (const d of days) {
    for (const k of SOURCE_KINDS) energyInWh[k] += d.inWh[k]
    for (const w of Object.values(d.outWh)) out += w
    heater += d.heaterWh
    blockedH += d.chargeBlockedColdH
    blockedWh += d.chargeBlockedWh
    curtailed += d.curtailedWh
    fuel += d.generatorFuelL
    if (d.finalSocFraction <= b.socFloorFraction + 0.001) below++
  }
  const totalIn = SOURCE_KINDS.reduce((s, k) => s + energyInWh[k], 0)
  const share = (k: SourceKind) => (totalIn > 0 ? energyInWh[k] / totalIn : 0)
  const lowestDay = totals.lowestSocHour >= 0 ? Math.floor(totals.lowestSocHour / 24) : 0
  return {
    startSocFraction: totals.startSocFraction,
    finalSocFraction: totals.finalSocFraction,
    lowestSocFraction: totals.lowestSocFraction,
    lowestSocHour: totals.lowestSocHour,
    lowestSocDate: days[lowestDay]?.date ?? prep.plan.trip.startDate,
    daysEndingBelowFloor: below,
    unservedWh: totals.unservedWh,
    shortageWh: totals.shortageWh,
    dischargeBlockedWh: totals.dischargeBlockedWh,
    inverterOverloadWh: totals.inverterOverloadWh,
    energyInWh,
    sourceShareFraction: {
      solar: share('solar'),
      dcdc: share('dcdc'),
      shore: share('shore'),
      generator: share('generator'),
    },
    energyOutWh: out,
    heaterWh: heater,
    chargeBlockedColdH: blockedH,
    chargeBlockedWh: blockedWh,
    curtailedWh: curtailed,
    packLossWh: totals.packLossWh,
    generatorFuelL: fuel,
    equivalentFullCycles: totals.equivalentFullCycles,
  }
}

/** Does the pack carry the trip? 'short' if any load was shed; 'tight' if the margin is under 10 SOC points. */
export function verdictFor(summary: TripSummary, totals: RunTotals, floorFraction: number): Verdict {
  const marginFraction = summary.lowestSocFraction - floorFraction
  const marginWh = marginFraction * totals.capacityWh
  if (summary.unservedWh > 1e-6) {
    const parts: string[] = []
    if (summary.shortageWh > 1e-6)
      parts.push(`${Math.round(summary.shortageWh)} Wh shed at the floor or the discharge limit`)
    if (summary.dischargeBlockedWh > 1e-6)
      parts.push(
        `${Math.round(summary.dischargeBlockedWh)} Wh shed because the pack was too cold or hot to discharge`,
      )
    if (summary.inverterOverloadWh > 1e-6)
      parts.push(`${Math.round(summary.inverterOverloadWh)} Wh of AC demand above the inverter rating`)
    return {
      status: 'short',
      marginFraction,
      marginWh,
      message: `The pack does not carry this trip: ${parts.join('; ')}.`,
    }
  }
  if (marginFraction < TIGHT_MARGIN_FRACTION) {
    return {
      status: 'tight',
      marginFraction,
      marginWh,
      message: `The pack carries this trip, but only ${Math.round(marginFraction * 100)} SOC points above the floor at its lowest.`,
    }
  }
  return {
    status: 'carries',
    marginFraction,
    marginWh,
    message: `The pack carries this trip with ${Math.round(marginFraction * 100)} SOC points (${Math.round(marginWh)} Wh) above the floor at its lowest.`,
  }
}

function simulatePrepared(prep: PreparedTrip): SimulationResult {
  const run = runPack(prep)
  const days = run.dayRows!
  const summary = summarise(prep, run.totals, days)
  return {
    plan: prep.plan,
    hours: prep.hours,
    series: run.series!,
    days,
    summary,
    verdict: verdictFor(summary, run.totals, prep.plan.battery.socFloorFraction),
    totals: run.totals,
  }
}

/** One hourly run of a validated plan (see parsePlan). */
export function simulate(plan: Plan, options: SimulateOptions = {}): SimulationResult {
  options.onProgress?.(0, 'prepare')
  const prep = prepareTripReusing(fillPlanDefaults(plan))
  options.onProgress?.(0.5, 'simulate')
  const result = simulatePrepared(prep)
  options.onProgress?.(1, 'done')
  return result
}

/** Classic-method inputs from the run: average daily load without the heater, 3 days of autonomy. */
function classicFor(prep: PreparedTrip): ClassicSizingResult {
  const b = prep.plan.battery
  const t = prep.plan.trip
  const lead = b.chemistry !== 'lfp'
  const dailyDemandWh = prep.demandW.reduce((s, w) => s + w, 0)
  return classicBatterySizing({
    dailyLoadWh: dailyDemandWh,
    systemVoltageV: b.nominalVoltageV,
    autonomyDays: 3, // non-critical loads: 3–5 days (IEEE 1562, from memory)
    depthOfDischargeFraction: b.socCeilingFraction - b.socFloorFraction,
    // Lead-acid capacity falls in the cold (IEEE 485 Table 1 at the trip's mean air temperature);
    // LFP capacity is taken as temperature-independent (common practice, no source).
    temperatureFactor: lead ? temperatureCorrectionIeee485((t.nightLowC + t.dayHighC) / 2) : 1,
    ageingFactor: lead ? 1.25 : 1, // IEEE 485, replace at 80 % capacity (from memory); LFP: none, as REFERENCES §5.3
    designMarginFactor: 1.1, // IEEE 485 design margin 1.10–1.15 (from memory)
  })
}

/** simulate() plus every sizing answer. */
export function analysePlan(plan: Plan, options: SimulateOptions = {}): Analysis {
  const progress = options.onProgress ?? (() => {})
  progress(0, 'prepare')
  const prep = prepareTripReusing(fillPlanDefaults(plan))
  progress(0.1, 'simulate')
  const sim = simulatePrepared(prep)
  progress(0.2, 'autonomy')
  const aut = autonomy(prep)
  progress(0.3, 'packNeeded')
  const pack = packNeeded(prep)
  progress(0.6, 'solarNeeded')
  const solar = solarNeeded(prep, pack.capacityAh)
  progress(0.95, 'comparisons')
  const result: Analysis = {
    ...sim,
    autonomy: aut,
    packNeeded: pack,
    solarNeeded: solar,
    classicSizing: classicFor(prep),
    chemistryComparison: compareChemistries(prep.plan.battery),
  }
  progress(1, 'done')
  return result
}
