/**
 * Daily ambient temperature curve between the night low (at sunrise) and the day high (mid-afternoon):
 * two half-cosines, rising from the low at sunrise to the high at 15:00 local, falling from the high to the
 * next day's low at the next sunrise. Common practice, no source (a simplification of the sine-exponential
 * shapes in the agrometeorology literature, e.g. Parton & Logan 1981, from memory).
 */

/** Local hour of the day's maximum temperature. Common practice, no source. [h] */
export const DAY_HIGH_HOUR = 15

/**
 * @param hourOfDay - local clock, may exceed 24 for hours of the next day [h]
 * @param sunriseHour - local sunrise, clamped to 3–10 h (polar day and night fall back to those) [h]
 * @returns [°C]
 */
export function ambientTempC(
  hourOfDay: number,
  sunriseHour: number,
  nightLowC: number,
  dayHighC: number,
): number {
  const rise = Math.min(10, Math.max(3, sunriseHour))
  const h = ((hourOfDay % 24) + 24) % 24
  const amplitude = (dayHighC - nightLowC) / 2
  const mean = (dayHighC + nightLowC) / 2
  if (h >= rise && h <= DAY_HIGH_HOUR) {
    return mean - amplitude * Math.cos((Math.PI * (h - rise)) / (DAY_HIGH_HOUR - rise))
  }
  const sinceHigh = h > DAY_HIGH_HOUR ? h - DAY_HIGH_HOUR : h + 24 - DAY_HIGH_HOUR
  const fallLength = 24 - (DAY_HIGH_HOUR - rise)
  return mean + amplitude * Math.cos((Math.PI * sinceHigh) / fallLength)
}
