/**
 * Clear-sky global horizontal irradiance by the Haurwitz model:
 *   GHI = 1098 cos z · exp(−0.059 / cos z),  0 when the sun is at or below the horizon.
 *
 * Chosen because it needs only the zenith angle (no turbidity or altitude data), and Reno, Hansen & Stein
 * rank it among the best of the simple models.
 *
 * @param apparentZenithDeg - z, refraction-corrected. [°]
 * @returns [W/m²]
 * @see B. Haurwitz, "Insolation in relation to cloudiness and cloud density", J. Meteorology 2:154–166, 1945;
 *      "Insolation in relation to cloud type", J. Meteorology 3:123–124, 1946.
 * @see M. J. Reno, C. W. Hansen, J. S. Stein, "Global horizontal irradiance clear sky models:
 *      implementation and analysis", Sandia report SAND2012-2389, 2012 (the form coded here, as pvlib `haurwitz`).
 */
export function clearSkyGhiHaurwitzWPerM2(apparentZenithDeg: number): number {
  const cosZ = Math.cos((apparentZenithDeg * Math.PI) / 180)
  if (cosZ <= 0) return 0
  return 1098 * cosZ * Math.exp(-0.059 / cosZ)
}
