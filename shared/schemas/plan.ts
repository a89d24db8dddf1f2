/**
 * The plan: everything the engine needs to simulate one trip, as plain JSON.
 *
 * A plan is a vehicle's equipment (battery bank, appliance inventory, charge sources, inverter)
 * combined with one scenario (the trip, and per-appliance usage for that trip). Storage keeps the
 * two apart; `ApplianceSchema.usage` is where a scenario's override lands when they are combined.
 *
 * Units are SI and sit in every numeric field name (`powerW`, `capacityAh`, `tiltDeg`, `nightLowC`,
 * `socFloorFraction`). The canonical list of names and units is `shared/engine/GLOSSARY.md`;
 * the file format is described for people in `docs/plan-format.md`.
 *
 * Optional battery fields are filled from the chemistry preset by `fillPlanDefaults()`
 * (`shared/engine/presets.ts`); optional fields elsewhere have their defaults listed in `PLAN_DEFAULTS`.
 */
import { z } from 'zod'

export const PLAN_FORMAT_VERSION = 1

export const CHEMISTRIES = ['lfp', 'agm', 'gel', 'flooded'] as const
export type Chemistry = (typeof CHEMISTRIES)[number]

export const APPLIANCE_CATEGORIES = [
  'fridge',
  'lighting',
  'cooking',
  'heating',
  'electronics',
  'water',
  'ventilation',
  'other',
] as const
export type ApplianceCategory = (typeof APPLIANCE_CATEGORIES)[number]

export const SKY_KINDS = ['clear', 'mixed', 'overcast', 'custom'] as const
export type SkyKind = (typeof SKY_KINDS)[number]

/** Numeric limits shared by the schema and by form hints. */
export const PLAN_LIMITS = {
  tripDaysMax: 366,
  appliancesMax: 200,
  sourcesMax: 40,
  powerWMax: 100_000,
  currentAMax: 2_000,
  capacityAhMax: 100_000,
  cellsMax: 1_000,
  temperatureCMin: -60,
  temperatureCMax: 80,
} as const

const requiredOr = (what: string) => (iss: { input?: unknown }) =>
  iss.input === undefined ? 'is required' : what
const finite = () =>
  z.number({ error: requiredOr('must be a number') }).refine(Number.isFinite, 'must be a finite number')
const fraction = () => finite().min(0, 'must be between 0 and 1').max(1, 'must be between 0 and 1')
const positive = (max: number) => finite().gt(0, 'must be greater than 0').max(max, `must be at most ${max}`)
const nonNegative = (max: number) => finite().min(0, 'must be 0 or more').max(max, `must be at most ${max}`)
const temperatureC = () =>
  finite()
    .min(PLAN_LIMITS.temperatureCMin, `must be at least ${PLAN_LIMITS.temperatureCMin} °C`)
    .max(PLAN_LIMITS.temperatureCMax, `must be at most ${PLAN_LIMITS.temperatureCMax} °C`)
/** Hour of the local clock, 0 ≤ h ≤ 24 (24 = midnight at the end of the day). */
const hourOfDay = () => finite().min(0, 'must be between 0 and 24').max(24, 'must be between 0 and 24')
const hoursPerDay = () => finite().min(0, 'must be between 0 and 24').max(24, 'must be between 0 and 24')
const id = () =>
  z
    .string({ error: requiredOr('must be text') })
    .min(1, 'must not be empty')
    .max(100, 'must be at most 100 characters')
const label = () => z.string({ error: requiredOr('must be text') }).max(200, 'must be at most 200 characters')

// ---------------------------------------------------------------------------------------------
// Battery bank
// ---------------------------------------------------------------------------------------------

export const EnclosureSchema = z.strictObject({
  /** Outer surface area of the insulated box around the cells. [m²] */
  areaM2: positive(20),
  /** Insulation thickness. 0 = bare cells (film coefficients only). [m] */
  thicknessM: nonNegative(0.5),
  /** Insulation thermal conductivity, e.g. PIR 0.022–0.025, XPS 0.029, EPS 0.035. [W/(m·K)] */
  conductivityWPerMK: positive(10),
})

