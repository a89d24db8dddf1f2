/**
 * Lithium against lead-acid at a chosen pack size: the engine compares chemistries for the same usable
 * energy as the plan's pack; here that comparison is carried to another size (Pack needed, with margin, or
 * yours), with the years each would last at this trip's pace. Pure, over the JSON form of the analysis.
 */
import type { AnalysisJson } from '../../composables/useEngineWorker'

/** Years are capped here: calendar ageing ends a pack before its cycles do (common practice, no source). */
export const YEARS_CAP = 15

export type ChemistryOptionJson = AnalysisJson['chemistryComparison'][number]

export interface ChemistryRow extends ChemistryOptionJson {
  /** Years to the end of the cycle life if every day were like this trip's days; Infinity when unused. */
  years: number
}

export interface ChemistryBasis {
  key: 'needed' | 'margin' | 'yours'
  /** The plan chemistry's capacity the comparison is made for. [Ah] */
  capacityAh: number
}

/** The sizes worth comparing at: Pack needed, Pack needed with margin, and yours (without repeats). */
export function chemistryBases(a: AnalysisJson): ChemistryBasis[] {
  const out: ChemistryBasis[] = []
  const add = (key: ChemistryBasis['key'], ah: number | null) => {
    if (ah !== null && ah > 0 && !out.some((b) => Math.round(b.capacityAh) === Math.round(ah)))
      out.push({ key, capacityAh: ah })
  }
  add('needed', a.packNeeded.capacityAh)
  add('margin', a.packNeeded.withMarginCapacityAh)
  add('yours', a.plan.battery.capacityAh)
  return out
}

/**
 * Every chemistry for the usable energy of a `capacityAh` pack of the plan's chemistry. Capacity, energy,
 * mass, price and lifetime energy are all proportional to the usable energy (the engine's own comparison,
 * shared/engine/sizing/chemistry.ts, scaled; the plan's own mass scales with capacity as in the pack search);
 * depth, cycle life and cost per delivered kWh do not change with size. Energy balance; no empirical model.
 *
 * Years: the pack delivers each day what this trip asked of it, its discharge plus what was shed at its
 * floor (a pack big enough would have delivered that too), against the usable energy of the chosen size.
 */
export function chemistryAt(a: AnalysisJson, capacityAh: number): ChemistryRow[] {
  const k = capacityAh / a.plan.battery.capacityAh
  const cyclesPerDay = cyclesPerDayAt(a, capacityAh)
  return a.chemistryComparison.map((c) => ({
    ...c,
    capacityAh: c.capacityAh * k,
    nominalKWh: c.nominalKWh * k,
    massKg: c.massKg * k,
    priceTotal: c.priceTotal * k,
    lifetimeDeliveredKWh: c.lifetimeDeliveredKWh * k,
    years: cyclesPerDay > 0 ? c.cycleLifeCycles / (cyclesPerDay * 365) : Number.POSITIVE_INFINITY,
  }))
}

/** Full cycles a day at this size: what the trip asks of the pack each day ÷ its usable energy. */
export function cyclesPerDayAt(a: AnalysisJson, capacityAh: number): number {
  const b = a.plan.battery
  const usableWh = capacityAh * b.nominalVoltageV * (b.socCeilingFraction - b.socFloorFraction)
  const ownPack = Math.round(capacityAh) === Math.round(b.capacityAh)
  const dailyWh =
    (a.totals.dischargeOutWh + (ownPack ? 0 : a.summary.shortageWh)) / Math.max(1, a.days.length)
  return usableWh > 0 ? dailyWh / usableWh : 0
}
