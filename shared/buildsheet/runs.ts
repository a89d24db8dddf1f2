/**
 * The cable runs of a build: one per wire pair the installer pulls, with its current from the ratings,
 * its fuse, and a drop limit (3 % critical, 10 % non-critical, ABYC E-11, see cable.ts). Lengths start
 * at rough defaults (common practice, no source) and are meant to be measured and typed in.
 */
import { CRITICAL_DROP_FRACTION, NON_CRITICAL_DROP_FRACTION, sizeCable, type CableSizing } from './cable.ts'
import type { ConductorClass, InsulationRatingC } from './conductors.ts'
import type { Ratings } from './ratings.ts'

/** Conductor temperature assumed for the drop unless the user sets one. Common practice, no source. [°C] */
export const DEFAULT_CONDUCTOR_TEMP_C = 50

export interface CableRunOverride {
  oneWayLengthM?: number
  currentA?: number
  maxDropPercent?: number
  conductorTempC?: number
  conductorClass?: ConductorClass
  insulationRatingC?: InsulationRatingC
}
export type CableRunOverrides = Record<string, CableRunOverride>

export interface CableRunDefault {
  id: string
  label: string
  from: string
  to: string
  /** Where the current comes from, in plain words. */
  currentBasis: string
  currentA: number
  fuseA: number | null
  critical: boolean
  oneWayLengthM: number
}

export interface CableRun extends CableRunDefault {
  maxDropPercent: number
  conductorTempC: number
  conductorClass: ConductorClass
  insulationRatingC: InsulationRatingC
  /** Which fields carry the user's own value. */
  edited: (keyof CableRunOverride)[]
  sizing: CableSizing
}

const CATEGORY_CRITICAL = new Set(['fridge', 'electronics', 'heating'])

/** Default runs for the plan's equipment, in wiring order. */
export function defaultCableRuns(r: Ratings): CableRunDefault[] {
  const fuse = (id: string) => r.branchFuses.find((f) => f.id === id)?.ratingA ?? null
  const runs: CableRunDefault[] = [
    {
      id: 'main',
      label: 'Pack to main fuse and busbars',
      from: 'Battery pack',
      to: 'Main busbars',
      currentBasis: 'the larger of all chargers together and the largest load',
      currentA: Math.max(r.totalChargeA, r.maxLoadA),
      fuseA: r.mainFuse.ratingA,
      critical: true,
      oneWayLengthM: 1,
    },
  ]
  for (const s of r.sources) {
    runs.push({
      id: `source:${s.id}`,
      label: `${s.name} to charge busbar`,
      from: s.name,
      to: 'Charge busbar',
      currentBasis: s.kind === 'solar' ? "the controller's output limit" : "the charger's output current",
      currentA: s.currentA,
      fuseA: fuse(`fuse:source:${s.id}`),
      critical: true,
      oneWayLengthM: s.kind === 'dcdc' ? 1.5 : s.kind === 'solar' ? 1.5 : 2,
    })
  }
  if (r.inverter) {
    runs.push({
      id: 'inverter',
      label: 'Load busbar to inverter',
      from: 'Load busbar',
      to: 'Inverter',
      currentBasis: 'inverter rating ÷ (efficiency × lowest pack voltage)',
      currentA: r.inverter.continuousA,
      fuseA: fuse('fuse:inverter'),
      critical: true,
      oneWayLengthM: 1,
    })
  }
  if (r.dcLoads.length > 0) {
    runs.push({
      id: 'dc-panel',
      label: 'Load busbar to DC fuse panel',
      from: 'Load busbar',
      to: 'DC fuse panel',
      currentBasis: 'every DC appliance on at once',
      currentA: r.dcLoadA,
      fuseA: fuse('fuse:dc-panel'),
      critical: true,
      oneWayLengthM: 1,
    })
  }
  if (r.heaterA > 0) {
    runs.push({
      id: 'heater',
      label: 'Load busbar to heater pad',
      from: 'Load busbar',
      to: 'Heater pad',
      currentBasis: 'pad power ÷ nominal pack voltage',
      currentA: r.heaterA,
      fuseA: fuse('fuse:heater'),
      critical: false,
      oneWayLengthM: 0.5,
    })
  }
  for (const l of r.dcLoads) {
    runs.push({
      id: `load:${l.id}`,
      label: `DC fuse panel to ${l.name}`,
      from: 'DC fuse panel',
      to: l.name,
      currentBasis: 'power × quantity ÷ nominal pack voltage',
      currentA: l.currentA,
      fuseA: fuse(`fuse:load:${l.id}`),
      critical: CATEGORY_CRITICAL.has(l.category),
      oneWayLengthM: 3,
    })
  }
  return runs
}

/** Apply the user's edits and size each run. */
export function sizeCableRuns(
  defaults: readonly CableRunDefault[],
  overrides: CableRunOverrides,
  systemVoltageV: number,
): CableRun[] {
  return defaults.map((d) => {
    const o = overrides[d.id] ?? {}
    const edited = (Object.keys(o) as (keyof CableRunOverride)[]).filter((k) => o[k] !== undefined)
    const maxDropPercent =
      o.maxDropPercent ?? (d.critical ? CRITICAL_DROP_FRACTION : NON_CRITICAL_DROP_FRACTION) * 100
    const run = {
      ...d,
      oneWayLengthM: o.oneWayLengthM ?? d.oneWayLengthM,
      currentA: o.currentA ?? d.currentA,
      maxDropPercent,
      conductorTempC: o.conductorTempC ?? DEFAULT_CONDUCTOR_TEMP_C,
      conductorClass: o.conductorClass ?? ('class5' as const),
      insulationRatingC: o.insulationRatingC ?? (105 as const),
      edited,
    }
    return {
      ...run,
      sizing: sizeCable({
        oneWayLengthM: run.oneWayLengthM,
        currentA: run.currentA,
        systemVoltageV,
        maxDropFraction: maxDropPercent / 100,
        conductorTempC: run.conductorTempC,
        conductorClass: run.conductorClass,
        insulationRatingC: run.insulationRatingC,
        fuseA: run.fuseA,
      }),
    }
  })
}