export const HeaterSchema = z
  .strictObject({
    /** Heater pad electrical power while on (drawn from the pack). [W] */
    powerW: nonNegative(2_000),
    /** Thermostat switches on when the pack is below this. [°C] */
    onBelowC: temperatureC(),
    /** Thermostat switches off when the pack is above this. [°C] */
    offAboveC: temperatureC(),
  })
  .superRefine((h, ctx) => {
    if (h.offAboveC <= h.onBelowC) {
      ctx.addIssue({ code: 'custom', path: ['offAboveC'], message: 'must be above onBelowC (hysteresis)' })
    }
  })

export const BatteryBankSchema = z
  .strictObject({
    chemistry: z.enum(CHEMISTRIES, { error: requiredOr('must be one of lfp, agm, gel, flooded') }),
    /** Cells (or 2 V lead-acid cells / 12 V blocks counted as their cells) in series. */
    cellsSeries: z
      .number({ error: requiredOr('must be a number') })
      .int('must be a whole number')
      .min(1, 'must be at least 1')
      .max(PLAN_LIMITS.cellsMax),
    /** Parallel strings. */
    cellsParallel: z
      .number({ error: requiredOr('must be a number') })
      .int('must be a whole number')
      .min(1, 'must be at least 1')
      .max(PLAN_LIMITS.cellsMax),
    /** Capacity of one cell (one string). Give this or `capacityAh`. [Ah] */
    cellCapacityAh: positive(PLAN_LIMITS.capacityAhMax).optional(),
    /** Capacity of the whole bank (= cellCapacityAh × cellsParallel). Wins over cellCapacityAh. [Ah] */
    capacityAh: positive(PLAN_LIMITS.capacityAhMax).optional(),
    /** Default: cellsSeries × the chemistry's cell voltage. [V] */
    nominalVoltageV: positive(1_000).optional(),
    /** Charging voltage used to turn charger currents into power. Default from the chemistry. [V] */
    chargeVoltageV: positive(1_200).optional(),
    /** Lead-acid charge acceptance tapers linearly to zero from this SOC to the ceiling (1 = no taper). [0–1] */
    chargeTaperStartSocFraction: fraction().optional(),
    /** Lowest allowed state of charge; loads below it are shed. [0–1] */
    socFloorFraction: fraction().optional(),
    /** Highest state of charge the charge sources fill to. [0–1] */
    socCeilingFraction: fraction().optional(),
    /** Energy out ÷ energy in over a full cycle. [0–1] */
    roundTripEfficiencyFraction: fraction().optional(),
    /** Peukert exponent k (1 = none). */
    peukertExponent: finite()
      .min(1, 'must be between 1 and 1.6')
      .max(1.6, 'must be between 1 and 1.6')
      .optional(),
    /** Discharge time at which capacityAh is rated (C20 → 20). [h] */
    ratedDischargeH: positive(1_000).optional(),
    chargeMinC: temperatureC().optional(),
    chargeMaxC: temperatureC().optional(),
    dischargeMinC: temperatureC().optional(),
    dischargeMaxC: temperatureC().optional(),
    /** BMS / charger limit on charge current into the pack. [A] */
    maxChargeCurrentA: positive(PLAN_LIMITS.currentAMax).optional(),
    /** BMS limit on discharge current. [A] */
    maxDischargeCurrentA: positive(PLAN_LIMITS.currentAMax).optional(),
    /** Mass of the cells (for the thermal model and the chemistry comparison). [kg] */
    massKg: positive(10_000).optional(),
    specificHeatJPerKgK: positive(10_000).optional(),
    enclosure: EnclosureSchema.optional(),
    /** null = no heater. Omitted = the preset (LFP: a pad; lead-acid: none). */
    heater: HeaterSchema.nullable().optional(),
    /** Constant draw of the battery-management system and monitor. [W] */
    bmsSelfConsumptionW: nonNegative(200).optional(),
    /** Cycles to end of life at `cycleLifeDodFraction`. */
    cycleLifeCycles: positive(100_000).optional(),
    cycleLifeDodFraction: fraction().optional(),
    /** Price of the bank per kWh of nominal capacity, in the user's currency. [currency/kWh] */
    pricePerKWh: nonNegative(1_000_000).optional(),
  })
  .superRefine((b, ctx) => {
    if (b.capacityAh === undefined && b.cellCapacityAh === undefined) {
      ctx.addIssue({ code: 'custom', path: ['capacityAh'], message: 'give capacityAh or cellCapacityAh' })
    }
    if (b.socFloorFraction !== undefined && b.socCeilingFraction !== undefined) {
      if (b.socCeilingFraction <= b.socFloorFraction) {
        ctx.addIssue({
          code: 'custom',
          path: ['socCeilingFraction'],
          message: 'must be above socFloorFraction',
        })
      }
    }
    if (b.chargeMinC !== undefined && b.chargeMaxC !== undefined && b.chargeMaxC <= b.chargeMinC) {
      ctx.addIssue({ code: 'custom', path: ['chargeMaxC'], message: 'must be above chargeMinC' })
    }
    if (
      b.dischargeMinC !== undefined &&
      b.dischargeMaxC !== undefined &&
      b.dischargeMaxC <= b.dischargeMinC
    ) {
      ctx.addIssue({ code: 'custom', path: ['dischargeMaxC'], message: 'must be above dischargeMinC' })
    }
  })

