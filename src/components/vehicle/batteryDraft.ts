/**
 * The battery form's working copy: every optional field is `null` while the preset applies.
 * `presetFill()` gives the values a chemistry preset puts in the form (they stay editable);
 * capacity-dependent defaults (currents, mass, heater power) stay empty and show the computed value.
 */
import { CHEMISTRY_PRESETS, resolveBattery } from '@shared/engine/presets'
import type { BatteryBank, Chemistry } from '@shared/schemas/plan'

export interface BatteryDraft {
  chemistry: Chemistry
  cellsSeries: number
  cellsParallel: number
  cellCapacityAh: number | null
  socFloorFraction: number | null
  socCeilingFraction: number | null
  roundTripEfficiencyFraction: number | null
  peukertExponent: number | null
  chargeMinC: number | null
  chargeMaxC: number | null
  dischargeMinC: number | null
  dischargeMaxC: number | null
  maxChargeCurrentA: number | null
  maxDischargeCurrentA: number | null
  massKg: number | null
  bmsSelfConsumptionW: number | null
  heaterOn: boolean
  heaterPowerW: number | null
  heaterOnBelowC: number | null
  heaterOffAboveC: number | null
}

export const CHEMISTRY_LABELS: Record<Chemistry, string> = {
  lfp: 'Lithium iron phosphate (LFP, LiFePO4)',
  agm: 'AGM lead-acid',
  gel: 'Gel lead-acid',
  flooded: 'Flooded lead-acid',
}

/** Fields a chemistry preset fills in. */
export function presetFill(chemistry: Chemistry) {
  const p = CHEMISTRY_PRESETS[chemistry]
  return {
    socFloorFraction: p.socFloorFraction,
    socCeilingFraction: p.socCeilingFraction,
    roundTripEfficiencyFraction: p.roundTripEfficiencyFraction,
    peukertExponent: p.peukertExponent,
    chargeMinC: p.chargeMinC,
    chargeMaxC: p.chargeMaxC,
    dischargeMinC: p.dischargeMinC,
    dischargeMaxC: p.dischargeMaxC,
    bmsSelfConsumptionW: p.bmsSelfConsumptionW,
    heaterOn: p.heaterWPerAh12V > 0,
    heaterOnBelowC: p.heaterOnBelowC,
    heaterOffAboveC: p.heaterOffAboveC,
  }
}

/** A new bank: 4 × 280 Ah LFP cells, 12.8 V (an invented, typical van build). */
export function newBatteryDraft(chemistry: Chemistry = 'lfp'): BatteryDraft {
  const lead = chemistry !== 'lfp'
  return {
    chemistry,
    cellsSeries: lead ? 6 : 4,
    cellsParallel: 1,
    cellCapacityAh: lead ? 100 : 280,
    maxChargeCurrentA: null,
    maxDischargeCurrentA: null,
    massKg: null,
    heaterPowerW: null,
    ...presetFill(chemistry),
  }
}

export function draftFromBank(b: BatteryBank): BatteryDraft {
  const cellCapacityAh =
    b.cellCapacityAh ?? (b.capacityAh !== undefined ? b.capacityAh / b.cellsParallel : null)
  const fill = presetFill(b.chemistry)
  return {
    chemistry: b.chemistry,
    cellsSeries: b.cellsSeries,
    cellsParallel: b.cellsParallel,
    cellCapacityAh,
    socFloorFraction: b.socFloorFraction ?? fill.socFloorFraction,
    socCeilingFraction: b.socCeilingFraction ?? fill.socCeilingFraction,
    roundTripEfficiencyFraction: b.roundTripEfficiencyFraction ?? fill.roundTripEfficiencyFraction,
    peukertExponent: b.peukertExponent ?? fill.peukertExponent,
    chargeMinC: b.chargeMinC ?? fill.chargeMinC,
    chargeMaxC: b.chargeMaxC ?? fill.chargeMaxC,
    dischargeMinC: b.dischargeMinC ?? fill.dischargeMinC,
    dischargeMaxC: b.dischargeMaxC ?? fill.dischargeMaxC,
    maxChargeCurrentA: b.maxChargeCurrentA ?? null,
    maxDischargeCurrentA: b.maxDischargeCurrentA ?? null,
    massKg: b.massKg ?? null,
    bmsSelfConsumptionW: b.bmsSelfConsumptionW ?? fill.bmsSelfConsumptionW,
    heaterOn: b.heater === undefined ? fill.heaterOn : b.heater !== null,
    heaterPowerW: b.heater?.powerW ?? null,
    heaterOnBelowC: b.heater?.onBelowC ?? fill.heaterOnBelowC,
    heaterOffAboveC: b.heater?.offAboveC ?? fill.heaterOffAboveC,
  }
}

