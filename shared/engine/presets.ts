/**
 * Chemistry presets and the defaults that turn a stored plan into a fully specified one.
 *
 * Every default names where it comes from. Tags, as in shared/REFERENCES.md:
 *   [M]  from memory of the named source, not re-verified;
 *   [R]  read in the named source;
 *   [CP] common practice, no source.
 */
import type {
  Appliance,
  BatteryBank,
  Chemistry,
  DayPlanEntry,
  Heater,
  Inverter,
  Plan,
  SolarArray,
  Trip,
} from '../schemas/plan.ts'

export interface ChemistryPreset {
  /** Nominal cell voltage. [V] */
  cellNominalV: number
  /** Average cell voltage while charging (bulk phase), used to turn charger amps into watts. [V] */
  cellChargeV: number
  socFloorFraction: number
  socCeilingFraction: number
  roundTripEfficiencyFraction: number
  peukertExponent: number
  ratedDischargeH: number
  chargeTaperStartSocFraction: number
  chargeMinC: number
  chargeMaxC: number
  dischargeMinC: number
  dischargeMaxC: number
  /** Charge current limit as a fraction of capacity per hour (0.5 → 0.5C). [1/h] */
  maxChargeCRatePerH: number
  maxDischargeCRatePerH: number
  /** Pack mass per kWh of nominal energy. [kg/kWh] */
  massKgPerKWh: number
  specificHeatJPerKgK: number
  /** Heater pad power per Ah at 12.8 V-equivalent energy; 0 = no heater by default. [W/Ah] */
  heaterWPerAh12V: number
  heaterOnBelowC: number
  heaterOffAboveC: number
  bmsSelfConsumptionW: number
  cycleLifeCycles: number
  cycleLifeDodFraction: number
  /** Rough retail price per kWh nominal, in the user's currency. [currency/kWh] */
  pricePerKWh: number
}

/**
 * Presets by chemistry. Sources per value in the comments (REFERENCES.md §5.1 unless stated).
 */