// ---------------------------------------------------------------------------------------------
// Appliances
// ---------------------------------------------------------------------------------------------

/** A scenario's override of one appliance's usual use. Omitted fields keep the inventory's value. */
export const ApplianceUsageSchema = z.strictObject({
  /** false = not used on this trip. */
  enabled: z.boolean({ error: requiredOr('must be true or false') }).optional(),
  quantity: z
    .number({ error: requiredOr('must be a number') })
    .int('must be a whole number')
    .min(0, 'must be 0 or more')
    .max(1_000)
    .optional(),
  hoursPerDay: hoursPerDay().optional(),
  dutyCycleFraction: fraction().optional(),
  startHour: hourOfDay().optional(),
  endHour: hourOfDay().optional(),
})

export const ApplianceSchema = z.strictObject({
  id: id(),
  name: label(),
  category: z.enum(APPLIANCE_CATEGORIES, {
    error: requiredOr(`must be one of ${APPLIANCE_CATEGORIES.join(', ')}`),
  }),
  /** Power while running. [W] */
  powerW: nonNegative(PLAN_LIMITS.powerWMax),
  /** 'dc' runs from the pack directly; 'ac' runs through the inverter. */
  supply: z.enum(['dc', 'ac'], { error: requiredOr('must be dc or ac') }),
  quantity: z
    .number({ error: requiredOr('must be a number') })
    .int('must be a whole number')
    .min(0, 'must be 0 or more')
    .max(1_000),
  /** Share of its on-time it actually draws powerW (a fridge compressor cycling). Default 1. [0–1] */
  dutyCycleFraction: fraction().optional(),
  /** Draw while off. Default 0. [W] */
  standbyW: nonNegative(PLAN_LIMITS.powerWMax).optional(),
  /** Hours per day it is on, spread evenly over its window. [h] */
  hoursPerDay: hoursPerDay(),
  /** Window start on the local clock; a window may wrap midnight (startHour 20, endHour 2). [h] */
  startHour: hourOfDay(),
  /** Window end on the local clock; equal to startHour means the whole day. [h] */
  endHour: hourOfDay(),
  /** This scenario's override (filled in when a scenario is combined with the inventory). */
  usage: ApplianceUsageSchema.optional(),
})

// ---------------------------------------------------------------------------------------------
// Charge sources
// ---------------------------------------------------------------------------------------------

