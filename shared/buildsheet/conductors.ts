/**
 * Standard conductor sizes: metric (IEC 60228) and AWG (ASTM B258), with their resistance at 20 °C and
 * the current a conductor may carry (ampacity) for the fuse-protects-the-cable check.
 */
import { idealCopperResistance20COhmPerKm } from './copper.ts'

export const CONDUCTOR_CLASSES = ['class5', 'class2'] as const
export type ConductorClass = (typeof CONDUCTOR_CLASSES)[number]

export interface MetricConductor {
  areaMm2: number
  /** Maximum DC resistance at 20 °C, plain annealed copper. [Ω/km] */
  resistance20COhmPerKm: number
}

/**
 * IEC 60228:2004 Table 3 (class 5 flexible conductors, plain copper), maximum resistance at 20 °C.
 * 1–25 mm²: [R] as transcribed in shared/REFERENCES.md §7.2; 35–95 mm²: [M] from memory of the table.
 */
export const IEC60228_CLASS5: readonly MetricConductor[] = [
  { areaMm2: 1, resistance20COhmPerKm: 19.5 },
  { areaMm2: 1.5, resistance20COhmPerKm: 13.3 },
  { areaMm2: 2.5, resistance20COhmPerKm: 7.98 },
  { areaMm2: 4, resistance20COhmPerKm: 4.95 },
  { areaMm2: 6, resistance20COhmPerKm: 3.3 },
  { areaMm2: 10, resistance20COhmPerKm: 1.91 },
  { areaMm2: 16, resistance20COhmPerKm: 1.21 },
  { areaMm2: 25, resistance20COhmPerKm: 0.78 },
  { areaMm2: 35, resistance20COhmPerKm: 0.554 },
  { areaMm2: 50, resistance20COhmPerKm: 0.386 },
  { areaMm2: 70, resistance20COhmPerKm: 0.272 },
  { areaMm2: 95, resistance20COhmPerKm: 0.206 },
]

/**
 * IEC 60228:2004 Table 2 (class 2 stranded conductors, plain copper), maximum resistance at 20 °C.
 * [R] as transcribed in shared/REFERENCES.md §7.2 (1.5–630 mm²).
 */
export const IEC60228_CLASS2: readonly MetricConductor[] = [
  { areaMm2: 1.5, resistance20COhmPerKm: 12.1 },
  { areaMm2: 2.5, resistance20COhmPerKm: 7.41 },
  { areaMm2: 4, resistance20COhmPerKm: 4.61 },
  { areaMm2: 6, resistance20COhmPerKm: 3.08 },
  { areaMm2: 10, resistance20COhmPerKm: 1.83 },
  { areaMm2: 16, resistance20COhmPerKm: 1.15 },
  { areaMm2: 25, resistance20COhmPerKm: 0.727 },
  { areaMm2: 35, resistance20COhmPerKm: 0.524 },
  { areaMm2: 50, resistance20COhmPerKm: 0.387 },
  { areaMm2: 70, resistance20COhmPerKm: 0.268 },
  { areaMm2: 95, resistance20COhmPerKm: 0.193 },
  { areaMm2: 120, resistance20COhmPerKm: 0.153 },
  { areaMm2: 150, resistance20COhmPerKm: 0.124 },
  { areaMm2: 185, resistance20COhmPerKm: 0.0991 },
  { areaMm2: 240, resistance20COhmPerKm: 0.0754 },
  { areaMm2: 300, resistance20COhmPerKm: 0.0601 },
  { areaMm2: 400, resistance20COhmPerKm: 0.047 },
  { areaMm2: 500, resistance20COhmPerKm: 0.0366 },
  { areaMm2: 630, resistance20COhmPerKm: 0.0283 },
]

export const IEC60228_TABLES: Readonly<Record<ConductorClass, readonly MetricConductor[]>> = {
  class5: IEC60228_CLASS5,
  class2: IEC60228_CLASS2,
}

export const CONDUCTOR_CLASS_LABELS: Readonly<Record<ConductorClass, string>> = {
  class5: 'IEC 60228 class 5 (flexible)',
  class2: 'IEC 60228 class 2 (stranded)',
}

/**
 * Diameter of an AWG gauge by ASTM B258: d = 0.127 mm × 92^((36 − n)/39).
 * Gauges 1/0…4/0 are n = 0, −1, −2, −3.
 *
 * @param gaugeNumber - AWG number, with 1/0 = 0, 2/0 = −1, 3/0 = −2, 4/0 = −3
 * @returns diameter [mm]
 * @see ASTM B258; shared/REFERENCES.md §7.3 (10 AWG → 2.588 mm)
 */