export const CHEMISTRY_PRESETS: Readonly<Record<Chemistry, Readonly<ChemistryPreset>>> = {
  lfp: {
    cellNominalV: 3.2, // LiFePO4 nominal 3.2 V [M] Padhi et al. 1997 plateau; 4S = 12.8 V [CP]
    cellChargeV: 3.4, // bulk-phase average 13.6 V per 4S, below the 3.55–3.65 V absorption setpoint [CP]
    socFloorFraction: 0.1, // 90 % design depth of discharge [M] REFERENCES §5.1
    socCeilingFraction: 1, // common practice, no source
    roundTripEfficiencyFraction: 0.95, // 92–97 % [M] REFERENCES §5.1
    // Peukert is a lead-acid law; LFP delivers near its rating up to ~1C. Omar et al. 2013 (Energies 6:5625)
    // fit 1.02–1.07 for 0.2–2C [R abstract]; set it per pack to model that. Default 1: common practice, no source.
    peukertExponent: 1,
    ratedDischargeH: 20, // capacity quoted at C20 for comparison with lead-acid [CP]
    chargeTaperStartSocFraction: 1, // LFP accepts full current until the short CV phase [CP]
    chargeMinC: 0, // no charging below 0 °C: lithium plating, Petzl & Danzer 2014 [R abstract]
    chargeMaxC: 45, // 0–45 °C typical [M]/[CP]
    dischargeMinC: -20, // −20…60 °C typical [M]/[CP]
    dischargeMaxC: 60, // [M]/[CP]
    maxChargeCRatePerH: 0.5, // common practice, no source (typical BMS/cell datasheet 0.5C)
    maxDischargeCRatePerH: 1, // common practice, no source
    massKgPerKWh: 9, // 12.8 V drop-in packs 90–120 Wh/kg ≈ 0.11–0.13 kg/Ah [M]/[CP]
    specificHeatJPerKgK: 1100, // LFP c_p ≈ 1100–1130 J/(kg·K), Bazinski & Wang 2015 [R abstract]
    heaterWPerAh12V: 0.2, // pads 20–60 W per 100–300 Ah [CP]
    heaterOnBelowC: 3, // thermostat on a few degrees above freezing [CP]
    heaterOffAboveC: 6, // off a little above the on point [CP]
    bmsSelfConsumptionW: 0.5, // common practice, no source (BMS + shunt monitor)
    cycleLifeCycles: 3000, // 2000–6000 cycles at 80 % DoD [CP]
    cycleLifeDodFraction: 0.8, // [CP]
    pricePerKWh: 400, // common practice, no source (rough retail, user's currency)
  },
  agm: {
    cellNominalV: 2, // lead-acid 2.0 V/cell → 12 V (6 cells) [M]
    cellChargeV: 2.35, // bulk-phase average ~14.1 V per 12 V, below the 14.4–14.7 V absorb setpoint [CP]
    socFloorFraction: 0.5, // 50 % DoD for cycle life [CP] trade sizing worksheets
    socCeilingFraction: 1, // common practice, no source
    roundTripEfficiencyFraction: 0.85, // AGM ~85 % [M] REFERENCES §5.1
    peukertExponent: 1.15, // AGM 1.05–1.15 [M]/[CP]
    ratedDischargeH: 20, // C20 rating [CP]
    chargeTaperStartSocFraction: 0.8, // absorption phase from ~80 % SOC [CP]
    chargeMinC: -20, // −20…50 °C with temperature-compensated voltage [M]/[CP]
    chargeMaxC: 50, // [M]/[CP]
    dischargeMinC: -20, // [M]/[CP]
    dischargeMaxC: 50, // [M]/[CP]
    maxChargeCRatePerH: 0.2, // chargers 10–20 % of C for lead-acid [CP]
    maxDischargeCRatePerH: 1, // common practice, no source
    massKgPerKWh: 23, // 12 V 100 Ah ≈ 27–31 kg [M]/[CP]
    specificHeatJPerKgK: 800, // 700–900 J/(kg·K) [M]
    heaterWPerAh12V: 0, // lead-acid charges below 0 °C: no pad by default [CP]
    heaterOnBelowC: -10, // only used if the user adds a pad [CP]
    heaterOffAboveC: -5, // [CP]
    bmsSelfConsumptionW: 0.1, // monitor only, common practice, no source
    cycleLifeCycles: 600, // AGM ~500–800 at 50 % DoD [CP]
    cycleLifeDodFraction: 0.5, // [CP]
    pricePerKWh: 250, // common practice, no source
  },
  gel: {
    cellNominalV: 2, // [M]
    cellChargeV: 2.3, // bulk-phase average ~13.8 V per 12 V, below the ~14.1 V absorb setpoint [CP]
    socFloorFraction: 0.5, // [CP]
    socCeilingFraction: 1, // common practice, no source
    roundTripEfficiencyFraction: 0.85, // [M] REFERENCES §5.1 (80–85 %)
    peukertExponent: 1.2, // gel 1.1–1.25 [M]/[CP]
    ratedDischargeH: 20, // [CP]
    chargeTaperStartSocFraction: 0.8, // [CP]
    chargeMinC: -20, // [M]/[CP]
    chargeMaxC: 50, // [M]/[CP]
    dischargeMinC: -20, // [M]/[CP]
    dischargeMaxC: 50, // [M]/[CP]
    maxChargeCRatePerH: 0.15, // [CP]
    maxDischargeCRatePerH: 1, // common practice, no source
    massKgPerKWh: 25, // [CP]
    specificHeatJPerKgK: 800, // [M]
    heaterWPerAh12V: 0, // [CP]
    heaterOnBelowC: -10, // [CP]
    heaterOffAboveC: -5, // [CP]
    bmsSelfConsumptionW: 0.1, // common practice, no source
    cycleLifeCycles: 800, // common practice, no source
    cycleLifeDodFraction: 0.5, // [CP]
    pricePerKWh: 300, // common practice, no source
  },
  flooded: {
    cellNominalV: 2, // [M]
    cellChargeV: 2.35, // bulk-phase average ~14.1 V per 12 V, below the 14.4–14.8 V absorb setpoint [CP]
    socFloorFraction: 0.5, // [CP]
    socCeilingFraction: 1, // common practice, no source
    roundTripEfficiencyFraction: 0.8, // flooded ~80 % [M] REFERENCES §5.1
    peukertExponent: 1.25, // flooded 1.2–1.35 [M]/[CP]
    ratedDischargeH: 20, // [CP]
    chargeTaperStartSocFraction: 0.8, // [CP]
    chargeMinC: -20, // [M]/[CP]
    chargeMaxC: 50, // [M]/[CP]
    dischargeMinC: -20, // [M]/[CP]
    dischargeMaxC: 50, // [M]/[CP]
    maxChargeCRatePerH: 0.2, // [CP]
    maxDischargeCRatePerH: 1, // common practice, no source
    massKgPerKWh: 27, // [CP]
    specificHeatJPerKgK: 800, // [M]
    heaterWPerAh12V: 0, // [CP]
    heaterOnBelowC: -10, // [CP]
    heaterOffAboveC: -5, // [CP]
    bmsSelfConsumptionW: 0.1, // common practice, no source
    cycleLifeCycles: 1200, // deep-cycle flooded ~1000–1500 at 50 % DoD [CP]
    cycleLifeDodFraction: 0.5, // [CP]
    pricePerKWh: 150, // common practice, no source
  },
}

