/**
 * Solar declination, equation of time and eccentricity by Fourier series.
 * Used for the classic daily sums and cross-checks; hourly sun position comes from suncalc (position.ts).
 */

const TWO_PI = 2 * Math.PI

/**
 * Solar declination by Spencer's Fourier series.
 *
 *   δ = 0.006918 − 0.399912 cos Γ + 0.070257 sin Γ − 0.006758 cos 2Γ
 *       + 0.000907 sin 2Γ − 0.002697 cos 3Γ + 0.00148 sin 3Γ,   Γ = 2π (n − 1) / 365
 *
 * @param dayOfYear - n, 1 on 1 January; a fraction carries the time of day. [day]
 * @returns declination, positive when the sun is north of the equator. [rad]
 * @see J. W. Spencer, "Fourier series representation of the position of the sun", Search 2(5):172, 1971;
 *      Duffie & Beckman, Solar Engineering of Thermal Processes, 4th ed. 2013, eq. 1.6.1b.
 */
export function declinationSpencer1971Rad(dayOfYear: number): number {
  const g = (TWO_PI * (dayOfYear - 1)) / 365
  return (
    0.006918 -
    0.399912 * Math.cos(g) +
    0.070257 * Math.sin(g) -
    0.006758 * Math.cos(2 * g) +
    0.000907 * Math.sin(2 * g) -
    0.002697 * Math.cos(3 * g) +
    0.00148 * Math.sin(3 * g)
  )
}

/**
 * Solar declination by Cooper's equation, δ = 23.45° sin(360° (284 + n) / 365).
 * @see P. I. Cooper, Solar Energy 12(3):333, 1969; Duffie & Beckman 4th ed. eq. 1.6.1a.
 * @returns [rad]
 */
export function declinationCooper1969Rad(dayOfYear: number): number {
  return ((23.45 * Math.PI) / 180) * Math.sin((TWO_PI * (284 + dayOfYear)) / 365)
}

/**
 * Equation of time (apparent minus mean solar time), Spencer 1971 series as in Duffie & Beckman eq. 1.5.3:
 *   E = 229.2 (0.000075 + 0.001868 cos B − 0.032077 sin B − 0.014615 cos 2B − 0.04089 sin 2B),
 *   B = 2π (n − 1) / 365.
 * @returns [min]
 */
export function equationOfTimeSpencer1971Min(dayOfYear: number): number {
  const b = (TWO_PI * (dayOfYear - 1)) / 365
  return (
    229.2 *
    (0.000075 +
      0.001868 * Math.cos(b) -
      0.032077 * Math.sin(b) -
      0.014615 * Math.cos(2 * b) -
      0.04089 * Math.sin(2 * b))
  )
}

/** Day of the year (1 = 1 January) of a UTC instant, with the time of day as a fraction. [day] */
export function dayOfYearUtc(epochMs: number): number {
  const d = new Date(epochMs)
  const jan1 = Date.UTC(d.getUTCFullYear(), 0, 1)
  return 1 + (epochMs - jan1) / 86_400_000
}
