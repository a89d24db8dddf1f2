/**
 * Protection rules derived from the plan's battery bank: which condition opens the charge path, which opens
 * the load path, which turns the inverter off through its remote input, when the heater pad switches, and
 * the charger settings. Every threshold has a default with its source, and every one can be overridden
 * per vehicle (the override is then named as "your setting").
 */
import type { Chemistry } from '../schemas/plan.ts'
import type { ResolvedBattery } from '../engine/presets.ts'

/** Thresholds a user can override. Cell values are per cell; pack values are derived (× cells in series). */
export const PROTECTION_KEYS = [
  'chargeMinC',
  'chargeMaxC',
  'dischargeMinC',
  'dischargeMaxC',
  'temperatureHysteresisK',
  'cellChargeCutoffV',
  'cellChargeReconnectV',
  'cellLoadCutoffV',
  'cellLoadReconnectV',
  'cellInverterOffV',
  'socInverterOffFraction',
  'heaterOnBelowC',
  'heaterOffAboveC',
  'cellAbsorptionV',
  'cellFloatV',
  'tempCompensationMVPerKPerCell',
  'maxChargeCurrentA',
] as const
export type ProtectionKey = (typeof PROTECTION_KEYS)[number]
export type ProtectionOverrides = Partial<Record<ProtectionKey, number>>

export interface ThresholdValue {
  value: number
  unit: string
  /** Where the value comes from: the plan, a source, `common practice, no source`, or `your setting`. */
  source: string
  overridden: boolean
}
export type ProtectionThresholds = Record<ProtectionKey, ThresholdValue>

export const PROTECTION_LABELS: Readonly<Record<ProtectionKey, string>> = {
  chargeMinC: 'No charging below',
  chargeMaxC: 'No charging above',
  dischargeMinC: 'No discharging below',
  dischargeMaxC: 'No discharging above',
  temperatureHysteresisK: 'Temperature reconnect margin',
  cellChargeCutoffV: 'Cell too full (charge path opens)',
  cellChargeReconnectV: 'Charge path closes again below',
  cellLoadCutoffV: 'Cell too empty (load path opens)',
  cellLoadReconnectV: 'Load path closes again above',
  cellInverterOffV: 'Inverter off below (cell)',
  socInverterOffFraction: 'Inverter off below (state of charge)',
  heaterOnBelowC: 'Heater pad on below',
  heaterOffAboveC: 'Heater pad off above',
  cellAbsorptionV: 'Charger absorption voltage (per cell)',
  cellFloatV: 'Charger float voltage (per cell)',
  tempCompensationMVPerKPerCell: 'Charger temperature compensation',
  maxChargeCurrentA: 'Most charge current, all chargers together',
}

export const PROTECTION_UNITS: Readonly<Record<ProtectionKey, string>> = {
  chargeMinC: '°C',
  chargeMaxC: '°C',
  dischargeMinC: '°C',
  dischargeMaxC: '°C',
  temperatureHysteresisK: 'K',
  cellChargeCutoffV: 'V',
  cellChargeReconnectV: 'V',
  cellLoadCutoffV: 'V',
  cellLoadReconnectV: 'V',
  cellInverterOffV: 'V',
  socInverterOffFraction: '',
  heaterOnBelowC: '°C',
  heaterOffAboveC: '°C',
  cellAbsorptionV: 'V',
  cellFloatV: 'V',
  tempCompensationMVPerKPerCell: 'mV/K per cell',
  maxChargeCurrentA: 'A',
}

const CP = 'common practice, no source'

interface CellDefaults {
  cellChargeCutoffV: [number, string]
  cellChargeReconnectV: [number, string]
  cellLoadCutoffV: [number, string]
  cellLoadReconnectV: [number, string]
  cellInverterOffV: [number, string]
  cellAbsorptionV: [number, string]
  cellFloatV: [number, string]
  tempCompensationMVPerKPerCell: [number, string]
  temperatureHysteresisK: [number, string]
}