/** Plan-wide defaults for optional fields outside the battery. */
export const PLAN_DEFAULTS = {
  dutyCycleFraction: 1, // appliance runs at powerW while on, common practice, no source
  standbyW: 0,
  solarTiltDeg: 0, // flat roof
  solarLossesFraction: 0.14, // pvlib pvwatts_losses default stack = 14.08 % [R] REFERENCES §4
  solarTempCoeffPerC: -0.0037, // NREL current default "standard" module [R] REFERENCES §4
  solarNoctC: 49, // installed NOCT, fixed roof mount, Dobos 2014 / NREL [R] REFERENCES §4
  dcdcEfficiencyFraction: 0.92, // 90–97 % [CP]
  shoreEfficiencyFraction: 0.88, // 85–93 % [CP]
  generatorEfficiencyFraction: 0.88, // [CP]
  inverterEfficiencyFraction: 0.9, // 85–94 % at 20–100 % load [CP]
  inverterIdleFractionOfRated: 0.01, // idle ≈ 0.5–1.5 % of rating [CP]
  inverterSurgeFactor: 2, // common practice, no source
  groundAlbedoFraction: 0.2, // common practice, no source (grass/soil); snow ≈ 0.7
  drivingStartHour: 9, // common practice, no source
  generatorStartHour: 18, // common practice, no source
  enclosureAreaM2For20Kg: 0.5, // battery box example, REFERENCES §6.4 [C]
  enclosureThicknessM: 0.025, // 25 mm PIR, REFERENCES §6.4 [C]
  enclosureConductivityWPerMK: 0.025, // PIR gas-permeable facers 0.0245, ASHRAE HOF 2005 [R] REFERENCES §6.1
  skyClearnessIndex: { mixed: 0.45, overcast: 0.2 }, // mid-latitude monthly K̄T 0.3–0.65 [CP]; REFERENCES §3
} as const

// ---------------------------------------------------------------------------------------------
// Resolved plan: every optional field filled.
// ---------------------------------------------------------------------------------------------

export type ResolvedBattery = Required<Omit<BatteryBank, 'heater' | 'cellCapacityAh' | 'enclosure'>> & {
  enclosure: { areaM2: number; thicknessM: number; conductivityWPerMK: number }
  heater: Heater | null
}
export type ResolvedAppliance = Required<Omit<Appliance, 'usage'>>
export type ResolvedSolar = Required<SolarArray>
export type ResolvedInverter = Required<Omit<Inverter, 'onStartHour' | 'onEndHour'>> & {
  onStartHour: number
  onEndHour: number
}
export type ResolvedDayPlanEntry = Required<DayPlanEntry>
export type ResolvedTrip = Omit<Required<Trip>, 'dayPlan'> & {
  /** One entry per trip day. */
  dayPlan: ResolvedDayPlanEntry[]
}
export interface ResolvedPlan {
  name: string
  battery: ResolvedBattery
  appliances: ResolvedAppliance[]
  sources: {
    solar: ResolvedSolar[]
    dcdc: { id: string; name: string; currentA: number; efficiencyFraction: number }[]
    shore: { id: string; name: string; currentA: number; efficiencyFraction: number }[]
    generator: { id: string; name: string; currentA: number; efficiencyFraction: number; fuelLPerH: number }[]
  }
  inverter: ResolvedInverter | null
  trip: ResolvedTrip
}

