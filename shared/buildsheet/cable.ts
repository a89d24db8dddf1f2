/**
 * Cable sizing by allowed voltage drop, with the check that the run's fuse protects the cable.
 *
 * Voltage drop over a two-wire DC run: ΔV = I · R'(T) · 2L, with L the one-way length (the current flows
 * out and back) and R'(T) the conductor resistance per metre at its temperature.
 * Limits: ABYC E-11 §11.14.2.6 — 3 % for main feeders, electronics and other circuits where the drop must
 * be kept to a minimum, 10 % for lighting and other non-critical circuits (shared/REFERENCES.md §7.4 [R]).
 * The same source uses the round-trip length; so do we.
 */
import { copperResistanceAtTempOhmPerKm } from './copper.ts'
import {
  AWG_AMPACITY_A,
  AWG_SIZES,
  IEC60228_TABLES,
  METRIC_AMPACITY_A,
  type AwgConductor,
  type ConductorClass,
  type InsulationRatingC,
  type MetricConductor,
} from './conductors.ts'

/** ABYC E-11 §11.14.2.6 drop limits (REFERENCES §7.4 [R]). [fraction] */
export const CRITICAL_DROP_FRACTION = 0.03
export const NON_CRITICAL_DROP_FRACTION = 0.1

/**
 * Smallest conductor used for any run: ABYC E-11 asks for at least 16 AWG (REFERENCES §7.4 [R]);
 * 1.5 mm² is the next metric size up from 16 AWG's 1.31 mm² (common practice, no source).
 */
export const MIN_AWG_GAUGE = 16
export const MIN_AREA_MM2 = 1.5

/**
 * Voltage drop of a two-wire copper run.
 *
 * @param currentA - current in the run [A]
 * @param oneWayLengthM - distance from source to load; the conductor length is twice this [m]
 * @param resistance20COhmPerKm - conductor resistance at 20 °C [Ω/km]
 * @param conductorTempC - conductor temperature [°C]
 * @returns voltage drop across both conductors [V]
 */
export function voltageDropV(
  currentA: number,
  oneWayLengthM: number,
  resistance20COhmPerKm: number,
  conductorTempC: number,
): number {
  const ohmPerM = copperResistanceAtTempOhmPerKm(resistance20COhmPerKm, conductorTempC) / 1000
  return currentA * ohmPerM * 2 * oneWayLengthM
}

export interface CableRunInput {
  oneWayLengthM: number
  currentA: number
  /** Nominal voltage the percentage refers to. [V] */
  systemVoltageV: number
  /** Allowed drop as a fraction of systemVoltageV (0.03 = 3 %). */
  maxDropFraction: number
  conductorTempC: number
  conductorClass: ConductorClass
  insulationRatingC: InsulationRatingC
  /** Rating of the fuse that protects this run; the cable must carry at least this. Null = no fuse. [A] */
  fuseA: number | null
}

export interface SizedConductor {
  dropV: number
  dropFraction: number
  /** Ampacity at the insulation rating; null when the table has no value. [A] */
  ampacityA: number | null
}

export interface CableSizing {
  /** Smallest IEC 60228 size meeting both the drop limit and the fuse. Null = nothing in the table fits. */
  metric: (MetricConductor & SizedConductor) | null
  /** Smallest AWG meeting both. Null = nothing up to 4/0 fits. */
  awg: (AwgConductor & SizedConductor) | null
  /** Smallest metric size by drop alone (before the fuse check). [mm²] */
  metricByDropMm2: number | null
  /** True when the fuse, not the drop, set the metric size. */
  metricSetByFuse: boolean
  /** The fuse protects the chosen metric cable (fuse ≤ ampacity). */
  fuseProtectsCable: boolean
}

function fits(
  c: { resistance20COhmPerKm: number },
  ampacityA: number | null,
  input: CableRunInput,
  checkFuse: boolean,
): SizedConductor | null {
  const dropV = voltageDropV(
    input.currentA,
    input.oneWayLengthM,
    c.resistance20COhmPerKm,
    input.conductorTempC,
  )
  const dropFraction = dropV / input.systemVoltageV
  if (dropFraction > input.maxDropFraction + 1e-12) return null
  if (checkFuse && input.fuseA !== null && (ampacityA === null || ampacityA < input.fuseA)) return null
  return { dropV, dropFraction, ampacityA }
}

/**
 * Smallest standard cross-section (mm², and AWG) for a run: drop at the conductor temperature within the
 * allowed fraction, and an ampacity at least the fuse rating so the fuse protects the cable.
 */
export function sizeCable(input: CableRunInput): CableSizing {
  const table = IEC60228_TABLES[input.conductorClass]
  let metric: CableSizing['metric'] = null
  let metricByDropMm2: number | null = null
  for (const c of table) {
    if (c.areaMm2 < MIN_AREA_MM2) continue
    const amp = METRIC_AMPACITY_A[c.areaMm2]?.[input.insulationRatingC] ?? null
    if (metricByDropMm2 === null && fits(c, amp, input, false)) metricByDropMm2 = c.areaMm2
    const ok = fits(c, amp, input, true)
    if (ok) {
      metric = { ...c, ...ok }
      break
    }
  }
  let awg: CableSizing['awg'] = null
  for (const c of AWG_SIZES) {
    if (c.gaugeNumber > MIN_AWG_GAUGE) continue
    const ok = fits(c, AWG_AMPACITY_A[c.label]?.[input.insulationRatingC] ?? null, input, true)
    if (ok) {
      awg = { ...c, ...ok }
      break
    }
  }
  const fuseProtectsCable =
    metric !== null &&
    (input.fuseA === null || (metric.ampacityA !== null && metric.ampacityA >= input.fuseA))
  return {
    metric,
    awg,
    metricByDropMm2,
    metricSetByFuse: metric !== null && metricByDropMm2 !== null && metric.areaMm2 > metricByDropMm2,
    fuseProtectsCable,
  }
}

/**
 * Minimum circular-mil area by the ABYC E-11 formula CM = K·I·L/E, K = 10.75 Ω·CM/ft for copper,
 * L the round-trip length in feet, E the allowed drop in volts (shared/REFERENCES.md §7.4 [R]).
 */
export function abycCircularMils(currentA: number, roundTripLengthFt: number, allowedDropV: number): number {
  return (10.75 * currentA * roundTripLengthFt) / allowedDropV
}

/** Circular mils of a round conductor: (diameter in mil)². */
export function circularMilsOfDiameterMm(diameterMm: number): number {
  const mil = diameterMm / 0.0254
  return mil * mil
}