/** Per-chemistry cell thresholds with their sources (shared/REFERENCES.md §5.1 unless stated). */
export const CELL_DEFAULTS: Readonly<Record<Chemistry, Readonly<CellDefaults>>> = {
  lfp: {
    cellChargeCutoffV: [3.65, 'LFP upper cell limit 3.65 V, from memory (REFERENCES §5.1 [M])'],
    cellChargeReconnectV: [3.4, CP],
    cellLoadCutoffV: [2.8, `${CP} (kept above the 2.5 V cell limit, REFERENCES §5.1 [M])`],
    cellLoadReconnectV: [3.1, CP],
    cellInverterOffV: [2.9, `${CP} (inverter off before the load path opens under load)`],
    cellAbsorptionV: [3.55, 'LFP absorption 14.2–14.6 V per 4 cells (REFERENCES §5.1 [CP])'],
    cellFloatV: [3.375, 'float 13.4–13.6 V per 4 cells or none (REFERENCES §5.1 [CP])'],
    tempCompensationMVPerKPerCell: [0, 'LFP: no temperature compensation (REFERENCES §5.1 [CP])'],
    temperatureHysteresisK: [3, CP],
  },
  agm: {
    cellChargeCutoffV: [2.5, `${CP} (15.0 V per 12 V block)`],
    cellChargeReconnectV: [2.3, CP],
    cellLoadCutoffV: [
      1.95,
      `${CP} (11.7 V per 12 V block under light load; 10.5 V is empty, REFERENCES §5.1 [M])`,
    ],
    cellLoadReconnectV: [2.1, CP],
    cellInverterOffV: [1.98, CP],
    cellAbsorptionV: [2.45, 'AGM absorption 14.4–14.7 V (REFERENCES §5.1 [CP])'],
    cellFloatV: [2.267, 'AGM float 13.5–13.8 V (REFERENCES §5.1 [CP])'],
    tempCompensationMVPerKPerCell: [-4, 'lead-acid −3 to −5 mV/K per cell (REFERENCES §5.1 [CP])'],
    temperatureHysteresisK: [3, CP],
  },
  gel: {
    cellChargeCutoffV: [2.45, `${CP} (14.7 V per 12 V block)`],
    cellChargeReconnectV: [2.3, CP],
    cellLoadCutoffV: [1.95, `${CP} (11.7 V per 12 V block under light load)`],
    cellLoadReconnectV: [2.1, CP],
    cellInverterOffV: [1.98, CP],
    cellAbsorptionV: [2.35, `${CP} (gel absorption about 14.1 V)`],
    cellFloatV: [2.3, `${CP} (gel float about 13.8 V)`],
    tempCompensationMVPerKPerCell: [-4, 'lead-acid −3 to −5 mV/K per cell (REFERENCES §5.1 [CP])'],
    temperatureHysteresisK: [3, CP],
  },
  flooded: {
    cellChargeCutoffV: [2.6, `${CP} (15.6 V per 12 V block, above equalisation)`],
    cellChargeReconnectV: [2.3, CP],
    cellLoadCutoffV: [1.95, `${CP} (11.7 V per 12 V block under light load)`],
    cellLoadReconnectV: [2.1, CP],
    cellInverterOffV: [1.98, CP],
    cellAbsorptionV: [2.45, 'flooded absorption 14.4–14.8 V (REFERENCES §5.1 [CP])'],
    cellFloatV: [2.2, 'flooded float 13.2–13.5 V (REFERENCES §5.1 [CP])'],
    tempCompensationMVPerKPerCell: [-4, 'lead-acid −3 to −5 mV/K per cell (REFERENCES §5.1 [CP])'],
    temperatureHysteresisK: [3, CP],
  },
}

const FROM_PLAN = 'from the battery bank (plan)'

