/**
 * Shapes the engine's results into what the charts and tables draw: loads per day, energy by appliance,
 * SOC lines. Pure functions over the JSON form of results.
 */
import type { SimulationJson } from '../../composables/useOutlook'

export interface DailyEnergyRow {
  day: number
  inWh: Record<'solar' | 'dcdc' | 'shore' | 'generator', number>
  outWh: Record<string, number>
  heaterWh: number
}

export interface SocLine {
  label: string
  /** State of charge at the start of the trip. [0–1] */
  startSocFraction: number
  /** End of each hour. [0–1] */
  socEndFraction: number[]
  socFloorFraction: number
}

export interface ApplianceShare {
  name: string
  /** Over the whole trip. [Wh] */
  energyWh: number
  kind: 'appliance' | 'heater' | 'system'
}

/** Energy served to everything but the heater pad in one day. [Wh] */
export function loadsWh(d: DailyEnergyRow): number {
  let s = 0
  for (const [k, v] of Object.entries(d.outWh)) if (k !== 'heater') s += v
  return s
}

export function totalInWh(d: DailyEnergyRow): number {
  return d.inWh.solar + d.inWh.dcdc + d.inWh.shore + d.inWh.generator
}

/**
 * Where the energy goes over the trip. Appliances: their planned use (quantity × (power × duty × hours +
 * standby × the rest of the day) × days; AC ones at their AC power, the inverter's conversion loss shown on
 * its own line). Inverter, BMS and heater: what the run served. Shed loads are not subtracted per
 * appliance (the verdict reports them).
 */
export function applianceShares(r: SimulationJson): ApplianceShare[] {
  const days = r.days.length
  const items: ApplianceShare[] = r.plan.appliances
    .map((a) => ({
      name: a.quantity > 1 ? `${a.name} × ${a.quantity}` : a.name,
      energyWh:
        a.quantity *
        (a.powerW * a.dutyCycleFraction * a.hoursPerDay + a.standbyW * (24 - a.hoursPerDay)) *
        days,
      kind: 'appliance' as const,
    }))
    .filter((i) => i.energyWh > 0.5)
  let inverter = 0
  let bms = 0
  let heater = 0
  for (const d of r.days) {
    inverter += d.outWh.inverter ?? 0
    bms += d.outWh.bms ?? 0
    heater += d.heaterWh
  }
  if (heater > 0.5) items.push({ name: 'Battery heater pad', energyWh: heater, kind: 'heater' })
  if (inverter > 0.5)
    items.push({ name: 'Inverter (idle and conversion)', energyWh: inverter, kind: 'system' })
  if (bms > 0.5) items.push({ name: 'BMS and monitor', energyWh: bms, kind: 'system' })
  return items.sort((a, b) => b.energyWh - a.energyWh)
}

export function socLine(r: SimulationJson, label: string): SocLine {
  return {
    label,
    startSocFraction: r.summary.startSocFraction,
    socEndFraction: r.series.socEndFraction,
    socFloorFraction: r.plan.battery.socFloorFraction,
  }
}

/** The trip's energy balance, as the Outlook explains it: in − used − pack losses = change in stored energy. */
export interface EnergyBalance {
  /** Used from every charge source (to the loads directly, or into the pack). [Wh] */
  inWh: number
  /** Served to everything that draws: appliances, the inverter's own draw, the BMS, the heater pad. [Wh] */
  usedWh: number
  /** Of the used energy: the inverter's idle draw and conversion loss. [Wh] */
  inverterWh: number
  /** Of the used energy: the BMS and monitor. [Wh] */
  bmsWh: number
  /** Of the used energy: the heater pad. [Wh] */
  heaterWh: number
  /** Lost in the pack: charging and discharging efficiency (and Peukert for lead-acid). [Wh] */
  packLossWh: number
  /** Stored at the end − stored at the start. [Wh] */
  changeWh: number
  /** Not counted as in: sun and charge the pack could not take (full, or at its charge limit). [Wh] */
  curtailedWh: number
  /** Not counted as in: charge lost while the cells were too cold or hot to charge. [Wh] */
  chargeBlockedWh: number
}

/**
 * Energy balance; no empirical model (shared/engine/battery/run.ts): every hour the sources' used energy
 * goes to the loads or into the pack, what the pack gives goes to the loads, and the pack's conversion
 * losses are the difference. So in − used − losses = change in stored energy, to the results' rounding.
 */
export function energyBalance(r: SimulationJson): EnergyBalance {
  const e = r.summary.energyInWh
  let inverterWh = 0
  let bmsWh = 0
  for (const d of r.days) {
    inverterWh += d.outWh.inverter ?? 0
    bmsWh += d.outWh.bms ?? 0
  }
  return {
    inWh: e.solar + e.dcdc + e.shore + e.generator,
    usedWh: r.summary.energyOutWh,
    inverterWh,
    bmsWh,
    heaterWh: r.summary.heaterWh,
    packLossWh: r.summary.packLossWh,
    changeWh: r.totals.endStoredWh - r.totals.startStoredWh,
    curtailedWh: r.summary.curtailedWh,
    chargeBlockedWh: r.summary.chargeBlockedWh,
  }
}

/** Everything that draws in one day: the appliances, the inverter's own draw, the BMS and the heater pad. */
export interface DayLoads {
  /** What they asked for. [Wh] */
  askedWh: number
  /** What they got. [Wh] */
  servedWh: number
  /** What was shed (asked − served): at the floor, too cold to discharge, or above the inverter's rating. [Wh] */
  unservedWh: number
  /** Of the served energy: the heater pad. [Wh] */
  heaterWh: number
}

export function dayLoads(d: DailyEnergyRow & { unservedWh: number }): DayLoads {
  const servedWh = loadsWh(d) + d.heaterWh
  return { askedWh: servedWh + d.unservedWh, servedWh, unservedWh: d.unservedWh, heaterWh: d.heaterWh }
}
