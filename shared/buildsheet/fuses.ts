/**
 * Overcurrent-device sizing: the margin rule and the standard ratings a fuse or breaker comes in.
 */

/**
 * Continuous-current margin: a fuse, breaker or disconnect is rated at least 125 % of the continuous
 * current it carries. Common DC practice, consistent with NEC 210.20 / 215.3 and NEC 690.8(B)
 * (shared/REFERENCES.md §7.5: [CP], NEC wording [M] / [R] for 690.8).
 */
export const CONTINUOUS_MARGIN_FACTOR = 1.25

export const MARGIN_RULE_TEXT =
  'Rating ≥ 125 % of the continuous current, rounded up to the next standard size (NEC 210.20 / 215.3 / 690.8 style; common DC practice)'

/**
 * Standard fuse ratings for DC blade, MIDI/MEGA-style bolt-down, ANL and class T fuses.
 * Common practice, no source (the series most makers sell). [A]
 */
export const STANDARD_FUSE_RATINGS_A: readonly number[] = [
  1, 2, 3, 5, 7.5, 10, 15, 20, 25, 30, 35, 40, 50, 60, 70, 80, 100, 125, 150, 175, 200, 225, 250, 300, 350,
  400, 450, 500, 600, 800,
]

/**
 * Smallest standard rating at or above the given current.
 *
 * @param requiredA - the current the device must carry after the margin [A]
 * @returns the standard rating [A], or null when the largest listed size is too small
 */
export function nextStandardRatingA(requiredA: number): number | null {
  for (const r of STANDARD_FUSE_RATINGS_A) if (r >= requiredA - 1e-9) return r
  return null
}

export interface DeviceRating {
  /** The continuous current the device carries. [A] */
  continuousA: number
  /** continuousA × CONTINUOUS_MARGIN_FACTOR. [A] */
  requiredA: number
  /** Next standard size at or above requiredA; null when none is listed. [A] */
  ratingA: number | null
}

/** Apply the margin rule to a continuous current. */
export function rateDevice(continuousA: number): DeviceRating {
  const requiredA = continuousA * CONTINUOUS_MARGIN_FACTOR
  return { continuousA, requiredA, ratingA: nextStandardRatingA(requiredA) }
}
