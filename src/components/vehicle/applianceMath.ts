/**
 * Daily energy of the appliance inventory, for the totals under the table.
 * Energy balance; no empirical model. The same formula as the engine's `applianceDailyWh`
 * (shared/engine/loads/profile.ts):  E = q · (P_on · duty · h_on + P_standby · (24 − h_on)).
 */
import { PLAN_DEFAULTS } from '@shared/engine/presets'
import type { Appliance } from '@shared/schemas/plan'

export type ApplianceFields = Pick<
  Appliance,
  'powerW' | 'quantity' | 'hoursPerDay' | 'supply' | 'dutyCycleFraction' | 'standbyW'
>

/** Energy the appliance itself uses per day (AC side for AC loads). [Wh] */
export function applianceWhPerDay(a: ApplianceFields): number {
  const duty = a.dutyCycleFraction ?? PLAN_DEFAULTS.dutyCycleFraction
  const standby = a.standbyW ?? PLAN_DEFAULTS.standbyW
  return a.quantity * (a.powerW * duty * a.hoursPerDay + standby * (24 - a.hoursPerDay))
}

export interface InventoryTotals {
  /** Energy of the DC loads. [Wh/day] */
  dcWh: number
  /** Energy of the AC loads at the outlet. [Wh/day] */
  acWh: number
  /** What the pack delivers: DC loads plus AC loads divided by the inverter efficiency. [Wh/day] */
  packWh: number
  /** packWh at the bank's nominal voltage. [Ah/day] */
  packAh: number
}

/**
 * Totals at the pack. Inverter idle draw is left out here (it depends on when the inverter is on;
 * the Outlook's hourly simulation includes it).
 */
export function inventoryTotals(
  appliances: ApplianceFields[],
  nominalVoltageV: number,
  inverterEfficiencyFraction: number = PLAN_DEFAULTS.inverterEfficiencyFraction,
): InventoryTotals {
  let dcWh = 0
  let acWh = 0
  for (const a of appliances) {
    const wh = applianceWhPerDay(a)
    if (a.supply === 'ac') acWh += wh
    else dcWh += wh
  }
  const packWh = dcWh + (inverterEfficiencyFraction > 0 ? acWh / inverterEfficiencyFraction : 0)
  return { dcWh, acWh, packWh, packAh: nominalVoltageV > 0 ? packWh / nominalVoltageV : 0 }
}

/** Ah per day at a voltage, for a row. [Ah] */
export function whToAh(wh: number, voltageV: number): number {
  return voltageV > 0 ? wh / voltageV : 0
}
