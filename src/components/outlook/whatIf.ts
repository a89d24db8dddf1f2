/**
 * "Try a change": the five live controls and how they rewrite a plan. Pure, so the page, the worker and
 * the tests apply a change the same way. Only the controls the user moved are applied.
 */
import type { BatteryBank, Plan, SolarArray } from '@shared/schemas/plan'
import { PLAN_LIMITS, SKY_KINDS } from '@shared/schemas/plan'
import { resolveBattery } from '@shared/engine/presets'

export type Sky = (typeof SKY_KINDS)[number]

export interface WhatIf {
  /** Pack capacity. [Ah] */
  capacityAh?: number
  /** Total solar array, all arrays scaled together. [Wp] */
  arrayWp?: number
  /** Driving each day of the trip (the DC-DC charger runs). [h] */
  drivingHoursPerDay?: number
  /** Night low; the day high keeps its distance above it. [°C] */
  nightLowC?: number
  sky?: Sky
}

export interface WhatIfBase {
  capacityAh: number
  arrayWp: number
  drivingHoursPerDay: number
  nightLowC: number
  sky: Sky
  hasSolar: boolean
  hasDcDc: boolean
  nominalVoltageV: number
}

/** Cell voltage by chemistry for a fresh array's controller current (LFP 3.2 V, lead-acid 2 V). [V] */
const CELL_V: Record<Plan['battery']['chemistry'], number> = { lfp: 3.2, agm: 2, gel: 2, flooded: 2 }

export function planCapacityAh(plan: Plan): number {
  const b = plan.battery
  return b.capacityAh ?? (b.cellCapacityAh ?? 0) * b.cellsParallel
}

/** The controls' starting values, read from the stored plan. */
export function whatIfBase(plan: Plan): WhatIfBase {
  const solar = plan.sources.filter((s): s is SolarArray => s.kind === 'solar')
  const days = plan.trip.dayPlan.days
  const driving = days.reduce((s, d) => s + d.drivingHours, 0) / Math.max(1, days.length)
  return {
    capacityAh: planCapacityAh(plan),
    arrayWp: solar.reduce((s, a) => s + a.peakPowerWp, 0),
    drivingHoursPerDay: Math.round(driving * 10) / 10,
    nightLowC: plan.trip.nightLowC,
    sky: plan.trip.sky,
    hasSolar: solar.length > 0,
    hasDcDc: plan.sources.some((s) => s.kind === 'dcdc'),
    nominalVoltageV:
      plan.battery.nominalVoltageV ?? plan.battery.cellsSeries * CELL_V[plan.battery.chemistry],
  }
}

/** True when any control differs from the stored plan. */
export function isChanged(w: WhatIf, base: WhatIfBase): boolean {
  return (
    (w.capacityAh !== undefined && w.capacityAh !== base.capacityAh) ||
    (w.arrayWp !== undefined && w.arrayWp !== base.arrayWp) ||
    (w.drivingHoursPerDay !== undefined && w.drivingHoursPerDay !== base.drivingHoursPerDay) ||
    (w.nightLowC !== undefined && w.nightLowC !== base.nightLowC) ||
    (w.sky !== undefined && w.sky !== base.sky)
  )
}

/** True when the change touches the vehicle's equipment (pack or array), not only the trip. */
export function changesEquipment(w: WhatIf, base: WhatIfBase): boolean {
  return (
    (w.capacityAh !== undefined && w.capacityAh !== base.capacityAh) ||
    (w.arrayWp !== undefined && w.arrayWp !== base.arrayWp)
  )
}

/**
 * The stored pack at another capacity, scaled exactly as the engine's own pack search scales it
 * (shared/engine/battery/run.ts): mass and both current limits in proportion to capacity, the insulated box's
 * area with capacity^(2/3) (a box of the same shape around a larger volume), the heater pad as it is. Every
 * one is written out, so a default that follows capacity (the preset's pad, say) does not grow on its own:
 * then Pack needed is the same whatever capacity is tried. Clamped at the plan format's limits, so a tried
 * pack can always be saved (only packs of thousands of Ah reach them).
 */
