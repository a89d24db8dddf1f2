/**
 * Chemistry comparison for the same usable energy. Energy balance plus the presets' rough figures.
 */
import { CHEMISTRIES, type Chemistry } from '../../schemas/plan.ts'
import { CHEMISTRY_PRESETS, type ResolvedBattery } from '../presets.ts'

/** Capacity that gives `usableWh` between full and the allowed depth of discharge. [Ah] */
export function capacityForUsableEnergyAh(
  usableWh: number,
  nominalVoltageV: number,
  depthOfDischargeFraction: number,
): number {
  return usableWh / (nominalVoltageV * depthOfDischargeFraction)
}

export interface ChemistryOption {
  chemistry: Chemistry
  depthOfDischargeFraction: number
  capacityAh: number
  nominalKWh: number
  massKg: number
  cycleLifeCycles: number
  /** Cycles × usable energy: what the pack delivers before end of life. [kWh] */
  lifetimeDeliveredKWh: number
  priceTotal: number
  /** Price ÷ lifetime delivered energy, in the user's currency. [currency/kWh] */
  costPerDeliveredKWh: number
  /** true for the plan's own chemistry (its own figures, not the preset's). */
  isPlanChemistry: boolean
}

/**
 * Each chemistry sized for the plan's usable energy at the plan's nominal voltage. The plan's own chemistry
 * uses the plan's figures; the others use their presets (DoD = ceiling − floor, mass per kWh, cycle life,
 * price per kWh; all common practice, see presets.ts).
 * Cycle life is taken at the preset's rated depth of discharge; usage at another depth is not corrected.
 */
export function compareChemistries(b: ResolvedBattery): ChemistryOption[] {
  const usableWh = b.capacityAh * b.nominalVoltageV * (b.socCeilingFraction - b.socFloorFraction)
  return CHEMISTRIES.map((chem) => {
    const own = chem === b.chemistry
    const p = CHEMISTRY_PRESETS[chem]
    const dod = own ? b.socCeilingFraction - b.socFloorFraction : p.socCeilingFraction - p.socFloorFraction
    const capacityAh = own ? b.capacityAh : capacityForUsableEnergyAh(usableWh, b.nominalVoltageV, dod)
    const nominalKWh = (capacityAh * b.nominalVoltageV) / 1000
    const cycles = own ? b.cycleLifeCycles : p.cycleLifeCycles
    const pricePerKWh = own ? b.pricePerKWh : p.pricePerKWh
    const lifetimeDeliveredKWh = (cycles * usableWh) / 1000
    const priceTotal = nominalKWh * pricePerKWh
    return {
      chemistry: chem,
      depthOfDischargeFraction: dod,
      capacityAh,
      nominalKWh,
      massKg: own ? b.massKg : nominalKWh * p.massKgPerKWh,
      cycleLifeCycles: cycles,
      lifetimeDeliveredKWh,
      priceTotal,
      costPerDeliveredKWh: lifetimeDeliveredKWh > 0 ? priceTotal / lifetimeDeliveredKWh : 0,
      isPlanChemistry: own,
    }
  })
}