export const SolarArraySchema = z.strictObject({
  kind: z.literal('solar'),
  id: id(),
  name: label(),
  /** Nameplate power at STC (1000 W/m², 25 °C). [Wp] */
  peakPowerWp: nonNegative(100_000),
  /** Panel tilt from horizontal; 0 = flat roof. [°] */
  tiltDeg: finite().min(0, 'must be between 0 and 90').max(90, 'must be between 0 and 90').optional(),
  /** Direction the panel faces, from north clockwise: 90 east, 180 south, 270 west. [°] */
  azimuthDeg: finite().min(0, 'must be between 0 and 360').max(360, 'must be between 0 and 360').optional(),
  controller: z.enum(['mppt', 'pwm'], { error: requiredOr('must be mppt or pwm') }),
  /** Controller output current limit at the pack. [A] */
  maxCurrentA: positive(PLAN_LIMITS.currentAMax),
  /** System losses (soiling, wiring, mismatch) before the controller. Default 0.14. [0–1] */
  lossesFraction: fraction().optional(),
  /** Power temperature coefficient γ, e.g. −0.0037. [1/°C] */
  tempCoeffPerC: finite()
    .min(-0.02, 'must be between -0.02 and 0')
    .max(0, 'must be between -0.02 and 0')
    .optional(),
  /** Nominal operating cell temperature (800 W/m², 20 °C air). [°C] */
  noctC: finite().min(20, 'must be between 20 and 80').max(80, 'must be between 20 and 80').optional(),
})

export const DcDcChargerSchema = z.strictObject({
  kind: z.literal('dcdc'),
  id: id(),
  name: label(),
  /** Output current into the pack while the engine runs. [A] */
  currentA: positive(PLAN_LIMITS.currentAMax),
  /** Output ÷ input power (for the alternator-side energy). Default 0.92. [0–1] */
  efficiencyFraction: fraction().optional(),
})

export const ShoreChargerSchema = z.strictObject({
  kind: z.literal('shore'),
  id: id(),
  name: label(),
  /** Output current into the pack while hooked up. [A] */
  currentA: positive(PLAN_LIMITS.currentAMax),
  /** Default 0.88. [0–1] */
  efficiencyFraction: fraction().optional(),
})

export const GeneratorChargerSchema = z.strictObject({
  kind: z.literal('generator'),
  id: id(),
  name: label(),
  /** Output current into the pack while the generator runs. [A] */
  currentA: positive(PLAN_LIMITS.currentAMax),
  /** Default 0.88. [0–1] */
  efficiencyFraction: fraction().optional(),
  /** Fuel the generator burns while running (reported only). [L/h] */
  fuelLPerH: nonNegative(100).optional(),
})

export const ChargeSourceSchema = z.discriminatedUnion(
  'kind',
  [SolarArraySchema, DcDcChargerSchema, ShoreChargerSchema, GeneratorChargerSchema],
  { error: 'kind must be one of solar, dcdc, shore, generator' },
)

// ---------------------------------------------------------------------------------------------
// Inverter
// ---------------------------------------------------------------------------------------------

export const InverterSchema = z.strictObject({
  /** Continuous AC output rating; AC demand above it is shed (counted as unserved). [W] */
  ratedW: positive(PLAN_LIMITS.powerWMax),
  /** Short-term surge rating (reported, not simulated at hourly steps). [W] */
  surgeW: positive(PLAN_LIMITS.powerWMax).optional(),
  /** AC out ÷ DC in. Default 0.90. [0–1] */
  efficiencyFraction: fraction().optional(),
  /** No-load draw while switched on. [W] */
  idleW: nonNegative(500).optional(),
  /** true = on all day. false = on in its window and in any hour with AC load. */
  alwaysOn: z.boolean({ error: requiredOr('must be true or false') }),
  onStartHour: hourOfDay().optional(),
  onEndHour: hourOfDay().optional(),
})

// ---------------------------------------------------------------------------------------------
// Trip
// ---------------------------------------------------------------------------------------------

export const DayPlanEntrySchema = z.strictObject({
  /** Engine running with the DC-DC charger working. [h] */
  drivingHours: hoursPerDay(),
  /** Local hour driving starts. Default 9. [h] */
  drivingStartHour: hourOfDay().optional(),
  /** Plugged into shore power all day. */
  hookup: z.boolean({ error: requiredOr('must be true or false') }),
  /** Generator running. [h] */
  generatorHours: hoursPerDay().optional(),
  /** Local hour the generator starts. Default 18. [h] */
  generatorStartHour: hourOfDay().optional(),
})

export const DayPlanSchema = z.discriminatedUnion(
  'kind',
  [
    /** Seven entries, Monday to Sunday, repeated over the trip by the local weekday. */
    z.strictObject({
      kind: z.literal('week'),
      days: z.array(DayPlanEntrySchema).length(7, 'must have 7 entries, Monday to Sunday'),
    }),
    /** One entry per trip day, in order. */
    z.strictObject({
      kind: z.literal('days'),
      days: z.array(DayPlanEntrySchema).min(1).max(PLAN_LIMITS.tripDaysMax),
    }),
  ],
  { error: 'kind must be week or days' },
)