export function scaledPack(battery: BatteryBank, capacityAh: number): Partial<BatteryBank> {
  const r = resolveBattery(battery)
  const scale = capacityAh / r.capacityAh
  const amps = (a: number) => Math.min(PLAN_LIMITS.currentAMax, a * scale)
  return {
    capacityAh,
    massKg: Math.min(10_000, r.massKg * scale),
    maxChargeCurrentA: amps(r.maxChargeCurrentA),
    maxDischargeCurrentA: amps(r.maxDischargeCurrentA),
    enclosure: { ...r.enclosure, areaM2: Math.min(20, r.enclosure.areaM2 * Math.cbrt(scale * scale)) },
    heater: r.heater,
  }
}

/** A new plan with the change applied (the input is not modified). */
export function applyWhatIf(plan: Plan, w: WhatIf): Plan {
  const p: Plan = structuredClone(plan)
  const base = whatIfBase(plan)
  if (w.capacityAh !== undefined && w.capacityAh !== base.capacityAh && w.capacityAh > 0) {
    const { cellCapacityAh: _drop, ...battery } = p.battery
    void _drop
    p.battery = { ...battery, ...scaledPack(plan.battery, w.capacityAh) }
  }
  if (w.arrayWp !== undefined && w.arrayWp !== base.arrayWp) {
    if (base.hasSolar && base.arrayWp > 0) {
      const scale = w.arrayWp / base.arrayWp
      p.sources = p.sources.map((s) =>
        s.kind === 'solar'
          ? { ...s, peakPowerWp: s.peakPowerWp * scale, maxCurrentA: Math.max(1, s.maxCurrentA * scale) }
          : s,
      )
    } else if (w.arrayWp > 0) {
      const existing = p.sources.filter((s) => s.kind === 'solar')
      const others = p.sources.filter((s) => s.kind !== 'solar')
      void existing
      p.sources = [
        ...others,
        {
          kind: 'solar',
          id: 'try-a-change-array',
          name: 'Flat roof array (tried)',
          peakPowerWp: w.arrayWp,
          tiltDeg: 0,
          azimuthDeg: 180,
          controller: 'mppt',
          // Controller sized at 1.25 × the array's current at the pack's nominal voltage (common practice, no source).
          maxCurrentA: Math.ceil((w.arrayWp / base.nominalVoltageV) * 1.25),
        },
      ]
    }
  }
  if (w.drivingHoursPerDay !== undefined && w.drivingHoursPerDay !== base.drivingHoursPerDay) {
    const hours = Math.min(24, Math.max(0, w.drivingHoursPerDay))
    p.trip.dayPlan = {
      ...p.trip.dayPlan,
      days: p.trip.dayPlan.days.map((d) => ({ ...d, drivingHours: hours })),
    } as Plan['trip']['dayPlan']
  }
  if (w.nightLowC !== undefined && w.nightLowC !== base.nightLowC) {
    const swing = plan.trip.dayHighC - plan.trip.nightLowC
    p.trip.nightLowC = w.nightLowC
    p.trip.dayHighC = Math.min(80, w.nightLowC + swing)
  }
  if (w.sky !== undefined && w.sky !== base.sky) {
    p.trip.sky = w.sky
    if (w.sky === 'custom' && p.trip.clearnessIndexFraction === undefined) p.trip.clearnessIndexFraction = 0.5
  }
  return p
}

/** A short name for a saved what-if: "Winter week · 300 Ah, 2 h driving". */
export function whatIfLabel(w: WhatIf, base: WhatIfBase, fmtTemp: (c: number) => string): string {
  const parts: string[] = []
  if (w.capacityAh !== undefined && w.capacityAh !== base.capacityAh)
    parts.push(`${Math.round(w.capacityAh)} Ah`)
  if (w.arrayWp !== undefined && w.arrayWp !== base.arrayWp) parts.push(`${Math.round(w.arrayWp)} Wp`)
  if (w.drivingHoursPerDay !== undefined && w.drivingHoursPerDay !== base.drivingHoursPerDay)
    parts.push(`${w.drivingHoursPerDay} h driving`)
  if (w.nightLowC !== undefined && w.nightLowC !== base.nightLowC)
    parts.push(`nights ${fmtTemp(w.nightLowC)}`)
  if (w.sky !== undefined && w.sky !== base.sky) parts.push(`${w.sky} sky`)
  return parts.join(', ')
}
