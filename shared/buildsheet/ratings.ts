/**
 * Currents the plan produces and the ratings the disconnect devices and fuses need.
 * Energy balance only (I = P / V); the margin rule is in fuses.ts.
 */
import type { Chemistry } from '../schemas/plan.ts'
import type { ResolvedPlan } from '../engine/presets.ts'
import { rateDevice, type DeviceRating } from './fuses.ts'
import type { ProtectionThresholds } from './protection.ts'

/**
 * Short-time (a few seconds) discharge a pack gives, as a multiple of its continuous limit.
 * Common practice, no source (typical BMS short-time ratings; lead-acid blocks deliver more but sag).
 */
export const PACK_BURST_FACTOR: Readonly<Record<Chemistry, number>> = { lfp: 2, agm: 3, gel: 2, flooded: 3 }

export interface SourceCurrent {
  id: string
  name: string
  kind: 'solar' | 'dcdc' | 'shore' | 'generator'
  /** Output current into the pack (solar: the controller's output limit). [A] */
  currentA: number
}

export interface LoadCurrent {
  id: string
  name: string
  /** powerW × quantity ÷ nominal pack voltage. [A] */
  currentA: number
  powerW: number
  category: string
}

export interface BranchFuse extends DeviceRating {
  id: string
  label: string
}

export interface Ratings {
  nominalVoltageV: number
  /** The lowest pack voltage the inverter still runs at (inverter-off cell voltage × cells). [V] */
  lowVoltageV: number
  sources: SourceCurrent[]
  /** All charge sources at full output at once. [A] */
  totalChargeA: number
  /** The most the pack may take (protection setting, from the plan). [A] */
  chargeLimitA: number
  dcLoads: LoadCurrent[]
  dcLoadA: number
  heaterA: number
  inverter: {
    ratedW: number
    surgeW: number
    efficiencyFraction: number
    continuousA: number
    surgeA: number
  } | null
  /** DC loads + heater + inverter at its rating. [A] */
  maxLoadA: number
  /** DC loads + heater + inverter surge. [A] */
  maxSurgeA: number
  pack: {
    capacityAh: number
    continuousA: number
    continuousC: number
    burstA: number
    burstC: number
    burstFactor: number
    maxChargeC: number
  }
  chargeDisconnect: DeviceRating
  loadDisconnect: DeviceRating & { surgeA: number }
  mainFuse: DeviceRating
  branchFuses: BranchFuse[]
  /** Plain-words problems: currents the pack or its settings cannot take. */
  warnings: string[]
}

const round1 = (x: number) => Math.round(x * 10) / 10

/** Currents and device ratings from a resolved plan and the resolved protection thresholds. */
export function computeRatings(plan: ResolvedPlan, t: ProtectionThresholds): Ratings {
  const b = plan.battery
  const v = b.nominalVoltageV
  const lowVoltageV = t.cellInverterOffV.value * b.cellsSeries
  const sources: SourceCurrent[] = [
    ...plan.sources.solar.map((s) => ({
      id: s.id,
      name: s.name,
      kind: 'solar' as const,
      currentA: s.maxCurrentA,
    })),
    ...plan.sources.dcdc.map((s) => ({
      id: s.id,
      name: s.name,
      kind: 'dcdc' as const,
      currentA: s.currentA,
    })),
    ...plan.sources.shore.map((s) => ({
      id: s.id,
      name: s.name,
      kind: 'shore' as const,
      currentA: s.currentA,
    })),
    ...plan.sources.generator.map((s) => ({
      id: s.id,
      name: s.name,
      kind: 'generator' as const,
      currentA: s.currentA,
    })),
  ]
  const totalChargeA = sources.reduce((sum, s) => sum + s.currentA, 0)
  const dcLoads: LoadCurrent[] = plan.appliances
    .filter((a) => a.supply === 'dc' && a.quantity > 0 && a.powerW > 0)
    .map((a) => ({
      id: a.id,
      name: a.name,
      powerW: a.powerW * a.quantity,
      currentA: (a.powerW * a.quantity) / v,
      category: a.category,
    }))
  const dcLoadA = dcLoads.reduce((sum, l) => sum + l.currentA, 0)
  const heaterA = b.heater ? b.heater.powerW / v : 0
  const inv = plan.inverter
  const inverter = inv
    ? {
        ratedW: inv.ratedW,
        surgeW: inv.surgeW,
        efficiencyFraction: inv.efficiencyFraction,
        continuousA: inv.ratedW / (inv.efficiencyFraction * lowVoltageV),
        surgeA: inv.surgeW / (inv.efficiencyFraction * lowVoltageV),
      }
    : null
  const maxLoadA = dcLoadA + heaterA + (inverter?.continuousA ?? 0)
  const maxSurgeA = dcLoadA + heaterA + (inverter?.surgeA ?? 0)
  const burstFactor = PACK_BURST_FACTOR[b.chemistry]
  const continuousA = b.maxDischargeCurrentA
  const pack = {
    capacityAh: b.capacityAh,
    continuousA,
    continuousC: continuousA / b.capacityAh,
    burstA: continuousA * burstFactor,
    burstC: (continuousA * burstFactor) / b.capacityAh,
    burstFactor,
    maxChargeC: t.maxChargeCurrentA.value / b.capacityAh,
  }
  const chargeLimitA = t.maxChargeCurrentA.value
  const warnings: string[] = []
  if (totalChargeA > chargeLimitA + 1e-9)
    warnings.push(
      `All chargers together can push ${round1(totalChargeA)} A, more than the ${round1(chargeLimitA)} A the pack may take: limit the chargers' currents or let the BMS ask them to slow down.`,
    )
  if (maxLoadA > continuousA + 1e-9)
    warnings.push(
      `Everything on at once draws ${round1(maxLoadA)} A, more than the pack's ${round1(continuousA)} A continuous limit.`,
    )
  if (maxSurgeA > pack.burstA + 1e-9)
    warnings.push(
      `With the inverter's surge the draw reaches ${round1(maxSurgeA)} A, more than the pack's ${round1(pack.burstA)} A short-time limit.`,
    )

  const branchFuses: BranchFuse[] = [
    ...sources.map((s) => ({
      id: `fuse:source:${s.id}`,
      label: `${s.name} (charger output)`,
      ...rateDevice(s.currentA),
    })),
  ]
  if (inverter)
    branchFuses.push({ id: 'fuse:inverter', label: 'Inverter', ...rateDevice(inverter.continuousA) })
  if (dcLoads.length > 0)
    branchFuses.push({ id: 'fuse:dc-panel', label: 'DC fuse panel feed', ...rateDevice(dcLoadA) })
  if (b.heater) branchFuses.push({ id: 'fuse:heater', label: 'Heater pad', ...rateDevice(heaterA) })
  for (const l of dcLoads)
    branchFuses.push({
      id: `fuse:load:${l.id}`,
      label: `${l.name} (at the DC panel)`,
      ...rateDevice(l.currentA),
    })

  for (const f of branchFuses)
    if (f.ratingA === null) warnings.push(`No standard fuse is large enough for ${f.label}.`)

  return {
    nominalVoltageV: v,
    lowVoltageV,
    sources,
    totalChargeA,
    chargeLimitA,
    dcLoads,
    dcLoadA,
    heaterA,
    inverter,
    maxLoadA,
    maxSurgeA,
    pack,
    chargeDisconnect: rateDevice(totalChargeA),
    loadDisconnect: { ...rateDevice(maxLoadA), surgeA: maxSurgeA },
    mainFuse: rateDevice(Math.max(totalChargeA, maxLoadA)),
    branchFuses,
    warnings,
  }
}
