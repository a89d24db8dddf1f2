/**
 * Copper conductor resistance and its temperature correction.
 *
 * Sources (shared/REFERENCES.md §7.1):
 * - IEC 60028 (International standard of resistance for copper, IACS): annealed copper at 20 °C has
 *   conductivity 58 MS/m ⇒ ρ20 = 0.017241 Ω·mm²/m, and the constant-mass temperature coefficient of
 *   resistance at 20 °C is α20 = 0.00393 K⁻¹. [R]
 */

/** Resistivity of annealed copper at 20 °C (IEC 60028). [Ω·mm²/m] */
export const COPPER_RESISTIVITY_20C_OHM_MM2_PER_M = 0.017241

/** Temperature coefficient of resistance of annealed copper at 20 °C (IEC 60028). [1/K] */
export const COPPER_ALPHA_20C_PER_K = 0.00393

/**
 * Ratio R(T)/R20 for copper: 1 + α20·(T − 20). Linear; good from about −50 to +200 °C.
 *
 * @param conductorTempC - conductor temperature [°C]
 * @returns resistance ratio to 20 °C [-]
 * @see IEC 60028; shared/REFERENCES.md §7.1 (−20 °C → 0.8428, 70 °C → 1.1965)
 */
export function copperResistanceRatio(conductorTempC: number): number {
  return 1 + COPPER_ALPHA_20C_PER_K * (conductorTempC - 20)
}

/**
 * Resistance of a copper conductor at temperature T from its 20 °C value.
 *
 * @param resistance20COhmPerKm - resistance at 20 °C [Ω/km]
 * @param conductorTempC - conductor temperature [°C]
 * @returns resistance at T [Ω/km]
 */
export function copperResistanceAtTempOhmPerKm(
  resistance20COhmPerKm: number,
  conductorTempC: number,
): number {
  return resistance20COhmPerKm * copperResistanceRatio(conductorTempC)
}

/**
 * Ideal resistance of a solid copper cross-section at 20 °C, ρ20 / A (no stranding allowance).
 *
 * @param areaMm2 - conductor cross-section [mm²]
 * @returns resistance at 20 °C [Ω/km]
 */
export function idealCopperResistance20COhmPerKm(areaMm2: number): number {
  return (COPPER_RESISTIVITY_20C_OHM_MM2_PER_M / areaMm2) * 1000
}
