/**
 * The classic stand-alone PV battery sizing method (IEEE 1013-2007 style, with the IEEE 485 temperature
 * correction). Method steps from memory of the standards (their texts were not read; REFERENCES §5.3 [M]):
 *   C = (daily load ÷ V) × days of autonomy × K_T × design margin × ageing factor ÷ allowed depth of discharge
 */

/**
 * IEEE 485 Table 1 cell-size temperature correction factors (electrolyte °C → factor, 1.000 at 25 °C),
 * transcribed in REFERENCES §5.3 [R as transcribed; M]; below 4.4 °C the 35/30/25 °F values [M].
 */
const IEEE485_TABLE: readonly (readonly [number, number])[] = [
  [-3.9, 1.52],
  [-1.1, 1.43],
  [1.7, 1.35],
  [4.4, 1.3],
  [7.2, 1.25],
  [10.0, 1.19],
  [12.8, 1.15],
  [15.6, 1.11],
  [18.3, 1.08],
  [21.1, 1.04],
  [23.9, 1.011],
  [25.0, 1.0],
  [26.7, 0.98],
  [29.4, 0.96],
  [32.2, 0.94],
  [35.0, 0.93],
  [37.8, 0.91],
  [43.3, 0.88],
  [48.9, 0.86],
]

/** IEEE 485 temperature correction factor, linear between table rows, held at the ends. */
export function temperatureCorrectionIeee485(electrolyteC: number): number {
  const first = IEEE485_TABLE[0]!
  const last = IEEE485_TABLE[IEEE485_TABLE.length - 1]!
  if (electrolyteC <= first[0]) return first[1]
  if (electrolyteC >= last[0]) return last[1]
  for (let i = 1; i < IEEE485_TABLE.length; i++) {
    const [t1, f1] = IEEE485_TABLE[i]!
    const [t0, f0] = IEEE485_TABLE[i - 1]!
    if (electrolyteC <= t1) return f0 + ((f1 - f0) * (electrolyteC - t0)) / (t1 - t0)
  }
  return last[1]
}

export interface ClassicSizingInput {
  /** Average daily energy the loads take from the pack (AC through the inverter). [Wh] */
  dailyLoadWh: number
  systemVoltageV: number
  autonomyDays: number
  /** Allowed depth of discharge. [0–1] */
  depthOfDischargeFraction: number
  /** K_T, 1 at 25 °C. */
  temperatureFactor: number
  /** 1.25 = replace at 80 % of rated capacity (IEEE 485, from memory). */
  ageingFactor: number
  /** 1.10–1.15 design margin (IEEE 485, from memory). */
  designMarginFactor: number
}

export interface ClassicSizingResult extends ClassicSizingInput {
  dailyLoadAh: number
  unadjustedAh: number
  capacityAh: number
  source: string
}

export const CLASSIC_METHOD_SOURCE =
  'IEEE Std 1013-2007 (sizing lead-acid batteries for stand-alone PV) with IEEE Std 485 Table 1 temperature factors; steps from memory, not verified against the standard text'

/** C = L/V × days × K_T × margin × ageing ÷ DoD. */
export function classicBatterySizing(i: ClassicSizingInput): ClassicSizingResult {
  const dailyLoadAh = i.dailyLoadWh / i.systemVoltageV
  const unadjustedAh = dailyLoadAh * i.autonomyDays
  const capacityAh =
    (unadjustedAh * i.temperatureFactor * i.designMarginFactor * i.ageingFactor) / i.depthOfDischargeFraction
  return { ...i, dailyLoadAh, unadjustedAh, capacityAh, source: CLASSIC_METHOD_SOURCE }
}