/**
 * Stored fields the form does not show (a plan file or the API can set them). Saving the form keeps them;
 * the chemistry-specific ones are dropped when the chemistry changes (an LFP price or cycle life is wrong for
 * AGM), and an explicit nominal voltage when the cells in series change. The box (enclosure) always stays.
 */
const KEPT_ALWAYS = ['enclosure'] as const
const KEPT_SAME_CHEMISTRY = [
  'chargeVoltageV',
  'chargeTaperStartSocFraction',
  'ratedDischargeH',
  'specificHeatJPerKgK',
  'cycleLifeCycles',
  'cycleLifeDodFraction',
  'pricePerKWh',
] as const

/**
 * The bank as stored: nulls dropped (the preset applies), capacity computed from the cells. `stored` is the
 * bank the form was opened on: what the form does not show is carried over from it, never silently dropped.
 */
export function bankFromDraft(d: BatteryDraft, stored: BatteryBank | null = null): BatteryBank {
  const bank: BatteryBank = {
    chemistry: d.chemistry,
    cellsSeries: d.cellsSeries,
    cellsParallel: d.cellsParallel,
  } as BatteryBank
  if (stored) {
    const keep = (k: keyof BatteryBank) => {
      if (stored[k] !== undefined) (bank as Record<string, unknown>)[k] = structuredClone(stored[k])
    }
    KEPT_ALWAYS.forEach(keep)
    if (stored.chemistry === d.chemistry) {
      KEPT_SAME_CHEMISTRY.forEach(keep)
      if (stored.cellsSeries === d.cellsSeries) keep('nominalVoltageV')
    }
  }
  if (d.cellCapacityAh !== null) {
    bank.cellCapacityAh = d.cellCapacityAh
    bank.capacityAh = d.cellCapacityAh * d.cellsParallel
  }
  const optional = [
    'socFloorFraction',
    'socCeilingFraction',
    'roundTripEfficiencyFraction',
    'peukertExponent',
    'chargeMinC',
    'chargeMaxC',
    'dischargeMinC',
    'dischargeMaxC',
    'maxChargeCurrentA',
    'maxDischargeCurrentA',
    'massKg',
    'bmsSelfConsumptionW',
  ] as const
  for (const k of optional) {
    const v = d[k]
    if (v !== null) bank[k] = v
  }
  if (!d.heaterOn) bank.heater = null
  else {
    const resolvedW = resolveBattery({ ...bank, heater: undefined }).heater?.powerW
    bank.heater = {
      powerW: d.heaterPowerW ?? Math.round(resolvedW ?? 20),
      onBelowC: d.heaterOnBelowC ?? 3,
      offAboveC: d.heaterOffAboveC ?? 6,
    }
  }
  return bank
}

/** What the preset would compute for fields left empty (for placeholders). */
export function computedDefaults(d: BatteryDraft) {
  const bank = bankFromDraft({ ...d, heaterOn: false })
  if (bank.capacityAh === undefined) return null
  const r = resolveBattery({ ...bank, heater: undefined })
  return {
    nominalVoltageV: r.nominalVoltageV,
    capacityAh: r.capacityAh,
    energyWh: r.nominalVoltageV * r.capacityAh,
    maxChargeCurrentA: r.maxChargeCurrentA,
    maxDischargeCurrentA: r.maxDischargeCurrentA,
    massKg: r.massKg,
    heaterPowerW: r.heater?.powerW ?? 20,
  }
}