/** Length of a local-clock window that may wrap midnight; start = end means the whole day. [h] */
export function windowLengthH(startHour: number, endHour: number): number {
  const len = (((endHour - startHour) % 24) + 24) % 24
  return len === 0 ? 24 : len
}

const knownTimeZones = new Set<string>()

export function isValidTimeZone(name: string): boolean {
  if (knownTimeZones.has(name)) return true
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: name })
    knownTimeZones.add(name)
    return true
  } catch {
    return false
  }
}

function isRealDate(iso: string): boolean {
  const [y, m, d] = iso.split('-').map(Number) as [number, number, number]
  const t = new Date(Date.UTC(y, m - 1, d))
  return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d
}

export const TripSchema = z
  .strictObject({
    /** First day of the trip on the local calendar, YYYY-MM-DD. */
    startDate: z
      .string({ error: requiredOr('must be text') })
      .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date like 2026-01-15')
      .refine(isRealDate, 'is not a real calendar date'),
    days: z
      .number()
      .int('must be a whole number')
      .min(1, 'must be between 1 and 366')
      .max(PLAN_LIMITS.tripDaysMax, 'must be between 1 and 366'),
    latitudeDeg: finite().min(-90, 'must be between -90 and 90').max(90, 'must be between -90 and 90'),
    longitudeDeg: finite().min(-180, 'must be between -180 and 180').max(180, 'must be between -180 and 180'),
    /** IANA time zone name, e.g. Europe/Oslo. */
    timeZone: z
      .string({ error: requiredOr('must be text') })
      .refine(isValidTimeZone, 'is not a known IANA time zone name (e.g. Europe/Oslo)'),
    sky: z.enum(SKY_KINDS, { error: requiredOr('must be one of clear, mixed, overcast, custom') }),
    /** Daily clearness index (GHI ÷ extraterrestrial horizontal); required when sky is custom. [0–1] */
    clearnessIndexFraction: fraction().optional(),
    /** Coldest hour, near sunrise. [°C] */
    nightLowC: temperatureC(),
    /** Warmest hour, mid-afternoon. [°C] */
    dayHighC: temperatureC(),
    /** State of charge at the start of the first day. [0–1] */
    startSocFraction: fraction(),
    /** Ground reflectance for tilted panels. Default 0.2 (snow ≈ 0.7). [0–1] */
    groundAlbedoFraction: fraction().optional(),
    dayPlan: DayPlanSchema,
  })
  .superRefine((t, ctx) => {
    if (t.dayHighC < t.nightLowC) {
      ctx.addIssue({ code: 'custom', path: ['dayHighC'], message: 'must not be below nightLowC' })
    }
    if (t.sky === 'custom' && t.clearnessIndexFraction === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['clearnessIndexFraction'],
        message: 'is required when sky is custom',
      })
    }
    if (t.dayPlan.kind === 'days' && t.dayPlan.days.length !== t.days) {
      ctx.addIssue({
        code: 'custom',
        path: ['dayPlan', 'days'],
        message: `must have one entry per trip day (${t.days}), has ${t.dayPlan.days.length}`,
      })
    }
  })

// ---------------------------------------------------------------------------------------------
// Plan
// ---------------------------------------------------------------------------------------------

