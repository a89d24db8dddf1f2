/**
 * Beam/diffuse split of global horizontal irradiance by the Erbs, Klein & Duffie (1982) correlation.
 */

/**
 * Diffuse fraction kd = DHI / GHI from the hourly clearness index kt (Erbs et al. 1982, eq. 1):
 *   kt ≤ 0.22:        kd = 1 − 0.09 kt
 *   0.22 < kt ≤ 0.80: kd = 0.9511 − 0.1604 kt + 4.388 kt² − 16.638 kt³ + 12.336 kt⁴
 *   kt > 0.80:        kd = 0.165
 * The published pieces do not meet exactly at the breakpoints (0.98020 vs 0.97993 at 0.22).
 * @see D. G. Erbs, S. A. Klein, J. A. Duffie, "Estimation of the diffuse radiation fraction for hourly,
 *      daily and monthly-average global radiation", Solar Energy 28(4):293–302, 1982.
 */
export function diffuseFractionErbs1982(clearnessIndex: number): number {
  const kt = clearnessIndex
  if (kt <= 0.22) return 1 - 0.09 * kt
  // Horner form of 0.9511 − 0.1604 kt + 4.388 kt² − 16.638 kt³ + 12.336 kt⁴.
  if (kt <= 0.8) return 0.9511 + kt * (-0.1604 + kt * (4.388 + kt * (-16.638 + kt * 12.336)))
  return 0.165
}

export interface BeamDiffuse {
  /** Direct normal irradiance. [W/m²] */
  dniWPerM2: number
  /** Diffuse horizontal irradiance. [W/m²] */
  dhiWPerM2: number
  /** Hourly clearness index kt = GHI / (G_on cos z). [0–1] */
  clearnessIndex: number
}

/**
 * Split GHI into beam and diffuse with Erbs. As pvlib `erbs`: cos z is floored at 0.065 and kt capped at 1
 * when forming kt; DNI is set to 0 for z > 87° (the closure DNI = (GHI − DHI)/cos z blows up there),
 * so near the horizon all irradiance counts as diffuse.
 * @param ghiWPerM2 - global horizontal [W/m²]
 * @param zenithDeg - z [°]
 * @param extraNormalWPerM2 - G_on [W/m²]
 */
export function splitErbs1982(ghiWPerM2: number, zenithDeg: number, extraNormalWPerM2: number): BeamDiffuse {
  if (ghiWPerM2 <= 0 || zenithDeg >= 90)
    return { dniWPerM2: 0, dhiWPerM2: Math.max(0, ghiWPerM2), clearnessIndex: 0 }
  const cosZ = Math.cos((zenithDeg * Math.PI) / 180)
  const kt = Math.min(1, Math.max(0, ghiWPerM2 / (extraNormalWPerM2 * Math.max(cosZ, 0.065))))
  const dhi = ghiWPerM2 * diffuseFractionErbs1982(kt)
  if (zenithDeg > 87) return { dniWPerM2: 0, dhiWPerM2: ghiWPerM2, clearnessIndex: kt }
  return { dniWPerM2: (ghiWPerM2 - dhi) / cosZ, dhiWPerM2: dhi, clearnessIndex: kt }
}