/** Fill the battery bank's optional fields from its chemistry preset. */
export function resolveBattery(b: BatteryBank): ResolvedBattery {
  const p = CHEMISTRY_PRESETS[b.chemistry]
  const capacityAh = b.capacityAh ?? (b.cellCapacityAh ?? 0) * b.cellsParallel
  const nominalVoltageV = b.nominalVoltageV ?? b.cellsSeries * p.cellNominalV
  const energyKWh = (capacityAh * nominalVoltageV) / 1000
  const massKg = b.massKg ?? Math.max(0.1, energyKWh * p.massKgPerKWh)
  // Box area scales with volume^(2/3), anchored at 0.5 m² for 20 kg, common practice, no source.
  const areaM2 = PLAN_DEFAULTS.enclosureAreaM2For20Kg * Math.pow(massKg / 20, 2 / 3)
  const heaterW = p.heaterWPerAh12V * capacityAh * (nominalVoltageV / 12.8)
  const presetHeater =
    heaterW > 0 ? { powerW: heaterW, onBelowC: p.heaterOnBelowC, offAboveC: p.heaterOffAboveC } : null
  return {
    chemistry: b.chemistry,
    cellsSeries: b.cellsSeries,
    cellsParallel: b.cellsParallel,
    capacityAh,
    nominalVoltageV,
    chargeVoltageV: b.chargeVoltageV ?? b.cellsSeries * p.cellChargeV,
    chargeTaperStartSocFraction: b.chargeTaperStartSocFraction ?? p.chargeTaperStartSocFraction,
    socFloorFraction: b.socFloorFraction ?? p.socFloorFraction,
    socCeilingFraction: b.socCeilingFraction ?? p.socCeilingFraction,
    roundTripEfficiencyFraction: b.roundTripEfficiencyFraction ?? p.roundTripEfficiencyFraction,
    peukertExponent: b.peukertExponent ?? p.peukertExponent,
    ratedDischargeH: b.ratedDischargeH ?? p.ratedDischargeH,
    chargeMinC: b.chargeMinC ?? p.chargeMinC,
    chargeMaxC: b.chargeMaxC ?? p.chargeMaxC,
    dischargeMinC: b.dischargeMinC ?? p.dischargeMinC,
    dischargeMaxC: b.dischargeMaxC ?? p.dischargeMaxC,
    maxChargeCurrentA: b.maxChargeCurrentA ?? p.maxChargeCRatePerH * capacityAh,
    maxDischargeCurrentA: b.maxDischargeCurrentA ?? p.maxDischargeCRatePerH * capacityAh,
    massKg,
    specificHeatJPerKgK: b.specificHeatJPerKgK ?? p.specificHeatJPerKgK,
    enclosure: b.enclosure ?? {
      areaM2,
      thicknessM: PLAN_DEFAULTS.enclosureThicknessM,
      conductivityWPerMK: PLAN_DEFAULTS.enclosureConductivityWPerMK,
    },
    heater: b.heater === undefined ? presetHeater : b.heater,
    bmsSelfConsumptionW: b.bmsSelfConsumptionW ?? p.bmsSelfConsumptionW,
    cycleLifeCycles: b.cycleLifeCycles ?? p.cycleLifeCycles,
    cycleLifeDodFraction: b.cycleLifeDodFraction ?? p.cycleLifeDodFraction,
    pricePerKWh: b.pricePerKWh ?? p.pricePerKWh,
  }
}

/** Apply the scenario usage override and fill the appliance's defaults. */
export function resolveAppliance(a: Appliance): ResolvedAppliance {
  const u = a.usage ?? {}
  const enabled = u.enabled ?? true
  return {
    id: a.id,
    name: a.name,
    category: a.category,
    powerW: a.powerW,
    supply: a.supply,
    quantity: enabled ? (u.quantity ?? a.quantity) : 0,
    dutyCycleFraction: u.dutyCycleFraction ?? a.dutyCycleFraction ?? PLAN_DEFAULTS.dutyCycleFraction,
    standbyW: a.standbyW ?? PLAN_DEFAULTS.standbyW,
    hoursPerDay: u.hoursPerDay ?? a.hoursPerDay,
    startHour: u.startHour ?? a.startHour,
    endHour: u.endHour ?? a.endHour,
  }
}

function resolveSolar(s: SolarArray, latitudeDeg: number): ResolvedSolar {
  return {
    ...s,
    tiltDeg: s.tiltDeg ?? PLAN_DEFAULTS.solarTiltDeg,
    // Facing the equator by default (matters only when tilted).
    azimuthDeg: s.azimuthDeg ?? (latitudeDeg >= 0 ? 180 : 0),
    lossesFraction: s.lossesFraction ?? PLAN_DEFAULTS.solarLossesFraction,
    tempCoeffPerC: s.tempCoeffPerC ?? PLAN_DEFAULTS.solarTempCoeffPerC,
    noctC: s.noctC ?? PLAN_DEFAULTS.solarNoctC,
  }
}