export const PlanSchema = z
  .strictObject({
    formatVersion: z.literal(PLAN_FORMAT_VERSION, { error: `must be ${PLAN_FORMAT_VERSION}` }).optional(),
    name: label().optional(),
    battery: BatteryBankSchema,
    appliances: z.array(ApplianceSchema).max(PLAN_LIMITS.appliancesMax),
    sources: z.array(ChargeSourceSchema).max(PLAN_LIMITS.sourcesMax),
    /** null or omitted = no inverter (then no AC appliances). */
    inverter: InverterSchema.nullable().optional(),
    trip: TripSchema,
  })
  .superRefine((p, ctx) => {
    const seen = new Set<string>()
    p.appliances.forEach((a, i) => {
      if (seen.has(a.id))
        ctx.addIssue({ code: 'custom', path: ['appliances', i, 'id'], message: `duplicate id ${a.id}` })
      seen.add(a.id)
      const start = a.usage?.startHour ?? a.startHour
      const end = a.usage?.endHour ?? a.endHour
      const hours = a.usage?.hoursPerDay ?? a.hoursPerDay
      if (hours > windowLengthH(start, end) + 1e-9) {
        ctx.addIssue({
          code: 'custom',
          path: ['appliances', i, a.usage?.hoursPerDay !== undefined ? 'usage' : 'hoursPerDay'],
          message: `${hours} h does not fit in the window ${start}–${end} (${windowLengthH(start, end)} h)`,
        })
      }
      if (a.supply === 'ac' && !p.inverter && (a.usage?.enabled ?? true)) {
        ctx.addIssue({
          code: 'custom',
          path: ['appliances', i, 'supply'],
          message: 'is ac but the plan has no inverter',
        })
      }
    })
    const seenSource = new Set<string>()
    p.sources.forEach((s, i) => {
      if (seenSource.has(s.id))
        ctx.addIssue({ code: 'custom', path: ['sources', i, 'id'], message: `duplicate id ${s.id}` })
      seenSource.add(s.id)
    })
  })

export type Plan = z.infer<typeof PlanSchema>
export type PlanInput = z.input<typeof PlanSchema>
export type BatteryBank = z.infer<typeof BatteryBankSchema>
export type Enclosure = z.infer<typeof EnclosureSchema>
export type Heater = z.infer<typeof HeaterSchema>
export type Appliance = z.infer<typeof ApplianceSchema>
export type ApplianceUsage = z.infer<typeof ApplianceUsageSchema>
export type ChargeSource = z.infer<typeof ChargeSourceSchema>
export type SolarArray = z.infer<typeof SolarArraySchema>
export type DcDcCharger = z.infer<typeof DcDcChargerSchema>
export type ShoreCharger = z.infer<typeof ShoreChargerSchema>
export type GeneratorCharger = z.infer<typeof GeneratorChargerSchema>
export type Inverter = z.infer<typeof InverterSchema>
export type Trip = z.infer<typeof TripSchema>
export type DayPlan = z.infer<typeof DayPlanSchema>
export type DayPlanEntry = z.infer<typeof DayPlanEntrySchema>

/** Field errors keyed by dotted path (`battery.capacityAh`, `appliances.2.powerW`). */
export type PlanFieldErrors = Record<string, string[]>

export type ParsePlanResult = { ok: true; plan: Plan } | { ok: false; fields: PlanFieldErrors }

/**
 * Validate unknown input (parsed JSON) as a plan. Never throws.
 * Errors are keyed by the dotted path of the offending field; '(root)' for the whole document.
 */
export function parsePlan(input: unknown): ParsePlanResult {
  const result = PlanSchema.safeParse(input)
  if (result.success) return { ok: true, plan: result.data }
  const fields: PlanFieldErrors = {}
  const add = (path: readonly PropertyKey[], message: string) => {
    const key = path.length > 0 ? path.map(String).join('.') : '(root)'
    ;(fields[key] ??= []).push(message)
  }
  for (const issue of result.error.issues) {
    if (issue.code === 'unrecognized_keys') {
      // Name the unknown field itself, not its parent: a typo (`powerWatts`) should point at itself.
      for (const key of issue.keys) add([...issue.path, key], 'is not a known field')
    } else if (issue.code === 'invalid_type' && issue.message.endsWith('received undefined')) {
      add(issue.path, 'is required')
    } else {
      add(issue.path, issue.message)
    }
  }
  return { ok: false, fields }
}

/**
 * Combine an appliance inventory with a scenario's usage overrides (keyed by appliance id).
 * Returns new appliance objects; unknown ids in `usageById` are ignored.
 */
export function applyScenarioUsage(
  appliances: readonly Appliance[],
  usageById: Readonly<Record<string, ApplianceUsage>>,
): Appliance[] {
  return appliances.map((a) => {
    const usage = usageById[a.id]
    return usage ? { ...a, usage: { ...a.usage, ...usage } } : { ...a }
  })
}
