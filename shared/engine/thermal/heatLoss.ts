/**
 * Heat loss of the battery enclosure: Q = U·A·(T_pack − T_ambient),
 * U = 1 / (R_si + t/k + R_se) for one homogeneous insulation layer (ISO 6946).
 */

/** Inside surface resistance, still air in a small box: h_i = 8 W/(m²·K) (REFERENCES §6.4 battery-box example). [m²·K/W] */
export const INSIDE_SURFACE_RESISTANCE_M2K_PER_W = 1 / 8
/** Outside surface resistance R_se = 0.04 m²·K/W, ISO 6946 (REFERENCES §6.2). [m²·K/W] */
export const OUTSIDE_SURFACE_RESISTANCE_M2K_PER_W = 0.04

/**
 * Thermal transmittance of one insulation layer between two surface films.
 * @param thicknessM - t [m]
 * @param conductivityWPerMK - k [W/(m·K)]
 * @returns U [W/(m²·K)]
 * @see ISO 6946:2017, building components — thermal resistance and transmittance, calculation methods.
 */
export function uValueWPerM2K(thicknessM: number, conductivityWPerMK: number): number {
  return (
    1 /
    (INSIDE_SURFACE_RESISTANCE_M2K_PER_W +
      thicknessM / conductivityWPerMK +
      OUTSIDE_SURFACE_RESISTANCE_M2K_PER_W)
  )
}