function resolveInverter(inv: Inverter): ResolvedInverter {
  return {
    ratedW: inv.ratedW,
    surgeW: inv.surgeW ?? inv.ratedW * PLAN_DEFAULTS.inverterSurgeFactor,
    efficiencyFraction: inv.efficiencyFraction ?? PLAN_DEFAULTS.inverterEfficiencyFraction,
    idleW: inv.idleW ?? inv.ratedW * PLAN_DEFAULTS.inverterIdleFractionOfRated,
    alwaysOn: inv.alwaysOn,
    onStartHour: inv.onStartHour ?? 0,
    onEndHour: inv.onEndHour ?? 0,
  }
}

function resolveDayPlanEntry(d: DayPlanEntry): ResolvedDayPlanEntry {
  return {
    drivingHours: d.drivingHours,
    drivingStartHour: d.drivingStartHour ?? PLAN_DEFAULTS.drivingStartHour,
    hookup: d.hookup,
    generatorHours: d.generatorHours ?? 0,
    generatorStartHour: d.generatorStartHour ?? PLAN_DEFAULTS.generatorStartHour,
  }
}

/** ISO weekday of a calendar date, Monday = 0 … Sunday = 6. */
function weekdayMonday0(isoDate: string, dayOffset: number): number {
  const [y, m, d] = isoDate.split('-').map(Number) as [number, number, number]
  const sunday0 = new Date(Date.UTC(y, m - 1, d + dayOffset)).getUTCDay()
  return (sunday0 + 6) % 7
}

function resolveTrip(t: Trip): ResolvedTrip {
  const dayPlan: ResolvedDayPlanEntry[] = []
  for (let day = 0; day < t.days; day++) {
    const entry =
      t.dayPlan.kind === 'week' ? t.dayPlan.days[weekdayMonday0(t.startDate, day)] : t.dayPlan.days[day]
    dayPlan.push(resolveDayPlanEntry(entry!))
  }
  const clearness =
    t.sky === 'custom'
      ? (t.clearnessIndexFraction ?? 0.5)
      : t.sky === 'clear'
        ? 1
        : PLAN_DEFAULTS.skyClearnessIndex[t.sky]
  return {
    startDate: t.startDate,
    days: t.days,
    latitudeDeg: t.latitudeDeg,
    longitudeDeg: t.longitudeDeg,
    timeZone: t.timeZone,
    sky: t.sky,
    clearnessIndexFraction: clearness,
    nightLowC: t.nightLowC,
    dayHighC: t.dayHighC,
    startSocFraction: t.startSocFraction,
    groundAlbedoFraction: t.groundAlbedoFraction ?? PLAN_DEFAULTS.groundAlbedoFraction,
    dayPlan,
  }
}

/**
 * Fill every optional field of a validated plan from the chemistry preset and `PLAN_DEFAULTS`,
 * apply the scenario usage overrides, and expand the day plan to one entry per trip day.
 * For `sky: 'clear'` the resolved clearnessIndexFraction is 1 (meaning: the clear-sky model as is).
 */
export function fillPlanDefaults(plan: Plan): ResolvedPlan {
  const sources: ResolvedPlan['sources'] = { solar: [], dcdc: [], shore: [], generator: [] }
  for (const s of plan.sources) {
    if (s.kind === 'solar') sources.solar.push(resolveSolar(s, plan.trip.latitudeDeg))
    else if (s.kind === 'dcdc')
      sources.dcdc.push({
        id: s.id,
        name: s.name,
        currentA: s.currentA,
        efficiencyFraction: s.efficiencyFraction ?? PLAN_DEFAULTS.dcdcEfficiencyFraction,
      })
    else if (s.kind === 'shore')
      sources.shore.push({
        id: s.id,
        name: s.name,
        currentA: s.currentA,
        efficiencyFraction: s.efficiencyFraction ?? PLAN_DEFAULTS.shoreEfficiencyFraction,
      })
    else
      sources.generator.push({
        id: s.id,
        name: s.name,
        currentA: s.currentA,
        efficiencyFraction: s.efficiencyFraction ?? PLAN_DEFAULTS.generatorEfficiencyFraction,
        fuelLPerH: s.fuelLPerH ?? 0,
      })
  }
  return {
    name: plan.name ?? '',
    battery: resolveBattery(plan.battery),
    appliances: plan.appliances.map(resolveAppliance),
    sources,
    inverter: plan.inverter ? resolveInverter(plan.inverter) : null,
    trip: resolveTrip(plan.trip),
  }
}