export function awgDiameterMm(gaugeNumber: number): number {
  return 0.127 * Math.pow(92, (36 - gaugeNumber) / 39)
}

/** Cross-section of an AWG gauge (ASTM B258). [mm²] */
export function awgAreaMm2(gaugeNumber: number): number {
  const d = awgDiameterMm(gaugeNumber)
  return (Math.PI * d * d) / 4
}

export interface AwgConductor {
  /** As written by the trade: "4/0", "2", "12". */
  label: string
  gaugeNumber: number
  areaMm2: number
  /** ρ20/A with IEC 60028 copper (no stranding allowance). [Ω/km] */
  resistance20COhmPerKm: number
}

const AWG_GAUGES: readonly [string, number][] = [
  ['18', 18],
  ['16', 16],
  ['14', 14],
  ['12', 12],
  ['10', 10],
  ['8', 8],
  ['6', 6],
  ['4', 4],
  ['2', 2],
  ['1', 1],
  ['1/0', 0],
  ['2/0', -1],
  ['3/0', -2],
  ['4/0', -3],
]

/** AWG sizes, smallest first, with areas from ASTM B258 and resistance from ρ20 (IEC 60028). */
export const AWG_SIZES: readonly AwgConductor[] = AWG_GAUGES.map(([label, gaugeNumber]) => {
  const areaMm2 = awgAreaMm2(gaugeNumber)
  return { label, gaugeNumber, areaMm2, resistance20COhmPerKm: idealCopperResistance20COhmPerKm(areaMm2) }
})

/** Conductor insulation temperature ratings we hold ampacities for. [°C] */
export const INSULATION_RATINGS_C = [70, 90, 105] as const
export type InsulationRatingC = (typeof INSULATION_RATINGS_C)[number]

/**
 * Ampacity of a single metric conductor in free air at 30 °C ambient, by insulation rating.
 * ISO 13297 / ISO 10133 small-craft DC table ("allowable current of conductors") — [M] from memory of
 * the table, not re-verified: check the cable maker's datasheet and derate for bundles and engine spaces.
 */
export const METRIC_AMPACITY_A: Readonly<Record<number, Readonly<Record<InsulationRatingC, number>>>> = {
  1: { 70: 14, 90: 18, 105: 20 },
  1.5: { 70: 18, 90: 21, 105: 25 },
  2.5: { 70: 25, 90: 30, 105: 35 },
  4: { 70: 35, 90: 40, 105: 45 },
  6: { 70: 40, 90: 50, 105: 60 },
  10: { 70: 65, 90: 70, 105: 90 },
  16: { 70: 90, 90: 100, 105: 130 },
  25: { 70: 120, 90: 140, 105: 170 },
  35: { 70: 160, 90: 185, 105: 210 },
  50: { 70: 210, 90: 230, 105: 270 },
  70: { 70: 265, 90: 285, 105: 330 },
  95: { 70: 310, 90: 330, 105: 390 },
  120: { 70: 360, 90: 400, 105: 450 },
}

/**
 * Ampacity of a single AWG conductor outside engine spaces, by insulation rating.
 * ABYC E-11 Table VI ("allowable amperage of conductors") — [M] from memory of the table, not re-verified.
 */
export const AWG_AMPACITY_A: Readonly<Record<string, Readonly<Record<InsulationRatingC, number>>>> = {
  '18': { 70: 10, 90: 20, 105: 20 },
  '16': { 70: 15, 90: 25, 105: 25 },
  '14': { 70: 20, 90: 30, 105: 35 },
  '12': { 70: 25, 90: 40, 105: 45 },
  '10': { 70: 35, 90: 55, 105: 60 },
  '8': { 70: 50, 90: 70, 105: 80 },
  '6': { 70: 65, 90: 100, 105: 120 },
  '4': { 70: 95, 90: 130, 105: 160 },
  '2': { 70: 130, 90: 170, 105: 210 },
  '1': { 70: 150, 90: 195, 105: 245 },
  '1/0': { 70: 175, 90: 230, 105: 285 },
  '2/0': { 70: 200, 90: 265, 105: 330 },
  '3/0': { 70: 235, 90: 310, 105: 385 },
  '4/0': { 70: 275, 90: 360, 105: 445 },
}

export const AMPACITY_SOURCE =
  'ISO 13297 / ABYC E-11 ampacity tables, single conductor in free air, outside engine spaces — from memory, not re-verified; check the cable datasheet'