/** Defaults: the plan's own battery values where it has them, the chemistry's cell defaults otherwise. */
export function defaultThresholds(b: ResolvedBattery): Record<ProtectionKey, [number, string]> {
  const cell = CELL_DEFAULTS[b.chemistry]
  const heater = b.heater
  return {
    chargeMinC: [b.chargeMinC, FROM_PLAN],
    chargeMaxC: [b.chargeMaxC, FROM_PLAN],
    dischargeMinC: [b.dischargeMinC, FROM_PLAN],
    dischargeMaxC: [b.dischargeMaxC, FROM_PLAN],
    temperatureHysteresisK: cell.temperatureHysteresisK,
    cellChargeCutoffV: cell.cellChargeCutoffV,
    cellChargeReconnectV: cell.cellChargeReconnectV,
    cellLoadCutoffV: cell.cellLoadCutoffV,
    cellLoadReconnectV: cell.cellLoadReconnectV,
    cellInverterOffV: cell.cellInverterOffV,
    socInverterOffFraction: [b.socFloorFraction, `${FROM_PLAN}: the state-of-charge floor`],
    heaterOnBelowC: heater
      ? [heater.onBelowC, `${FROM_PLAN}: heater pad`]
      : [NaN, 'no heater pad in the plan'],
    heaterOffAboveC: heater
      ? [heater.offAboveC, `${FROM_PLAN}: heater pad`]
      : [NaN, 'no heater pad in the plan'],
    // Not the plan's chargeVoltageV: the engine uses that as a bulk-phase average for power, not a setpoint.
    cellAbsorptionV: cell.cellAbsorptionV,
    cellFloatV: cell.cellFloatV,
    tempCompensationMVPerKPerCell: cell.tempCompensationMVPerKPerCell,
    maxChargeCurrentA: [b.maxChargeCurrentA, `${FROM_PLAN}: most charge current`],
  }
}

/** Defaults merged with the vehicle's overrides. Non-finite overrides are ignored. */
export function resolveThresholds(
  b: ResolvedBattery,
  overrides: ProtectionOverrides = {},
): ProtectionThresholds {
  const defaults = defaultThresholds(b)
  const out = {} as ProtectionThresholds
  for (const key of PROTECTION_KEYS) {
    const o = overrides[key]
    const [value, source] = defaults[key]
    const overridden = typeof o === 'number' && Number.isFinite(o)
    out[key] = {
      value: overridden ? o : value,
      unit: PROTECTION_UNITS[key],
      source: overridden ? 'your setting' : source,
      overridden,
    }
  }
  return out
}

/**
 * Checks that the thresholds make sense together. Returns messages keyed by the threshold to fix.
 * (A reconnect point on the wrong side of its cut-off would make a relay chatter or never release.)
 */
export function checkThresholds(
  t: ProtectionThresholds,
  hasHeater: boolean,
): Partial<Record<ProtectionKey, string>> {
  const v = (k: ProtectionKey) => t[k].value
  const issues: Partial<Record<ProtectionKey, string>> = {}
  if (v('chargeMaxC') <= v('chargeMinC')) issues.chargeMaxC = 'must be above "no charging below"'
  if (v('dischargeMaxC') <= v('dischargeMinC')) issues.dischargeMaxC = 'must be above "no discharging below"'
  if (v('temperatureHysteresisK') < 0) issues.temperatureHysteresisK = 'must be 0 or more'
  if (v('cellChargeReconnectV') >= v('cellChargeCutoffV'))
    issues.cellChargeReconnectV = 'must be below the "cell too full" voltage'
  if (v('cellLoadReconnectV') <= v('cellLoadCutoffV'))
    issues.cellLoadReconnectV = 'must be above the "cell too empty" voltage'
  if (v('cellInverterOffV') < v('cellLoadCutoffV'))
    issues.cellInverterOffV =
      'must be at or above the "cell too empty" voltage, so the inverter goes off first'
  if (v('cellLoadCutoffV') >= v('cellChargeCutoffV'))
    issues.cellLoadCutoffV = 'must be below the "cell too full" voltage'
  if (v('cellAbsorptionV') >= v('cellChargeCutoffV'))
    issues.cellAbsorptionV =
      'must be below the "cell too full" voltage, or the charge path opens on every charge'
  if (v('cellFloatV') > v('cellAbsorptionV')) issues.cellFloatV = 'must not be above the absorption voltage'
  if (v('socInverterOffFraction') < 0 || v('socInverterOffFraction') > 1)
    issues.socInverterOffFraction = 'must be between 0 and 1'
  if (v('maxChargeCurrentA') <= 0) issues.maxChargeCurrentA = 'must be greater than 0'
  if (hasHeater) {
    if (!Number.isFinite(v('heaterOnBelowC'))) issues.heaterOnBelowC = 'is required'
    if (!(v('heaterOffAboveC') > v('heaterOnBelowC')))
      issues.heaterOffAboveC = 'must be above "heater pad on below"'
  }
  return issues
}

