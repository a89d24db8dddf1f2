/**
 * Extraterrestrial irradiance: the sun's irradiance above the atmosphere.
 */

/** Solar constant used by the engine, WRC/WMO 1981 value as in Duffie & Beckman. [W/m²] */
export const SOLAR_CONSTANT_W_PER_M2 = 1367

const TWO_PI = 2 * Math.PI

/**
 * Extraterrestrial normal irradiance with Spencer's eccentricity correction:
 *   G_on = G_sc (1.00011 + 0.034221 cos B + 0.00128 sin B + 0.000719 cos 2B + 0.000077 sin 2B),
 *   B = 2π (n − 1) / 365.
 * @param dayOfYear - n [day]
 * @returns [W/m²]
 * @see Spencer 1971; Duffie & Beckman 4th ed. eq. 1.4.1b; pvlib `get_extra_radiation(method='spencer')`.
 */
export function extraterrestrialNormalSpencerWPerM2(
  dayOfYear: number,
  solarConstantWPerM2 = SOLAR_CONSTANT_W_PER_M2,
): number {
  const b = (TWO_PI * (dayOfYear - 1)) / 365
  return (
    solarConstantWPerM2 *
    (1.00011 +
      0.034221 * Math.cos(b) +
      0.00128 * Math.sin(b) +
      0.000719 * Math.cos(2 * b) +
      0.000077 * Math.sin(2 * b))
  )
}

/**
 * Daily extraterrestrial irradiation on a horizontal surface (Duffie & Beckman eq. 1.10.3):
 *   H0 = (24·3600·G_sc/π)(1 + 0.033 cos(360n/365))(cos φ cos δ sin ω_s + (π ω_s/180) sin φ sin δ),
 *   cos ω_s = −tan φ tan δ.
 * @returns [J/m²]
 */
export function dailyExtraterrestrialHorizontalJPerM2(
  dayOfYear: number,
  latitudeRad: number,
  declinationRad: number,
  solarConstantWPerM2 = SOLAR_CONSTANT_W_PER_M2,
): number {
  const cosWs = Math.min(1, Math.max(-1, -Math.tan(latitudeRad) * Math.tan(declinationRad)))
  const ws = Math.acos(cosWs)
  const e0 = 1 + 0.033 * Math.cos((TWO_PI * dayOfYear) / 365)
  return (
    ((24 * 3600 * solarConstantWPerM2) / Math.PI) *
    e0 *
    (Math.cos(latitudeRad) * Math.cos(declinationRad) * Math.sin(ws) +
      ws * Math.sin(latitudeRad) * Math.sin(declinationRad))
  )
}

/**
 * Extraterrestrial irradiation on a horizontal surface between two hour angles (Duffie & Beckman eq. 1.10.4):
 *   I0 = (12·3600·G_sc/π)(1 + 0.033 cos(360n/365))[cos φ cos δ (sin ω2 − sin ω1) + (ω2 − ω1) sin φ sin δ].
 * @param hourAngle1Rad - ω1, negative in the morning [rad]
 * @param hourAngle2Rad - ω2 > ω1 [rad]
 * @returns [J/m²]
 */
export function hourlyExtraterrestrialHorizontalJPerM2(
  dayOfYear: number,
  latitudeRad: number,
  declinationRad: number,
  hourAngle1Rad: number,
  hourAngle2Rad: number,
  solarConstantWPerM2 = SOLAR_CONSTANT_W_PER_M2,
): number {
  const e0 = 1 + 0.033 * Math.cos((TWO_PI * dayOfYear) / 365)
  return (
    ((12 * 3600 * solarConstantWPerM2) / Math.PI) *
    e0 *
    (Math.cos(latitudeRad) * Math.cos(declinationRad) * (Math.sin(hourAngle2Rad) - Math.sin(hourAngle1Rad)) +
      (hourAngle2Rad - hourAngle1Rad) * Math.sin(latitudeRad) * Math.sin(declinationRad))
  )
}