export type RuleAction = 'charge-path-opens' | 'load-path-opens' | 'inverter-off' | 'heater-on' | 'heater-off'

export interface ProtectionRule {
  /** Stable id, used for checklist ticks. */
  id: string
  action: RuleAction
  /** Plain words: "Any cell below 0 °C". */
  condition: string
  /** Plain words: "closes again above 3 °C". */
  release: string
  /** The thresholds this rule reads. */
  keys: ProtectionKey[]
  /** Who acts: BMS, battery monitor relay, thermostat. */
  device: string
}

export interface ChargerSetting {
  id: string
  label: string
  value: string
  keys: ProtectionKey[]
}

export interface ProtectionPlan {
  chemistry: Chemistry
  cellsSeries: number
  thresholds: ProtectionThresholds
  rules: ProtectionRule[]
  chargerSettings: ChargerSetting[]
  issues: Partial<Record<ProtectionKey, string>>
}

/** Rounded for reading, with a true minus sign (−20 °C), as the design asks. */
const fmt = (x: number, digits = 2) =>
  Number.isFinite(x) ? String(Number(x.toFixed(digits))).replace(/^-/, '−') : '—'

/** The rules and charger settings for a battery bank and the vehicle's overrides. */
export function protectionRules(b: ResolvedBattery, overrides: ProtectionOverrides = {}): ProtectionPlan {
  const t = resolveThresholds(b, overrides)
  const v = (k: ProtectionKey) => t[k].value
  const n = b.cellsSeries
  const hyst = v('temperatureHysteresisK')
  const pack = (cellV: number) => `${fmt(cellV, 3)} V per cell (${fmt(cellV * n, 2)} V pack)`
  const lithium = b.chemistry === 'lfp'
  const monitor = lithium ? 'BMS' : 'battery monitor relay'
  const rules: ProtectionRule[] = [
    {
      id: 'charge-too-cold',
      action: 'charge-path-opens',
      condition: `Any cell colder than ${fmt(v('chargeMinC'), 1)} °C`,
      release: `closes again above ${fmt(v('chargeMinC') + hyst, 1)} °C`,
      keys: ['chargeMinC', 'temperatureHysteresisK'],
      device: monitor,
    },
    {
      id: 'charge-too-hot',
      action: 'charge-path-opens',
      condition: `Any cell hotter than ${fmt(v('chargeMaxC'), 1)} °C`,
      release: `closes again below ${fmt(v('chargeMaxC') - hyst, 1)} °C`,
      keys: ['chargeMaxC', 'temperatureHysteresisK'],
      device: monitor,
    },
    {
      id: 'charge-too-full',
      action: 'charge-path-opens',
      condition: `Any cell above ${pack(v('cellChargeCutoffV'))}`,
      release: `closes again when every cell is below ${pack(v('cellChargeReconnectV'))}`,
      keys: ['cellChargeCutoffV', 'cellChargeReconnectV'],
      device: monitor,
    },
    {
      id: 'load-too-cold',
      action: 'load-path-opens',
      condition: `Any cell colder than ${fmt(v('dischargeMinC'), 1)} °C`,
      release: `closes again above ${fmt(v('dischargeMinC') + hyst, 1)} °C`,
      keys: ['dischargeMinC', 'temperatureHysteresisK'],
      device: monitor,
    },
    {
      id: 'load-too-hot',
      action: 'load-path-opens',
      condition: `Any cell hotter than ${fmt(v('dischargeMaxC'), 1)} °C`,
      release: `closes again below ${fmt(v('dischargeMaxC') - hyst, 1)} °C`,
      keys: ['dischargeMaxC', 'temperatureHysteresisK'],
      device: monitor,
    },
    {
      id: 'load-too-empty',
      action: 'load-path-opens',
      condition: `Any cell below ${pack(v('cellLoadCutoffV'))}`,
      release: `closes again when every cell is above ${pack(v('cellLoadReconnectV'))}`,
      keys: ['cellLoadCutoffV', 'cellLoadReconnectV'],
      device: monitor,
    },
    {
      id: 'inverter-low-cell',
      action: 'inverter-off',
      condition: `Any cell below ${pack(v('cellInverterOffV'))}`,
      release: `back on when every cell is above ${pack(v('cellLoadReconnectV'))}`,
      keys: ['cellInverterOffV', 'cellLoadReconnectV'],
      device: `${monitor} → inverter remote on/off input`,
    },
    {
      id: 'inverter-low-soc',
      action: 'inverter-off',
      condition: `State of charge below ${fmt(v('socInverterOffFraction') * 100, 0)} %`,
      release: `back on above ${fmt(Math.min(1, v('socInverterOffFraction') + 0.05) * 100, 0)} %`,
      keys: ['socInverterOffFraction'],
      device: 'battery monitor relay → inverter remote on/off input',
    },
    {
      id: 'inverter-before-load-path',
      action: 'inverter-off',
      condition: 'Whenever the load path is about to open (any load-path condition above)',
      release: 'back on after the load path has closed again',
      keys: [],
      device: `${monitor} → inverter remote on/off input`,
    },
  ]
  if (b.heater) {
    rules.push(
      {
        id: 'heater-on',
        action: 'heater-on',
        condition: `Pack colder than ${fmt(v('heaterOnBelowC'), 1)} °C`,
        release: `stays on until ${fmt(v('heaterOffAboveC'), 1)} °C`,
        keys: ['heaterOnBelowC'],
        device: `thermostat or ${monitor} relay → heater pad (${fmt(b.heater.powerW, 0)} W)`,
      },
      {
        id: 'heater-off',
        action: 'heater-off',
        condition: `Pack warmer than ${fmt(v('heaterOffAboveC'), 1)} °C`,
        release: `on again below ${fmt(v('heaterOnBelowC'), 1)} °C`,
        keys: ['heaterOffAboveC'],
        device: `thermostat or ${monitor} relay → heater pad`,
      },
    )
  }
  const comp = v('tempCompensationMVPerKPerCell')
  const chargerSettings: ChargerSetting[] = [
    {
      id: 'charger-absorption',
      label: 'Absorption (bulk) voltage',
      value: pack(v('cellAbsorptionV')),
      keys: ['cellAbsorptionV'],
    },
    {
      id: 'charger-float',
      label: lithium ? 'Float voltage (or float off)' : 'Float voltage',
      value: pack(v('cellFloatV')),
      keys: ['cellFloatV'],
    },
    {
      id: 'charger-temp-comp',
      label: 'Temperature compensation',
      value:
        comp === 0
          ? 'off'
          : `${fmt(comp, 1)} mV/K per cell (${fmt(comp * n, 1)} mV/K pack), referenced to 25 °C`,
      keys: ['tempCompensationMVPerKPerCell'],
    },
    {
      id: 'charger-current',
      label: 'Most charge current, all chargers together',
      value: `${fmt(v('maxChargeCurrentA'), 1)} A`,
      keys: ['maxChargeCurrentA'],
    },
  ]
  if (lithium) {
    chargerSettings.push({
      id: 'charger-no-equalise',
      label: 'Equalisation',
      value: 'off (never equalise lithium cells)',
      keys: [],
    })
  }
  return {
    chemistry: b.chemistry,
    cellsSeries: n,
    thresholds: t,
    rules,
    chargerSettings,
    issues: checkThresholds(t, b.heater !== null),
  }
}
